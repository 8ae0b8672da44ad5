import { describe, expect, it } from 'vitest';
import { estimateNoiseFloor } from '../../../src/lib/analysis/lundeby';
import { createSeededGaussian, energyDecayRate, exponentialNoiseDecay } from '../../../src/lib/analysis/synthetic';

const SAMPLE_RATE = 48000;

function squared(x: Float64Array): Float64Array {
	return x.map((v) => v * v);
}

/** Mean-square of the background added by exponentialNoiseDecay: peak of the clean p² times 10^(dB/10). */
function trueNoisePower(clean: Float64Array, noiseDbRePeak: number): number {
	let peak = 0;
	for (const v of clean) peak = Math.max(peak, v * v);
	return peak * 10 ** (noiseDbRePeak / 10);
}

describe('noise level and crosspoint (Lundeby, Vigran, Bietz & Vorländer, Acustica 81:344, 1995)', () => {
	it.each([
		{ t60S: 0.5, noiseDb: -60 },
		{ t60S: 0.5, noiseDb: -45 },
		{ t60S: 1.2, noiseDb: -60 },
		{ t60S: 1.2, noiseDb: -45 },
		{ t60S: 0.3, noiseDb: -30 }
	])('T = $t60S s with noise at $noiseDb dB re peak: noise within 2 dB, crosspoint where the decay meets it', ({ t60S, noiseDb }) => {
		const options = { t60S, durationS: 3 * t60S + 0.5, sampleRate: SAMPLE_RATE, seed: 11 };
		const clean = exponentialNoiseDecay(options);
		const noisy = exponentialNoiseDecay({ ...options, noiseDbRePeak: noiseDb });
		const estimate = estimateNoiseFloor(squared(noisy), SAMPLE_RATE);
		const truth = trueNoisePower(clean, noiseDb);
		expect(Math.abs(10 * Math.log10(estimate.noisePower / truth))).toBeLessThan(2);

		// The decay's mean square (initial power 1) meets the noise at t = ln(1/σ²)/k.
		const crossingS = Math.log(1 / truth) / energyDecayRate(t60S);
		// Within the time the decay takes to fall 5 dB (common practice, no source).
		const toleranceS = (5 / 60) * t60S;
		expect(Math.abs(estimate.crosspointIndex / SAMPLE_RATE - crossingS)).toBeLessThan(toleranceS);
		expect(estimate.lateSlopeDbPerS).not.toBeNull();
		expect(Math.abs(-60 / estimate.lateSlopeDbPerS! / t60S - 1)).toBeLessThan(0.2);
		expect(estimate.converged).toBe(true);
	});

	it('a decay that never reaches the noise is truncated near the end of the record', () => {
		const x = exponentialNoiseDecay({ t60S: 1, durationS: 1.5, sampleRate: SAMPLE_RATE, seed: 5 });
		const estimate = estimateNoiseFloor(squared(x), SAMPLE_RATE);
		expect(estimate.crosspointIndex).toBeGreaterThan(0.8 * x.length);
		// Peak-to-noise is the decay's own depth here: far more than the 45 dB T30 needs.
		expect(-estimate.noiseDbRePeak).toBeGreaterThan(70);
	});

	it('pure noise has no usable decay: the peak-to-noise ratio stays low', () => {
		const gaussian = createSeededGaussian(9);
		const x = new Float64Array(SAMPLE_RATE).map(() => gaussian());
		const estimate = estimateNoiseFloor(squared(x), SAMPLE_RATE);
		// The peak of 48000 squared Gaussian samples is ~ 20 σ² (13 dB), never near the 20 dB EDT needs.
		expect(-estimate.noiseDbRePeak).toBeLessThan(18);
	});

	it('rejects a too short or silent input', () => {
		expect(() => estimateNoiseFloor(new Float64Array(8), SAMPLE_RATE)).toThrow(RangeError);
		expect(() => estimateNoiseFloor(new Float64Array(1000), SAMPLE_RATE)).toThrow(/silent/);
	});
});
