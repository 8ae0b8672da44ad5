// Data for the decay chart: the Schroeder curve with its fitted lines over their evaluation
// ranges, the reverberation time each line implies, and the level range to draw.
import type { DecayCurve, DecayLineFit } from '../analysis/types';
import { paddedRange } from './ticks';

export type DecayFitKey = 'edt' | 't20' | 't30';

export const DECAY_FITS: readonly { key: DecayFitKey; label: string; range: string }[] = [
	{ key: 'edt', label: 'EDT', range: '0 to −10 dB' },
	{ key: 't20', label: 'T20', range: '−5 to −25 dB' },
	{ key: 't30', label: 'T30', range: '−5 to −35 dB' }
];

/** Level of a fitted line at t: interceptDb + slopeDbPerS·t. */
export function fitLevel(fit: DecayLineFit, timeS: number): number {
	return fit.interceptDb + fit.slopeDbPerS * timeS;
}

/** Time for a 60 dB fall at the line's slope, T = −60 / slope (ISO 3382-2:2008, 3.5); null if the line does not fall. */
export function fitReverberationTime(fit: DecayLineFit): number | null {
	return fit.slopeDbPerS < 0 && Number.isFinite(fit.slopeDbPerS) ? -60 / fit.slopeDbPerS : null;
}

export interface DecayPlotData {
	x: number[];
	/** The Schroeder curve; null at the points added for the fit ends. */
	curve: (number | null)[];
	/** One column per present fit, null outside its evaluation range. */
	fits: { key: DecayFitKey; label: string; values: (number | null)[] }[];
}

function checkCurve(curve: DecayCurve): void {
	if (curve.timesS.length !== curve.levelDb.length) {
		throw new RangeError(`decay curve has ${curve.timesS.length} times and ${curve.levelDb.length} levels`);
	}
	for (let i = 1; i < curve.timesS.length; i++) {
		if (!(curve.timesS[i] > curve.timesS[i - 1])) throw new RangeError(`decay times must increase; time ${i} does not`);
	}
}

/** The curve's own times plus each fit's start and end, so every line is drawn exactly over its range. */
export function decayPlotData(curve: DecayCurve): DecayPlotData {
	checkCurve(curve);
	const present = DECAY_FITS.filter((f) => curve.fits[f.key]);
	const extra = present.flatMap((f) => [curve.fits[f.key]!.startS, curve.fits[f.key]!.endS]);
	const x = [...new Set([...curve.timesS, ...extra])].sort((a, b) => a - b);
	const levelAt = new Map(curve.timesS.map((t, i) => [t, curve.levelDb[i]]));
	const curveColumn = x.map((t) => {
		const level = levelAt.get(t);
		return level !== undefined && Number.isFinite(level) ? level : null;
	});
	const fits = present.map(({ key, label }) => {
		const fit = curve.fits[key]!;
		return { key, label, values: x.map((t) => (t >= fit.startS && t <= fit.endS ? fitLevel(fit, t) : null)) };
	});
	return { x, curve: curveColumn, fits };
}

export interface DecayFitRow {
	key: DecayFitKey;
	label: string;
	range: string;
	startS: number;
	endS: number;
	slopeDbPerS: number;
	timeS: number | null;
}

export function decayFitRows(curve: DecayCurve): DecayFitRow[] {
	return DECAY_FITS.filter((f) => curve.fits[f.key]).map(({ key, label, range }) => {
		const fit = curve.fits[key]!;
		return { key, label, range, startS: fit.startS, endS: fit.endS, slopeDbPerS: fit.slopeDbPerS, timeS: fitReverberationTime(fit) };
	});
}

/** Level axis: 0 dB at the top (plus a step of headroom), down past the curve's lowest level and the noise line, at most 100 dB deep. */
export function decayLevelRange(curve: DecayCurve, stepDb = 10): [number, number] {
	const levels = curve.levelDb.filter(Number.isFinite);
	if (curve.noiseDb !== null && Number.isFinite(curve.noiseDb)) levels.push(curve.noiseDb);
	const lowest = levels.length ? Math.max(-100, Math.min(...levels)) : -60;
	const [lo] = paddedRange(lowest, 0, stepDb);
	return [lo, 5];
}

/** Stable key of a curve's band for pickers: "125", "1000", "broadband". */
export function decayCurveKey(curve: Pick<DecayCurve, 'centerHz'>): string {
	return String(curve.centerHz);
}
