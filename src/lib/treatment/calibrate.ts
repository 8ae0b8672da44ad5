// Calibration to a measured baseline, and the prediction of a treatment plan on top of it.
//
// The assumed finishes never explain a real room exactly (furniture, leaks, panel resonances),
// so the measured T per band fixes a residual absorption: the extra equivalent area that makes
// the chosen formula reproduce the measurement. Treatment is then added to the calibrated room.
import { DEFAULT_SPEED_OF_SOUND, type AtmosphereConditions } from './air';
import { checkBandValues, PLANNING_BANDS_HZ, type BandValues } from './bands';
import { absorptionForTime, airAttenuationPerBand, MAX_LOG_ALPHA, timeFromAbsorption, type ReverbFormula } from './reverb';
import type { SurfaceId } from './surfaces';

export interface CalibrationPatch {
	areaM2: number;
	coefficients: BandValues;
	/** Set for a room surface that treatment may cover. */
	surface?: SurfaceId;
	kind?: 'surface' | 'opening';
}

export interface CalibrationInput {
	volumeM3: number;
	patches: readonly CalibrationPatch[];
	/** Measured T per planning band (average of the baseline session); null where not measured. */
	measuredS: readonly (number | null)[];
	formula?: ReverbFormula;
	air?: AtmosphereConditions;
	speedOfSound?: number;
}

export interface BandCalibration {
	bandHz: number;
	measuredS: number | null;
	/** Σ Sᵢαᵢ of the assumed finishes, m². */
	assumedAbsorptionM2: number;
	/** Residual in the formula's own measure (m² of Sabine area, of Σ Sα for Eyring, of −Σ S ln(1−α) for Millington), before clamping. */
	rawResidualM2: number | null;
	/**
	 * Residual used for predictions. Negative when the assumed finishes absorb more than the room
	 * measured: the measurement wins, so the calibrated room still reproduces it.
	 */
	residualM2: number;
	/** True when the residual is negative: the assumed finishes overstate the room's absorption. */
	clamped: boolean;
}

export interface Calibration {
	formula: ReverbFormula;
	volumeM3: number;
	surfaceAreaM2: number;
	speedOfSound: number;
	airAttenuationPerM: number[];
	patches: readonly CalibrationPatch[];
	bands: BandCalibration[];
	warnings: string[];
}

export interface TreatmentItem {
	label: string;
	/** Face area of the treatment, m². */
	areaM2: number;
	/** Absorption coefficient per planning band, referred to the face area. */
	coefficients: BandValues;
	/** The room surface it is mounted on and hides; its finish stops absorbing under the item. */
	covers?: SurfaceId;
}

const clampLog = (alpha: number) => Math.min(alpha, MAX_LOG_ALPHA);

function checkPatches(patches: readonly CalibrationPatch[]): number {
	if (patches.length === 0) throw new Error('calibration needs the room surfaces');
	let S = 0;
	patches.forEach((p, i) => {
		if (!(p.areaM2 >= 0)) throw new Error(`surface ${i + 1}: area must be zero or positive, got ${p.areaM2} m²`);
		checkBandValues(p.coefficients, `surface ${i + 1} coefficients`);
		S += p.areaM2;
	});
	if (!(S > 0)) throw new Error('the room surfaces add up to no area');
	return S;
}

/** The formula's absorption measure for one band, given the Σ Sα-like sum of the patches. */
function finishMeasure(formula: ReverbFormula, patches: readonly CalibrationPatch[], band: number): number {
	if (formula === 'millington') {
		return patches.reduce((sum, p) => sum - p.areaM2 * Math.log(1 - clampLog(p.coefficients[band])), 0);
	}
	return patches.reduce((sum, p) => sum + p.areaM2 * p.coefficients[band], 0);
}

/** Equivalent absorption (m², without the air) the formula yields from its measure. */
function absorptionFromMeasure(formula: ReverbFormula, measure: number, S: number): number {
	if (formula === 'eyring') return -S * Math.log(1 - clampLog(measure / S));
	return measure;
}

/** Inverse of absorptionFromMeasure. */
function measureFromAbsorption(formula: ReverbFormula, absorption: number, S: number): number {
	if (formula === 'eyring') return S * (1 - Math.exp(-absorption / S));
	return absorption;
}

