import { describe, expect, it } from 'vitest';
import { energyParameters } from '../../../src/lib/analysis/energy';
import { energyDecayRate } from '../../../src/lib/analysis/synthetic';

const SAMPLE_RATE = 48000;

/**
 * Closed forms for p² ∝ e^(−kt), k = 6·ln10/T (ISO 3382-1:2009 definitions applied to it; the method of Cabrera, Xun &
 * Guski, Acoustics Australia 44:369, 2016): C_te = 10·lg(e^(k·te) − 1), D50 = 1 − e^(−0.05k), Ts = 1/k.
 */
const CLOSED_FORM = [
	{ t60S: 0.3, c50Db: 9.542, c80Db: 15.89, d50: 0.9, tsMs: 21.71 },
	{ t60S: 0.5, c50Db: 4.744, c80Db: 9.096, d50: 0.7488, tsMs: 36.19 },
	{ t60S: 1.0, c50Db: -0.021, c80Db: 3.053, d50: 0.4988, tsMs: 72.38 },
	{ t60S: 2.0, c50Db: -3.845, c80Db: -1.321, d50: 0.2921, tsMs: 144.76 }
];

function exponentialEnergy(t60S: number, durationS: number): Float64Array {
	const k = energyDecayRate(t60S);
	return new Float64Array(Math.round(durationS * SAMPLE_RATE)).map((_, i) => Math.exp((-k * i) / SAMPLE_RATE));
}

// The table is rounded to 3 decimals (dB), 4 (D50), 2 (ms); summing samples instead of integrating
// adds up to k/fs relative (≈ 1e-3 at T = 0.3 s, 48 kHz: 0.004 dB).
const TOLERANCE = { db: 0.005, d50: 0.0003, ms: 0.03 };

describe('energy parameters of an ideal exponential decay (closed forms, ISO 3382-1:2009 definitions)', () => {
	it.each(CLOSED_FORM)('T = $t60S s, integrated to −120 dB, no tail', ({ t60S, c50Db, c80Db, d50, tsMs }) => {
		const squared = exponentialEnergy(t60S, 2 * t60S);
		const result = energyParameters(squared, SAMPLE_RATE, squared.length, null);
		expect(Math.abs(result.c50Db - c50Db)).toBeLessThan(TOLERANCE.db);
		expect(Math.abs(result.c80Db - c80Db)).toBeLessThan(TOLERANCE.db);
		expect(Math.abs(result.d50 - d50)).toBeLessThan(TOLERANCE.d50);
		expect(Math.abs(result.centreTimeMs - tsMs)).toBeLessThan(TOLERANCE.ms);
	});

	it.each(CLOSED_FORM)('T = $t60S s, truncated at 30 ms with the exponential tail: same values', ({ t60S, c50Db, c80Db, d50, tsMs }) => {
		const squared = exponentialEnergy(t60S, 1);
		const end = Math.round(0.03 * SAMPLE_RATE);
		const tail = { powerAtTruncation: squared[end], decayRatePerS: energyDecayRate(t60S) };
		const result = energyParameters(squared, SAMPLE_RATE, end, tail);
		expect(Math.abs(result.c50Db - c50Db)).toBeLessThan(TOLERANCE.db);
		expect(Math.abs(result.c80Db - c80Db)).toBeLessThan(TOLERANCE.db);
		expect(Math.abs(result.d50 - d50)).toBeLessThan(TOLERANCE.d50);
		expect(Math.abs(result.centreTimeMs - tsMs)).toBeLessThan(TOLERANCE.ms);
	});

	it('a truncation without the tail loses late energy: C80 comes out too high', () => {
		const squared = exponentialEnergy(1, 1);
		// Cut at 150 ms (−9 dB): C80 = 10·lg((1 − e^(−0.08k)) / (e^(−0.08k) − e^(−0.15k))) = 5.14 dB instead of 3.05.
		const result = energyParameters(squared, SAMPLE_RATE, Math.round(0.15 * SAMPLE_RATE), null);
		expect(result.c80Db - 3.053).toBeGreaterThan(1.5);
	});

	it('C50 and D50 agree with each other: C50 = 10·lg(D50/(1 − D50)) (ISO 3382-1:2009)', () => {
		const result = energyParameters(exponentialEnergy(0.7, 1.5), SAMPLE_RATE, 72000, null);
		expect(result.c50Db).toBeCloseTo(10 * Math.log10(result.d50 / (1 - result.d50)), 10);
	});

	it.each([
		{ end: 0, tail: null },
		{ end: 101, tail: null },
		{ end: 50, tail: { powerAtTruncation: 1, decayRatePerS: 0 } },
		{ end: 50, tail: { powerAtTruncation: -1, decayRatePerS: 10 } }
	])('rejects end $end with tail $tail', ({ end, tail }) => {
		expect(() => energyParameters(new Float64Array(100).fill(1), SAMPLE_RATE, end, tail)).toThrow(RangeError);
	});
});
