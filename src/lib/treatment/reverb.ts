// Predicted reverberation time from absorption: Sabine, Eyring and Millington
// (Kuttruff, Room Acoustics, chapter on the reverberation formulas).
import { airIntensityAttenuationPerM, DEFAULT_SPEED_OF_SOUND, type AtmosphereConditions } from './air';
import { PLANNING_BANDS_HZ } from './bands';

/** 24·ln 10 — the time for a 60 dB energy decay expressed through A and V. */
const DECAY_60_DB = 24 * Math.LN10;

export interface AbsorbingArea {
	areaM2: number;
	/** Absorption coefficient of this area in the band. */
	alpha: number;
}

export interface BandRoom {
	volumeM3: number;
	areas: readonly AbsorbingArea[];
	/** Air intensity attenuation m, 1/m (0 to ignore the air). */
	airAttenuationPerM?: number;
	speedOfSound?: number;
}

export type ReverbFormula = 'sabine' | 'eyring' | 'millington';

/** Coefficients of 1 or more make the logarithmic formulas infinite; they are capped here. */
export const MAX_LOG_ALPHA = 0.99;

function checkRoom(room: BandRoom): { c: number; m: number; S: number } {
	if (!(room.volumeM3 > 0)) throw new Error(`room volume must be positive, got ${room.volumeM3} m³`);
	const c = room.speedOfSound ?? DEFAULT_SPEED_OF_SOUND;
	if (!(c > 0)) throw new Error(`speed of sound must be positive, got ${c} m/s`);
	const m = room.airAttenuationPerM ?? 0;
	if (!(m >= 0)) throw new Error(`air attenuation must be zero or positive, got ${m} 1/m`);
	let S = 0;
	for (const a of room.areas) {
		if (!(a.areaM2 >= 0)) throw new Error(`surface area must be zero or positive, got ${a.areaM2} m²`);
		if (!(a.alpha >= 0 && a.alpha <= 1)) throw new Error(`absorption coefficient must lie in 0…1, got ${a.alpha}`);
		S += a.areaM2;
	}
	if (!(S > 0)) throw new Error('the room needs a surface area above zero');
	return { c, m, S };
}

/** T = 24·ln10·V / (c·(A + 4mV)), A = Σ Sᵢαᵢ (Sabine). */
export function sabineTime(room: BandRoom): number {
	const { c, m } = checkRoom(room);
	const A = room.areas.reduce((sum, a) => sum + a.areaM2 * a.alpha, 0);
	return timeFromAbsorption(room.volumeM3, A, m, c);
}

/** T = 24·ln10·V / (c·(−S·ln(1 − ᾱ) + 4mV)), ᾱ = Σ Sᵢαᵢ / S (Eyring). */
export function eyringTime(room: BandRoom): number {
	const { c, m, S } = checkRoom(room);
	const mean = Math.min(room.areas.reduce((sum, a) => sum + a.areaM2 * a.alpha, 0) / S, MAX_LOG_ALPHA);
	return timeFromAbsorption(room.volumeM3, -S * Math.log(1 - mean), m, c);
}

/** T = 24·ln10·V / (c·(−Σ Sᵢ·ln(1 − αᵢ) + 4mV)) (Millington–Sette). */
export function millingtonTime(room: BandRoom): number {
	const { c, m } = checkRoom(room);
	const A = room.areas.reduce((sum, a) => sum - a.areaM2 * Math.log(1 - Math.min(a.alpha, MAX_LOG_ALPHA)), 0);
	return timeFromAbsorption(room.volumeM3, A, m, c);
}

/** T from a total equivalent absorption area A (whichever formula produced it) plus the air. */
export function timeFromAbsorption(volumeM3: number, absorptionM2: number, airAttenuationPerM: number, speedOfSound: number): number {
	const total = absorptionM2 + 4 * airAttenuationPerM * volumeM3;
	if (!(total > 0)) throw new Error('the room has no absorption at all; the reverberation time is unbounded');
	return (DECAY_60_DB * volumeM3) / (speedOfSound * total);
}