export function calibrate(input: CalibrationInput): Calibration {
	const formula = input.formula ?? 'sabine';
	if (!['sabine', 'eyring', 'millington'].includes(formula)) throw new Error(`unknown formula "${formula}"`);
	if (!(input.volumeM3 > 0)) throw new Error(`room volume must be positive, got ${input.volumeM3} m³`);
	const c = input.speedOfSound ?? DEFAULT_SPEED_OF_SOUND;
	if (!(c > 0)) throw new Error(`speed of sound must be positive, got ${c} m/s`);
	const S = checkPatches(input.patches);
	if (input.measuredS.length !== PLANNING_BANDS_HZ.length) {
		throw new Error(`measured T needs ${PLANNING_BANDS_HZ.length} values (${PLANNING_BANDS_HZ.join(', ')} Hz; null where not measured)`);
	}
	const m = airAttenuationPerBand(input.air);
	const warnings: string[] = [];
	const bands = PLANNING_BANDS_HZ.map((bandHz, i): BandCalibration => {
		const measured = input.measuredS[i];
		const assumedAbsorptionM2 = input.patches.reduce((sum, p) => sum + p.areaM2 * p.coefficients[i], 0);
		if (measured === null) {
			return { bandHz, measuredS: null, assumedAbsorptionM2, rawResidualM2: null, residualM2: 0, clamped: false };
		}
		if (!(measured > 0 && Number.isFinite(measured))) {
			throw new Error(`measured T at ${bandHz} Hz must be a positive number of seconds, got ${measured}`);
		}
		const needed = absorptionForTime(input.volumeM3, measured, c) - 4 * m[i] * input.volumeM3;
		const raw = measureFromAbsorption(formula, Math.max(needed, 0), S) - finishMeasure(formula, input.patches, i);
		const clamped = raw < 0;
		if (clamped) {
			warnings.push(
				`${bandHz} Hz: assumed finishes absorb more than measured (${(-raw).toFixed(2)} m² too much); the measurement is kept, but check the assumed materials`
			);
		}
		return { bandHz, measuredS: measured, assumedAbsorptionM2, rawResidualM2: raw, residualM2: raw, clamped };
	});
	return {
		formula,
		volumeM3: input.volumeM3,
		surfaceAreaM2: S,
		speedOfSound: c,
		airAttenuationPerM: m,
		patches: input.patches,
		bands,
		warnings
	};
}

export interface BandPrediction {
	bandHz: number;
	/** T of the calibrated room without treatment (equals the measurement). */
	baselineS: number | null;
	/** T with the treatment added. */
	predictedS: number | null;
	/** Sabine absorption the treatment adds net of the surface it covers, m². */
	addedAbsorptionM2: number;
}

function checkItems(items: readonly TreatmentItem[], calibration: Calibration): void {
	const coveredBySurface = new Map<SurfaceId, number>();
	for (const item of items) {
		if (!(item.areaM2 > 0)) throw new Error(`treatment "${item.label}": area must be positive, got ${item.areaM2} m²`);
		checkBandValues(item.coefficients, `treatment "${item.label}" coefficients`);
		item.coefficients.forEach((a, i) => {
			if (!(a >= 0 && a <= 1)) throw new Error(`treatment "${item.label}": coefficient at ${PLANNING_BANDS_HZ[i]} Hz must lie in 0…1, got ${a}`);
		});
		if (item.covers) {
			const patch = coveredPatch(calibration, item.covers);
			const total = (coveredBySurface.get(item.covers) ?? 0) + item.areaM2;
			if (total > patch.areaM2 + 1e-9) {
				throw new Error(`treatment on the ${item.covers} surface covers ${total.toFixed(2)} m², more than its ${patch.areaM2.toFixed(2)} m²`);
			}
			coveredBySurface.set(item.covers, total);
		}
	}
}

function coveredPatch(calibration: Calibration, surface: SurfaceId): CalibrationPatch {
	const patch = calibration.patches.find((p) => p.surface === surface && (p.kind ?? 'surface') === 'surface');
	if (!patch) throw new Error(`treatment covers the ${surface} surface, which the calibration does not know`);
	return patch;
}

