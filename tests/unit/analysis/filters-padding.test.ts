// The zero-phase band filter's end padding: the signal's end is extended by its even mirror image
// (x[n−2], x[n−3], …, the extension scipy.signal.sosfiltfilt uses) before the backward pass, so
// the pass starts from a settled state. Checked sample for sample against scipy's sosfilt on the
// signal padded by scipy's own even_ext (tests/reference/zero_phase_end.py).
import { describe, expect, it } from 'vitest';
import { createBandFilterBank } from '../../../src/lib/analysis/filters';
import { createSeededGaussian } from '../../../src/lib/analysis/synthetic';
import { runReference } from './helpers/python-reference';

const SAMPLE_RATE = 48000;
const bank = createBandFilterBank(SAMPLE_RATE, 'octave');
const sectionsOf = (sections: Float64Array | number[]) => Array.from({ length: sections.length / 6 }, (_, row) => Array.from(sections.slice(6 * row, 6 * row + 6)));

/** Largest difference from scipy, relative to the largest output sample. */
function worstError(mine: Float64Array, theirs: number[]): number {
	let peak = 0;
	let worst = 0;
	theirs.forEach((v, i) => {
		peak = Math.max(peak, Math.abs(v));
		worst = Math.max(worst, Math.abs(mine[i] - v));
	});
	return worst / peak;
}

describe('zero-phase band filtering with the end mirrored (scipy.signal reference)', () => {
	const gaussian = createSeededGaussian(3);
	const noise = Float64Array.from({ length: 6000 }, () => gaussian());

	it.each([
		{ centerHz: 1000, start: 0, end: 6000, leadingZeros: 0, case: 'the whole signal' },
		{ centerHz: 4000, start: 500, end: 3200, leadingZeros: 0, case: 'a range inside it (the mirror is of the range’s end)' },
		{ centerHz: 250, start: 1000, end: 6000, leadingZeros: 300, case: 'a range after leading zeros' }
	])('$centerHz Hz, $case: the same to 1e-9 of the peak', ({ centerHz, start, end, leadingZeros }) => {
		const index = bank.filters.findIndex((f) => f.band.nominalHz === centerHz);
		const filter = bank.filters[index];
		const mine = bank.filterZeroPhase(index, noise, start, end, undefined, leadingZeros);
		const pad = Math.min(filter.padding, end - start - 1);
		const { y } = runReference<{ y: number[] }>('zero_phase_end.py', { x: Array.from(noise.subarray(start, end)), sos: sectionsOf(filter.sections), pad, leadingZeros });
		expect(mine).toHaveLength(y.length);
		// Both are the same arithmetic in double precision; 1e-9 leaves room for summation order only.
		expect(worstError(mine, y)).toBeLessThan(1e-9);
	});
});
