// A room's plan worked through: surfaces and their finishes, what each item absorbs, the room
// calibrated to its measured baseline, the predicted T per band by each formula with the one to
// read, the target, and — once the room has been measured again — predicted against measured.
import { formatHz } from '../format';
import { MID_FREQUENCY_BANDS_HZ } from '../results/reverberation';
import type { TargetBand } from '../analysis/targets';
import { DEFAULT_AIR, type AtmosphereConditions } from '../treatment/air';
import { PLANNING_BANDS_HZ } from '../treatment/bands';
import { calibrate, checkAgainstTarget, predictWithTreatment, type BandPrediction, type Calibration, type CalibrationPatch, type TargetVerdict, type TreatmentItem } from '../treatment/calibrate';
import { materialBandCoefficients, type Material } from '../treatment/materials';
import { airAttenuationPerBand, chooseFormula, eyringTime, millingtonTime, sabineTime, type ReverbFormula } from '../treatment/reverb';
import { roomPatches, roomVolumeM3, SURFACE_IDS, surfaceAreaM2, surfaceSidesM, type RoomDimensions, type SurfaceId } from '../treatment/surfaces';
import { itemAcoustics, type ItemAcoustics } from './items';
import { DEFAULT_FINISH, type MaterialCatalogue, type MaterialKey, type StoredPlan } from './types';

export const FORMULAS: readonly ReverbFormula[] = ['sabine', 'eyring', 'millington'];

/** The bands the formula is chosen on: the mid-frequency bands of T_mid, defined once in results/reverberation. */
export const MID_BANDS_HZ = MID_FREQUENCY_BANDS_HZ;

export interface PlanInput {
	room: RoomDimensions;
	plan: StoredPlan;
	catalogue: MaterialCatalogue;
	/** Measured T per planning band before treatment (null where not measured); null without a baseline visit. */
	measuredBeforeS: readonly (number | null)[] | null;
	/** Measured T per planning band after treatment; null until the room is measured again. */
	measuredAfterS: readonly (number | null)[] | null;
	/** Target per band (any band centres; matched to the planning bands), empty for none. */
	target: readonly TargetBand[];
}

export interface SurfaceRow {
	surface: SurfaceId;
	sidesM: [number, number];
	grossAreaM2: number;
	openingsAreaM2: number;
	/** Area the finish still absorbs with, before treatment covers any of it. */
	netAreaM2: number;
	/** Face area of the items mounted on it. */
	coveredAreaM2: number;
	material: Material;
}

export interface PlanItemResult extends ItemAcoustics {
	id: number;
	error: string | null;
}

export interface PlanBandRow {
	bandHz: number;
	measuredBeforeS: number | null;
	/** T of the room from the assumed finishes alone, by the formula used for the band. */
	assumedS: number | null;
	/** True when the measured T fixed the room's unknown absorption in this band. */
	calibrated: boolean;
	/** Absorption the measurement adds to the assumed finishes (Sabine m², may be negative when clamped). */
	residualM2: number | null;
	predictedByFormula: Record<ReverbFormula, number | null>;
	/** The formula whose value is the prediction for this band, and why. */
	formula: ReverbFormula;
	formulaReason: string;
	predictedS: number | null;
	/** Sabine absorption the treatment adds, net of what it covers, m². */
	addedAbsorptionM2: number;
	target: { targetS: number; lowerS: number; upperS: number } | null;
	verdict: TargetVerdict;
	measuredAfterS: number | null;
	/** predicted − measured after, s and %. */
	differenceS: number | null;
	differencePct: number | null;
}

export interface PlanEvaluation {
	volumeM3: number;
	surfaceAreaM2: number;
	surfaces: SurfaceRow[];
	items: PlanItemResult[];
	bands: PlanBandRow[];
	calibration: 'measured' | 'partly measured' | 'assumed finishes only';
	warnings: string[];
	/** Why there is no prediction at all (the plan cannot be evaluated as it stands). */
	problems: string[];
}

/** The material a plan refers to, or the default finish when the reference is gone. */
export function resolveMaterial(catalogue: MaterialCatalogue, key: MaterialKey, warnings?: string[]): Material {
	const found = catalogue.get(key);
	if (found) return found;
	warnings?.push(`material "${key}" is no longer available; ${DEFAULT_FINISH} is assumed in its place`);
	return catalogue.get(DEFAULT_FINISH)!;
}

const sameCentre = (a: number, b: number) => Math.abs(Math.log2(a / b)) < 1 / 12;

function targetOnPlanningBands(target: readonly TargetBand[]) {
	return PLANNING_BANDS_HZ.map((f) => {
		const t = target.find((x) => sameCentre(x.centerHz, f));
		return t ? { targetS: t.targetS, lowerS: t.lowerS, upperS: t.upperS } : null;
	});
}

function checkBandList(values: readonly (number | null)[] | null, what: string): void {
	if (values !== null && values.length !== PLANNING_BANDS_HZ.length) {
		throw new Error(`${what} needs ${PLANNING_BANDS_HZ.length} values (${PLANNING_BANDS_HZ.join(', ')} Hz; null where not measured)`);
	}
}

