import { describe, expect, it } from 'vitest';
import { curvaturePercent, EVALUATION_RANGES, fitDecayRange } from '../../../src/lib/analysis/decay-fit';
import { runReference } from './helpers/python-reference';

const SAMPLE_RATE = 1000;

/** Linear decay energy (normalised) from a dB-vs-time function. */
function decayFromDb(levelDb: (tS: number) => number, durationS: number): Float64Array {
	return new Float64Array(Math.round(durationS * SAMPLE_RATE)).map((_, i) => 10 ** (levelDb(i / SAMPLE_RATE) / 10));
}

describe('least-squares decay fits (ISO 3382-1:2009 ranges: EDT 0…−10, T20 −5…−25, T30 −5…−35 dB)', () => {
	it.each([0.3, 0.8, 2.5])('a straight decay of T = %f s gives EDT = T20 = T30 = T, r = −1, ξ = 0', (t60S) => {
		const decay = decayFromDb((t) => (-60 * t) / t60S, t60S);
		for (const range of Object.values(EVALUATION_RANGES)) {
			const fit = fitDecayRange(decay, SAMPLE_RATE, range)!;
			// Exact line: only round-off of the sums.
			expect(Math.abs(fit.reverberationTimeS / t60S - 1)).toBeLessThan(1e-9);
			expect(fit.r).toBeCloseTo(-1, 9);
			expect(fit.nonLinearityPermille).toBeLessThan(1e-6);
			expect(fit.interceptDb).toBeCloseTo(0, 6);
		}
	});

	it('each range starts and ends at the first samples at or below its limits', () => {
		const fit = fitDecayRange(decayFromDb((t) => -60 * t, 1), SAMPLE_RATE, EVALUATION_RANGES.t30)!;
		// −60 dB/s: −5 dB at 83.3 ms → sample 84; −35 dB at 583.3 ms → sample 584.
		expect(fit.startS).toBeCloseTo(0.084, 9);
		expect(fit.endS).toBeCloseTo(0.584, 9);
	});

	it('a curve that never reaches the bottom of a range has no value for it', () => {
		const decay = decayFromDb((t) => -60 * t, 0.5); // reaches −30 dB only
		expect(fitDecayRange(decay, SAMPLE_RATE, EVALUATION_RANGES.t30)).toBeNull();
		expect(fitDecayRange(decay, SAMPLE_RATE, EVALUATION_RANGES.t20)).not.toBeNull();
	});

	it('EDT follows the early slope and T30 the later one on a double-slope decay', () => {
		// −120 dB/s to −10 dB, then −40 dB/s: EDT = 0.5 s, T30 mostly the slow part.
		const decay = decayFromDb((t) => (t < 1 / 12 ? -120 * t : -10 - 40 * (t - 1 / 12)), 1.5);
		const edt = fitDecayRange(decay, SAMPLE_RATE, EVALUATION_RANGES.edt)!;
		const t30 = fitDecayRange(decay, SAMPLE_RATE, EVALUATION_RANGES.t30)!;
		expect(edt.reverberationTimeS).toBeCloseTo(0.5, 2);
		expect(t30.reverberationTimeS).toBeGreaterThan(1.2);
		expect(t30.nonLinearityPermille).toBeGreaterThan(0);
	});

	it('slope, intercept and r agree with scipy.stats.linregress on a rippled decay', () => {
		const levels = (t: number) => -45 * t + 1.5 * Math.sin(40 * t) + 0.7 * Math.cos(173 * t);
		const decay = decayFromDb(levels, 1.2);
		const fit = fitDecayRange(decay, SAMPLE_RATE, EVALUATION_RANGES.t20)!;
		const first = Math.round(fit.startS * SAMPLE_RATE);
		const last = Math.round(fit.endS * SAMPLE_RATE);
		const times: number[] = [];
		const values: number[] = [];
		for (let i = first; i <= last; i++) {
			times.push(i / SAMPLE_RATE);
			values.push(10 * Math.log10(decay[i]));
		}
		const reference = runReference<{ slope: number; intercept: number; r: number }>('decay_fit.py', { times, values });
		// Both in double precision over ~500 points.
		expect(Math.abs(fit.slopeDbPerS - reference.slope)).toBeLessThan(1e-9 * Math.abs(reference.slope));
		expect(Math.abs(fit.interceptDb - reference.intercept)).toBeLessThan(1e-8);
		expect(Math.abs(fit.r - reference.r)).toBeLessThan(1e-12);
		// ISO 3382-2:2008 Annex B: ξ = 1000·(1 − r²).
		expect(fit.nonLinearityPermille).toBeCloseTo(1000 * (1 - reference.r ** 2), 9);
	});

	it('a long range (fitted on every n-th point) agrees with linregress over all its points', () => {
		const rate = 48000;
		const levels = (t: number) => -60 * t + 0.8 * Math.sin(25 * t);
		const decay = new Float64Array(rate).map((_, i) => 10 ** (levels(i / rate) / 10));
		const fit = fitDecayRange(decay, rate, EVALUATION_RANGES.t30)!;
		const times: number[] = [];
		const values: number[] = [];
		for (let i = Math.round(fit.startS * rate); i <= Math.round(fit.endS * rate); i++) {
			times.push(i / rate);
			values.push(10 * Math.log10(decay[i]));
		}
		expect(times.length).toBeGreaterThan(20000);
		const reference = runReference<{ slope: number; r: number }>('decay_fit.py', { times, values });
		// Sampling a smooth curve every ~6th point changes the slope by far less than 0.1 %.
		expect(Math.abs(fit.slopeDbPerS / reference.slope - 1)).toBeLessThan(1e-3);
		expect(Math.abs(fit.r - reference.r)).toBeLessThan(1e-4);
	});

	it('curvature C = 100·(T30/T20 − 1) % (ISO 3382-2:2008, Annex B)', () => {
		expect(curvaturePercent(0.5, 0.6)).toBeCloseTo(20, 12);
		expect(curvaturePercent(1, 0.95)).toBeCloseTo(-5, 12);
	});

	it('rejects an upside-down range', () => {
		expect(() => fitDecayRange(new Float64Array(10), SAMPLE_RATE, { topDb: -25, bottomDb: -5 })).toThrow(RangeError);
	});
});
