import { describe, expect, it } from 'vitest';
import { decayLevelDb, exponentialTailEnergy, schroederDecay } from '../../../src/lib/analysis/schroeder';
import { energyDecayRate } from '../../../src/lib/analysis/synthetic';

const SAMPLE_RATE = 48000;

/** p²(t) = e^(−k·t): the backward integral of an exponential is the same exponential (Schroeder, JASA 37(3), 1965). */
function exponentialEnergy(t60S: number, durationS: number): Float64Array {
	const k = energyDecayRate(t60S);
	return new Float64Array(Math.round(durationS * SAMPLE_RATE)).map((_, i) => Math.exp((-k * i) / SAMPLE_RATE));
}

describe('Schroeder backward integration', () => {
	it.each([0.3, 1.0, 2.0])('of an exponential cut at −40 dB, with the exponential tail added, is that exponential (T = %f s)', (t60S) => {
		const cutS = (40 / 60) * t60S;
		const squared = exponentialEnergy(t60S, cutS);
		const slopeDbPerS = -60 / t60S;
		const tail = exponentialTailEnergy(squared[squared.length - 1], slopeDbPerS, SAMPLE_RATE);
		const curve = schroederDecay(squared, squared.length, tail);
		// Expected level −60·t/T dB; 0.01 dB allows the sum-vs-integral difference of order k/(2·fs).
		for (let i = 0; i < curve.length; i += 97) {
			expect(Math.abs(decayLevelDb(curve[i]) - (slopeDbPerS * i) / SAMPLE_RATE)).toBeLessThan(0.01);
		}
	});

	it('without the tail, the truncated curve bends down at its end (what the compensation is for)', () => {
		const squared = exponentialEnergy(1, 0.5);
		const curve = schroederDecay(squared, squared.length);
		const last = curve.length - 1;
		// The exponential would be at −30 dB; the truncated sum drops far below.
		expect(decayLevelDb(curve[last]) - (-60 * last) / SAMPLE_RATE).toBeLessThan(-20);
	});

	it('truncation at an index ignores the energy after it', () => {
		const squared = new Float64Array([4, 3, 2, 1, 100, 100]);
		const curve = schroederDecay(squared, 4);
		// (10, 6, 3, 1) / 10; only division round-off.
		[1, 0.6, 0.3, 0.1].forEach((value, i) => expect(Math.abs(curve[i] - value)).toBeLessThan(1e-15));
		expect(curve).toHaveLength(4);
	});

	it('written into a given buffer: the same values, in its first values, and a short buffer is not used', () => {
		const squared = new Float64Array([4, 3, 2, 1, 100, 100]);
		const buffer = new Float64Array(6).fill(-1);
		const curve = schroederDecay(squared, 4, 0.5, buffer);
		expect(curve.buffer).toBe(buffer.buffer);
		expect(Array.from(curve)).toEqual(Array.from(schroederDecay(squared, 4, 0.5)));
		expect(Array.from(buffer.subarray(4))).toEqual([-1, -1]);
		const short = new Float64Array(3);
		expect(schroederDecay(squared, 4, 0, short).buffer).not.toBe(short.buffer);
	});

	it('the missing tail of P₁e^(−k(t−t₁)) is P₁/k (× fs in sample units), k = |slope|·ln10/10', () => {
		// T = 1 s: slope −60 dB/s, k = 6·ln10 = 13.8155 /s.
		expect(exponentialTailEnergy(2, -60, 1000)).toBeCloseTo((2 * 1000) / (6 * Math.LN10), 9);
	});

	it.each([
		() => schroederDecay(new Float64Array(4), 0),
		() => schroederDecay(new Float64Array(4), 5),
		() => schroederDecay(new Float64Array([1, 1]), 2, -1),
		() => schroederDecay(new Float64Array(4), 4),
		() => exponentialTailEnergy(1, 0, 48000),
		() => exponentialTailEnergy(1, 5, 48000)
	])('rejects bad input %#', (call) => {
		expect(call).toThrow(RangeError);
	});
});