/** Total absorption A (m², including 4mV) that gives time T. */
export function absorptionForTime(volumeM3: number, timeS: number, speedOfSound: number): number {
	if (!(timeS > 0)) throw new Error(`reverberation time must be positive, got ${timeS} s`);
	return (DECAY_60_DB * volumeM3) / (speedOfSound * timeS);
}

export interface FormulaChoice {
	formula: ReverbFormula;
	reason: string;
}

/** Above this mean coefficient Sabine overstates T noticeably (common practice, no source). */
export const SABINE_MEAN_ALPHA_LIMIT = 0.2;
/** Spread max α / min α above which absorption is called unevenly distributed (common practice, no source). */
export const UNEVEN_ALPHA_RATIO = 5;

/**
 * Which value to headline (all three are always reported): Sabine for a live room (ᾱ ≤ 0.2),
 * Eyring for a dead room with evenly spread absorption, Millington when the surfaces differ widely.
 */
export function chooseFormula(areas: readonly AbsorbingArea[]): FormulaChoice {
	const S = areas.reduce((sum, a) => sum + a.areaM2, 0);
	const mean = areas.reduce((sum, a) => sum + a.areaM2 * a.alpha, 0) / S;
	if (mean <= SABINE_MEAN_ALPHA_LIMIT) {
		return { formula: 'sabine', reason: `mean absorption ${mean.toFixed(2)} ≤ ${SABINE_MEAN_ALPHA_LIMIT}: Sabine holds for a live room` };
	}
	const used = areas.filter((a) => a.areaM2 > 0);
	const alphas = used.map((a) => a.alpha);
	const lo = Math.max(Math.min(...alphas), 0.01);
	const ratio = Math.max(...alphas) / lo;
	if (ratio > UNEVEN_ALPHA_RATIO) {
		return { formula: 'millington', reason: `coefficients differ by ${ratio.toFixed(1)}× between surfaces: Millington weights each surface` };
	}
	return { formula: 'eyring', reason: `mean absorption ${mean.toFixed(2)} with evenly spread absorption: Eyring` };
}

export interface BandReverb {
	bandHz: number;
	sabineS: number;
	eyringS: number;
	millingtonS: number;
	recommended: FormulaChoice;
}

export interface RoomAbsorption {
	volumeM3: number;
	/** Each area with one coefficient per planning band. */
	surfaces: readonly { areaM2: number; coefficients: readonly number[] }[];
	/** Air conditions for ISO 9613-1 absorption; omit to ignore the air. */
	air?: AtmosphereConditions;
	speedOfSound?: number;
}

/** Air intensity attenuation per planning band (1/m) for the given conditions, or zeros. */
export function airAttenuationPerBand(air: AtmosphereConditions | undefined): number[] {
	return PLANNING_BANDS_HZ.map((f) => (air ? airIntensityAttenuationPerM(f, air) : 0));
}

/** All three formulas per planning band. */
export function predictReverb(room: RoomAbsorption): BandReverb[] {
	const m = airAttenuationPerBand(room.air);
	return PLANNING_BANDS_HZ.map((bandHz, i) => {
		const areas = room.surfaces.map((s) => {
			if (s.coefficients.length !== PLANNING_BANDS_HZ.length) {
				throw new Error(`each surface needs ${PLANNING_BANDS_HZ.length} coefficients (${PLANNING_BANDS_HZ.join(', ')} Hz)`);
			}
			return { areaM2: s.areaM2, alpha: s.coefficients[i] };
		});
		const band: BandRoom = { volumeM3: room.volumeM3, areas, airAttenuationPerM: m[i], speedOfSound: room.speedOfSound };
		return {
			bandHz,
			sabineS: sabineTime(band),
			eyringS: eyringTime(band),
			millingtonS: millingtonTime(band),
			recommended: chooseFormula(areas)
		};
	});
}
