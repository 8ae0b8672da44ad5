// The steps of the noise-floor search held to hand computations on decays with no randomness, so
// that each step's rule shows in the result to a fraction of a millisecond (Lundeby, Vigran,
// Bietz & Vorländer, "Uncertainties of measurements in room acoustics", Acustica 81:344–355,
// 1995; step numbers are the paper's, as in src/lib/analysis/lundeby.ts).
import { describe, expect, it } from 'vitest';
import { estimateNoiseFloor } from '../../../src/lib/analysis/lundeby';
import { energyDecayRate } from '../../../src/lib/analysis/synthetic';

const SAMPLE_RATE = 48000;
const NOISE_DB = -50;
const NOISE_POWER = 10 ** (NOISE_DB / 10);

/** p²(t) = 10^(−6t/T) (60 dB in T), then a steady background once the decay reaches it: max(decay, noise). */
function decayOntoFloor(t60S: number, durationS: number): Float64Array {
	return Float64Array.from({ length: Math.round(durationS * SAMPLE_RATE) }, (_, i) => Math.max(10 ** ((-6 * i) / SAMPLE_RATE / t60S), NOISE_POWER));
}

/** The expected mean square of a decay in steady noise: the two powers add, 10^(−6t/T) + noise. */
function decayPlusNoise(t60S: number, durationS: number): Float64Array {
	return Float64Array.from({ length: Math.round(durationS * SAMPLE_RATE) }, (_, i) => 10 ** ((-6 * i) / SAMPLE_RATE / t60S) + NOISE_POWER);
}

/**
 * How far the mean square of an exponential over an interval of `length` samples lies above the
 * decay at the interval's centre: the mean of e^(−kt) over ±h is e^(−k·t_c)·sinh(kh)/(kh), a
 * constant in dB, 10·lg(sinh x / x) with x = k·h.
 */
function intervalMeanExcessDb(t60S: number, length: number): number {
	const x = (energyDecayRate(t60S) * length) / 2 / SAMPLE_RATE;
	return 10 * Math.log10(Math.sinh(x) / x);
}

describe('a decay onto a steady floor: every step exact to a fraction of a millisecond', () => {
	// T = 0.5, 1, 2 s; the background 50 dB down is reached at t0 = 50/60·T and the record runs to
	// 2·t0 + 0.5 s, so the noise stretch of step 7 (10 dB of decay past t0) is all background.
	it.each([0.5, 1, 2])('T = %s s', (t60S) => {
		const slopeDbPerS = -60 / t60S;
		const t0S = (-NOISE_DB / 60) * t60S;
		const estimate = estimateNoiseFloor(decayOntoFloor(t60S, 2 * t0S + 0.5), SAMPLE_RATE);

		// Step 7: the background is its own mean, exactly.
		expect(estimate.noisePower / NOISE_POWER).toBeCloseTo(1, 9);
		// Step 8: interval means of an exponential are the exponential shifted by a constant, so the
		// late line has the decay's own slope.
		expect(estimate.lateSlopeDbPerS! / slopeDbPerS).toBeCloseTo(1, 9);
		expect(estimate.converged).toBe(true);

		// Step 9: the line meets the noise at t0, moved by what the interval means add over the
		// decay at each interval's centre (step 5: 5 intervals per 10 dB of decay, so each is 2 dB
		// long, L = 2/60·T·fs samples: 0.038 dB, 0.64 ms at T = 1 s) and by half a sample (an
		// interval's samples j·L … j·L + L − 1 are centred half a sample before j·L + L/2, its stamp).
		// Stamped anywhere but the centre, the line would shift by up to half an interval (1 dB of decay, 16.7 ms at T = 1 s).
		const lengthSamples = Math.round((2 / 60) * t60S * SAMPLE_RATE);
		const expectedIndex = (t0S + intervalMeanExcessDb(t60S, lengthSamples) / -slopeDbPerS) * SAMPLE_RATE + 0.5;
		expect(Math.abs(estimate.crosspointIndex - expectedIndex)).toBeLessThanOrEqual(1);
		expect(10 * Math.log10(estimate.powerAtCrosspoint)).toBeCloseTo(NOISE_DB, 2);

		// Step 7: the noise is averaged from 10 dB of decay past the crosspoint of the iteration
		// before: here the first fit's (steps 1–4: 20 ms intervals, 960 samples), found the same way.
		const firstCrossingIndex = (t0S + intervalMeanExcessDb(t60S, 960) / -slopeDbPerS) * SAMPLE_RATE + 0.5;
		const expectedNoiseStart = firstCrossingIndex + (10 / -slopeDbPerS) * SAMPLE_RATE;
		expect(Math.abs(estimate.noiseStartIndex - expectedNoiseStart)).toBeLessThanOrEqual(1);
	});
});

describe('a decay in steady noise: the late fit ends 10 dB above the noise (step 8)', () => {
	/**
	 * The least-squares line, over the level range the late fit spans, through the level in dB re
	 * the noise of a decay plus noise, L(x) = 10·lg(10^(x/10) + 1), against x, the decay's own level
	 * above the noise (x falls linearly in time). The fit spans levels bottom … bottom + 15 dB:
	 * bottom = 10 dB gives slope factor 0.9756 (the late line is 2.4 % shallower than the decay),
	 * bottom = 5 dB gives 0.9164 (8.4 % shallower): the margin is the paper's guard against the
	 * noise bending the line.
	 */
	function slopeFactor(bottomDb: number): number {
		const xOf = (levelDb: number) => 10 * Math.log10(10 ** (levelDb / 10) - 1);
		const [x0, x1] = [xOf(bottomDb), xOf(bottomDb + 15)];
		const steps = 20000;
		let [sx, sy, sxx, sxy] = [0, 0, 0, 0];
		for (let i = 0; i <= steps; i++) {
			const x = x0 + ((x1 - x0) * i) / steps;
			const y = 10 * Math.log10(10 ** (x / 10) + 1);
			[sx, sy, sxx, sxy] = [sx + x, sy + y, sxx + x * x, sxy + x * y];
		}
		const n = steps + 1;
		return (n * sxy - sx * sy) / (n * sxx - sx * sx);
	}

	it('the hand-computed slope factors are those of the two margins', () => {
		expect(slopeFactor(10)).toBeCloseTo(0.9756, 4);
		expect(slopeFactor(5)).toBeCloseTo(0.9164, 4);
	});

	it.each([0.5, 1, 2])('T = %s s: the late slope is 60/T · 0.9756 dB/s within 1 per cent (the fit range moves in 2 dB interval steps)', (t60S) => {
		const t0S = (-NOISE_DB / 60) * t60S;
		const estimate = estimateNoiseFloor(decayPlusNoise(t60S, 2 * t0S + 0.5), SAMPLE_RATE);
		const expected = (-60 / t60S) * slopeFactor(10);
		expect(Math.abs(estimate.lateSlopeDbPerS! / expected - 1)).toBeLessThan(0.01);
		// The noise, taken 10 dB of decay past the crosspoint, still holds a little decay: within 0.1 dB.
		expect(Math.abs(10 * Math.log10(estimate.noisePower / NOISE_POWER))).toBeLessThan(0.1);
	});
});