/** Predicted T per band with `items` added to the calibrated room. */
export function predictWithTreatment(calibration: Calibration, items: readonly TreatmentItem[]): BandPrediction[] {
	checkItems(items, calibration);
	const { formula, volumeM3: V, surfaceAreaM2: S, speedOfSound: c } = calibration;
	return calibration.bands.map((band, i): BandPrediction => {
		let addedSabine = 0;
		let addedMeasure = 0;
		for (const item of items) {
			const under = item.covers ? coveredPatch(calibration, item.covers).coefficients[i] : 0;
			addedSabine += item.areaM2 * (item.coefficients[i] - under);
			addedMeasure +=
				formula === 'millington'
					? item.areaM2 * (Math.log(1 - clampLog(under)) - Math.log(1 - clampLog(item.coefficients[i])))
					: item.areaM2 * (item.coefficients[i] - under);
		}
		if (band.measuredS === null) return { bandHz: band.bandHz, baselineS: null, predictedS: null, addedAbsorptionM2: addedSabine };
		const base = finishMeasure(formula, calibration.patches, i) + band.residualM2;
		const air = calibration.airAttenuationPerM[i];
		const timeOf = (measure: number) => timeFromAbsorption(V, absorptionFromMeasure(formula, Math.max(measure, 0), S), air, c);
		return {
			bandHz: band.bandHz,
			baselineS: timeOf(base),
			predictedS: timeOf(base + addedMeasure),
			addedAbsorptionM2: addedSabine
		};
	});
}

export interface TargetBand {
	lowerS: number;
	upperS: number;
}

export type TargetVerdict = 'below' | 'within' | 'above' | 'no target' | 'no prediction';

export interface BandTargetCheck {
	bandHz: number;
	predictedS: number | null;
	target: TargetBand | null;
	verdict: TargetVerdict;
}

/** Compares the predicted T per band with a target band (lower ≤ T ≤ upper). */
export function checkAgainstTarget(
	predicted: readonly BandPrediction[],
	target: readonly (TargetBand | null)[]
): BandTargetCheck[] {
	if (target.length !== predicted.length) throw new Error(`target needs ${predicted.length} bands, got ${target.length}`);
	return predicted.map((p, i) => {
		const t = target[i];
		if (t && !(t.lowerS >= 0 && t.upperS >= t.lowerS)) {
			throw new Error(`target at ${p.bandHz} Hz needs 0 ≤ lower ≤ upper, got ${t.lowerS}…${t.upperS}`);
		}
		let verdict: TargetVerdict;
		if (!t) verdict = 'no target';
		else if (p.predictedS === null) verdict = 'no prediction';
		else if (p.predictedS < t.lowerS) verdict = 'below';
		else if (p.predictedS > t.upperS) verdict = 'above';
		else verdict = 'within';
		return { bandHz: p.bandHz, predictedS: p.predictedS, target: t, verdict };
	});
}

export interface BandComparison {
	bandHz: number;
	predictedS: number | null;
	measuredS: number | null;
	/** predicted − measured, s. */
	differenceS: number | null;
	/** (predicted − measured) / measured · 100. */
	differencePct: number | null;
}

/** How the prediction compares with the room measured after treatment, per band. */
export function predictedVsMeasured(
	predicted: readonly (number | null)[],
	measuredAfter: readonly (number | null)[]
): BandComparison[] {
	if (predicted.length !== PLANNING_BANDS_HZ.length || measuredAfter.length !== PLANNING_BANDS_HZ.length) {
		throw new Error(`predicted and measured need ${PLANNING_BANDS_HZ.length} values each (${PLANNING_BANDS_HZ.join(', ')} Hz)`);
	}
	return PLANNING_BANDS_HZ.map((bandHz, i) => {
		const p = predicted[i];
		const m = measuredAfter[i];
		if (p === null || m === null) return { bandHz, predictedS: p, measuredS: m, differenceS: null, differencePct: null };
		if (!(m > 0)) throw new Error(`measured T at ${bandHz} Hz must be positive, got ${m}`);
		return { bandHz, predictedS: p, measuredS: m, differenceS: p - m, differencePct: ((p - m) / m) * 100 };
	});
}
