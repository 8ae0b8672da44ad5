// A frequency range chosen by dragging across a response chart.
import { roundSignificant } from '../format';

export interface FrequencyRange {
	fLoHz: number;
	fHiHz: number;
}

/**
 * The range between two dragged-to frequencies, in order, clipped to the axis, and rounded to
 * three significant figures (the precision a consultant writes a band down with). Null when the
 * drag collapses to one frequency or an end is not a frequency.
 */
export function selectedRange(aHz: number, bHz: number, limits?: FrequencyRange): FrequencyRange | null {
	if (!Number.isFinite(aHz) || !Number.isFinite(bHz) || aHz <= 0 || bHz <= 0) return null;
	let lo = Math.min(aHz, bHz);
	let hi = Math.max(aHz, bHz);
	if (limits) {
		lo = Math.max(lo, limits.fLoHz);
		hi = Math.min(hi, limits.fHiHz);
	}
	const fLoHz = roundSignificant(lo, 3);
	const fHiHz = roundSignificant(hi, 3);
	return fHiHz > fLoHz ? { fLoHz, fHiHz } : null;
}