/** Reverberation time of the room as the finishes alone would make it, per band, by one formula. */
function assumedTimes(volumeM3: number, patches: readonly CalibrationPatch[], formula: ReverbFormula, air: AtmosphereConditions): number[] {
	const m = airAttenuationPerBand(air);
	const time = { sabine: sabineTime, eyring: eyringTime, millington: millingtonTime }[formula];
	return PLANNING_BANDS_HZ.map((_, i) =>
		time({ volumeM3, areas: patches.map((p) => ({ areaM2: p.areaM2, alpha: p.coefficients[i] })), airAttenuationPerM: m[i], speedOfSound: DEFAULT_AIR.speedOfSound })
	);
}

export function evaluatePlan(input: PlanInput): PlanEvaluation {
	checkBandList(input.measuredBeforeS, 'measured T before');
	checkBandList(input.measuredAfterS, 'measured T after');
	const { room, plan, catalogue } = input;
	const warnings: string[] = [];
	const problems: string[] = [];
	const volumeM3 = roomVolumeM3({ lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM });
	const air: AtmosphereConditions = { temperatureC: plan.settings.temperatureC, relativeHumidityPct: plan.settings.relativeHumidityPct };

	const finishes = Object.fromEntries(SURFACE_IDS.map((s) => [s, resolveMaterial(catalogue, plan.finishes[s] ?? DEFAULT_FINISH, warnings)])) as Record<SurfaceId, Material>;
	const items: PlanItemResult[] = plan.items.map((item) => {
		try {
			return { id: item.id, error: null, ...itemAcoustics(item) };
		} catch (e) {
			const error = `${item.label}: ${(e as Error).message}`;
			problems.push(error);
			return { id: item.id, error, coefficients: PLANNING_BANDS_HZ.map(() => 0), normalIncidence: null, totalAreaM2: 0, actionRangeHz: null, method: '', warnings: [], diffuser: null };
		}
	});

	const surfaces: SurfaceRow[] = SURFACE_IDS.map((surface) => {
		const openingsAreaM2 = plan.openings.filter((o) => o.surface === surface).reduce((sum, o) => sum + o.widthM * o.heightM, 0);
		const coveredAreaM2 = plan.items.reduce((sum, item, i) => sum + (item.surface === surface ? items[i].totalAreaM2 : 0), 0);
		const grossAreaM2 = surfaceAreaM2(room, surface);
		return { surface, sidesM: surfaceSidesM(room, surface), grossAreaM2, openingsAreaM2, netAreaM2: grossAreaM2 - openingsAreaM2, coveredAreaM2, material: finishes[surface] };
	});
	const surfaceAreaTotal = surfaces.reduce((sum, s) => sum + s.grossAreaM2, 0);

	let patches: CalibrationPatch[] = [];
	try {
		patches = roomPatches(
			{ lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM },
			Object.fromEntries(SURFACE_IDS.map((s) => [s, materialBandCoefficients(finishes[s])])) as Record<SurfaceId, number[]>,
			plan.openings.map((o) => ({ label: o.label, surface: o.surface, widthM: o.widthM, heightM: o.heightM, coefficients: materialBandCoefficients(resolveMaterial(catalogue, o.materialKey, warnings)) }))
		);
	} catch (e) {
		problems.push((e as Error).message);
	}
	for (const s of surfaces) {
		if (s.coveredAreaM2 > s.netAreaM2 + 1e-9) {
			problems.push(`the items on the ${s.surface} surface cover ${s.coveredAreaM2.toFixed(2)} m², more than its ${s.netAreaM2.toFixed(2)} m² (openings left out)`);
		}
	}

	const measuredBefore = input.measuredBeforeS ?? PLANNING_BANDS_HZ.map(() => null);
	const measuredAfter = input.measuredAfterS ?? PLANNING_BANDS_HZ.map(() => null);
	const target = targetOnPlanningBands(input.target);
	const measuredCount = measuredBefore.filter((v) => v !== null).length;
	const calibrationKind: PlanEvaluation['calibration'] =
		measuredCount === PLANNING_BANDS_HZ.length ? 'measured' : measuredCount > 0 ? 'partly measured' : 'assumed finishes only';

	/** The answer without a prediction, once `problems` says why. */
	const unworkable = (): PlanEvaluation => ({
		volumeM3,
		surfaceAreaM2: surfaceAreaTotal,
		surfaces,
		items,
		bands: emptyBands(measuredBefore, measuredAfter, target),
		calibration: calibrationKind,
		warnings,
		problems
	});

	if (problems.length > 0) {
		return unworkable();
	}

	const treatment: TreatmentItem[] = plan.items.map((item, i) => ({
		label: item.label,
		areaM2: items[i].totalAreaM2,
		coefficients: items[i].coefficients.map((a) => Math.min(Math.max(a, 0), 1)),
		covers: item.surface ?? undefined
	}));
	let byFormula: Record<ReverbFormula, { assumed: number[]; calibration: Calibration; predictions: BandPrediction[] }>;
	try {
		byFormula = Object.fromEntries(
			FORMULAS.map((formula) => {
				const assumed = assumedTimes(volumeM3, patches, formula, air);
				// A band without a measurement keeps the assumed room as it is (residual 0).
				const calibration = calibrate({ volumeM3, patches, measuredS: measuredBefore.map((m, i) => m ?? assumed[i]), formula, air, speedOfSound: DEFAULT_AIR.speedOfSound });
				return [formula, { assumed, calibration, predictions: predictWithTreatment(calibration, treatment) }];
			})
		) as typeof byFormula;
	} catch (e) {
		problems.push((e as Error).message);
		return unworkable();
	}
	for (const w of byFormula.sabine.calibration.warnings) warnings.push(w);

	// Which formula to read, judged once for the room on the treated room at 500 Hz and 1 kHz
	// (the mid bands ISO 3382-1 averages for single numbers): each item replaces what it covers,
	// and the absorption the measurement found beyond the finishes is spread evenly over the
	// surfaces (where it is, nobody knows; even is Eyring's own assumption). One formula for
	// every band keeps the predicted curve from jumping where a per-band rule would switch.
	const treatedAreasAt = (i: number) => {
		const spread = byFormula.sabine.calibration.bands[i].residualM2 / byFormula.sabine.calibration.surfaceAreaM2;
		return [
			...patches.map((p) => {
				const covered = p.kind === 'surface' ? treatment.filter((t) => t.covers === p.surface).reduce((sum, t) => sum + t.areaM2, 0) : 0;
				return { areaM2: Math.max(p.areaM2 - covered, 0), alpha: Math.min(Math.max(p.coefficients[i] + spread, 0), 1) };
			}),
			...treatment.map((t) => ({ areaM2: t.areaM2, alpha: t.coefficients[i] }))
		];
	};
	const mid = MID_BANDS_HZ.map((f) => treatedAreasAt(PLANNING_BANDS_HZ.indexOf(f as (typeof PLANNING_BANDS_HZ)[number])));
	const choice = chooseFormula(mid[0].map((a, j) => ({ areaM2: a.areaM2, alpha: (a.alpha + mid[1][j].alpha) / 2 })));

	const bands = PLANNING_BANDS_HZ.map((bandHz, i): PlanBandRow => {
		const chosen = byFormula[choice.formula];
		const predictedByFormula = Object.fromEntries(FORMULAS.map((f) => [f, byFormula[f].predictions[i].predictedS])) as Record<ReverbFormula, number | null>;
		const predictedS = predictedByFormula[choice.formula];
		const measured = measuredBefore[i];
		const after = measuredAfter[i];
		const verdict = checkAgainstTarget([chosen.predictions[i]], [target[i] ? { lowerS: target[i]!.lowerS, upperS: target[i]!.upperS } : null])[0].verdict;
		return {
			bandHz,
			measuredBeforeS: measured,
			assumedS: chosen.assumed[i],
			calibrated: measured !== null,
			residualM2: measured === null ? null : byFormula.sabine.calibration.bands[i].rawResidualM2,
			predictedByFormula,
			formula: choice.formula,
			formulaReason: choice.reason,
			predictedS,
			addedAbsorptionM2: chosen.predictions[i].addedAbsorptionM2,
			target: target[i],
			verdict,
			measuredAfterS: after,
			differenceS: predictedS !== null && after !== null ? predictedS - after : null,
			differencePct: predictedS !== null && after !== null ? ((predictedS - after) / after) * 100 : null
		};
	});
	if (calibrationKind !== 'measured') {
		warnings.push(
			calibrationKind === 'assumed finishes only'
				? 'no measured baseline: the prediction rests on the assumed finishes alone; pick the visit before treatment to calibrate it'
				: `bands without a measurement (${bands.filter((b) => !b.calibrated).map((b) => formatHz(b.bandHz)).join(', ')}) rest on the assumed finishes alone`
		);
	}
	for (const item of items) for (const w of item.warnings) warnings.push(`${plan.items.find((p) => p.id === item.id)!.label}: ${w}`);
	return { volumeM3, surfaceAreaM2: surfaceAreaTotal, surfaces, items, bands, calibration: calibrationKind, warnings, problems };
}

function emptyBands(before: readonly (number | null)[], after: readonly (number | null)[], target: ReturnType<typeof targetOnPlanningBands>): PlanBandRow[] {
	return PLANNING_BANDS_HZ.map((bandHz, i) => ({
		bandHz,
		measuredBeforeS: before[i],
		assumedS: null,
		calibrated: before[i] !== null,
		residualM2: null,
		predictedByFormula: { sabine: null, eyring: null, millington: null },
		formula: 'sabine',
		formulaReason: '',
		predictedS: null,
		addedAbsorptionM2: 0,
		target: target[i],
		verdict: 'no prediction',
		measuredAfterS: after[i],
		differenceS: null,
		differencePct: null
	}));
}
