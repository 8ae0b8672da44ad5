import { describe, expect, it } from 'vitest';
import {
	bs1116MeanTime,
	bs1116Target,
	din18041Bands,
	din18041Target,
	judgeAgainstTarget,
	type TargetBand
} from '../../../src/lib/analysis/targets';

describe('ITU-R BS.1116-3 target', () => {
	// Tm = 0.25·(V/100 m³)^(1/3) s (ITU-R BS.1116-3, formula from memory; values computed from it): values given to 1 ms,
	// hence 0.6 ms tolerance.
	it.each([
		{ volumeM3: 50, expected: 0.198 },
		{ volumeM3: 100, expected: 0.25 },
		{ volumeM3: 200, expected: 0.315 }
	])('V = $volumeM3 m³ → Tm = $expected s', ({ volumeM3, expected }) => {
		expect(Math.abs(bs1116MeanTime(volumeM3) - expected)).toBeLessThan(6e-4);
		const [band] = bs1116Target(volumeM3, [1000]);
		expect(Math.abs(band.targetS - expected)).toBeLessThan(6e-4);
	});

	// Mask (ITU-R BS.1116-3, from memory, mask shape): ±0.05 s from 200 Hz to 4 kHz; upper limit
	// +0.3 s at 63 Hz, lower −0.1 s at 8 kHz, linear in log frequency between; outside the
	// corners the limits stay. The log-midpoint of 63 and 200 Hz gets +0.175 s, of 4 and 8 kHz
	// −0.075 s (linear interpolation). 1e-9 s round-off.
	const tm = 0.25;
	it.each([
		{ centerHz: 31.5, lower: -0.05, upper: 0.3 },
		{ centerHz: 63, lower: -0.05, upper: 0.3 },
		{ centerHz: Math.sqrt(63 * 200), lower: -0.05, upper: 0.175 },
		{ centerHz: 200, lower: -0.05, upper: 0.05 },
		{ centerHz: 1000, lower: -0.05, upper: 0.05 },
		{ centerHz: 4000, lower: -0.05, upper: 0.05 },
		{ centerHz: Math.sqrt(4000 * 8000), lower: -0.075, upper: 0.05 },
		{ centerHz: 8000, lower: -0.1, upper: 0.05 },
		{ centerHz: 16000, lower: -0.1, upper: 0.05 }
	])('mask at $centerHz Hz: $lower … +$upper s', ({ centerHz, lower, upper }) => {
		const [band] = bs1116Target(100, [centerHz]);
		expect(band.centerHz).toBe(centerHz);
		expect(Math.abs(band.lowerS - (tm + lower))).toBeLessThan(1e-9);
		expect(Math.abs(band.upperS - (tm + upper))).toBeLessThan(1e-9);
	});

	it.each([
		{ name: 'zero volume', call: () => bs1116Target(0, [1000]), message: /volumeM3/ },
		{ name: 'negative centre', call: () => bs1116Target(100, [-125]), message: /band centre 0/ }
	])('rejects $name', ({ call, message }) => {
		expect(call).toThrow(message);
	});
});

describe('DIN 18041:2016 target', () => {
	// T_soll formulas A1–A5 (DIN 18041:2016, checked against the standard) at V = 200 m³, values computed from them to
	// 0.01 s, hence 0.006 s tolerance.
	it.each([
		{ use: 'music' as const, expected: 1.11 },
		{ use: 'speech' as const, expected: 0.71 },
		{ use: 'teaching' as const, expected: 0.57 },
		{ use: 'inclusive-teaching' as const, expected: 0.46 },
		{ use: 'sport' as const, expected: 0.73 }
	])('$use at 200 m³ → $expected s', ({ use, expected }) => {
		expect(Math.abs(din18041Target(200, use) - expected)).toBeLessThan(0.006);
	});

	it('grows with lg V as the formula says (speech: +0.37 s per decade)', () => {
		expect(Math.abs(din18041Target(2000, 'speech') - din18041Target(200, 'speech') - 0.37)).toBeLessThan(1e-9);
	});

	it('tolerates 0.8–1.2·T_soll from 250 Hz to 2 kHz only (from memory)', () => {
		const bands = din18041Bands(200, 'speech', [125, 250, 500, 1000, 2000, 4000]);
		expect(bands.map((b) => b.centerHz)).toEqual([250, 500, 1000, 2000]);
		const target = din18041Target(200, 'speech');
		for (const band of bands) {
			expect(band.lowerS).toBeCloseTo(0.8 * target, 12);
			expect(band.upperS).toBeCloseTo(1.2 * target, 12);
		}
	});

	it.each([
		{ name: 'unknown use', call: () => din18041Target(200, 'cinema' as 'music'), message: /unknown DIN 18041 use/ },
		{ name: 'zero volume', call: () => din18041Target(0, 'music'), message: /volumeM3/ },
		{ name: 'volume too small for sport', call: () => din18041Target(10, 'sport'), message: /too small/ }
	])('rejects $name', ({ call, message }) => {
		expect(call).toThrow(message);
	});
});

describe('judgeAgainstTarget', () => {
	const target: TargetBand[] = [125, 250, 500, 1000, 2000].map((centerHz) => ({
		centerHz,
		targetS: 0.3,
		lowerS: 0.25,
		upperS: 0.35
	}));

	it('gives inside / above / below / unknown per target band, matching exact to nominal centres', () => {
		const measured = [
			{ centerHz: 125.893, valueS: 0.5 }, // exact octave centre of 125 Hz (IEC 61260-1)
			{ centerHz: 251.189, valueS: 0.3 },
			{ centerHz: 501.187, valueS: 0.2 },
			{ centerHz: 1000, valueS: null }
			// 2000 Hz not measured
		];
		const verdicts = judgeAgainstTarget(measured, target);
		expect(verdicts.map((v) => v.verdict)).toEqual(['above', 'inside', 'below', 'unknown', 'unknown']);
		expect(verdicts.map((v) => v.measuredS)).toEqual([0.5, 0.3, 0.2, null, null]);
		expect(verdicts[0].target).toBe(target[0]);
	});

	it.each([
		{ valueS: 0.35, verdict: 'inside' }, // limits belong to the band
		{ valueS: 0.25, verdict: 'inside' },
		{ valueS: 0.3501, verdict: 'above' },
		{ valueS: 0.2499, verdict: 'below' },
		{ valueS: Number.NaN, verdict: 'unknown' }
	])('$valueS s against 0.25…0.35 s → $verdict', ({ valueS, verdict }) => {
		expect(judgeAgainstTarget([{ centerHz: 500, valueS }], target)[2].verdict).toBe(verdict);
	});

	it('does not mistake a neighbouring third-octave band for the target band', () => {
		// 630 Hz is a third above 500 Hz: not the same band.
		expect(judgeAgainstTarget([{ centerHz: 630, valueS: 0.3 }], target)[2].verdict).toBe('unknown');
	});
});
