import { describe, expect, it } from 'vitest';
import { decimateEvenly, decimateKeepingPeaks, roundTo } from '../../../src/lib/analysis/curves';

describe('chart decimation', () => {
	it('evenly spaced points keep the first and last sample and their times', () => {
		const values = new Float64Array(1001).map((_, i) => -i / 10);
		const { timesS, values: kept } = decimateEvenly(values, 1000, 11);
		expect(timesS).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1]);
		expect(kept[10]).toBe(-100);
	});

	it('a short curve is returned whole', () => {
		expect(decimateEvenly(new Float64Array([3, 2, 1]), 10, 400).values).toEqual([3, 2, 1]);
	});

	it('max-decimation keeps every isolated peak at its own position', () => {
		const values = new Float64Array(10000).fill(-60);
		const peaks = [17, 2500, 2503, 9999];
		for (const [k, at] of peaks.entries()) values[at] = -k;
		const { indices, values: kept } = decimateKeepingPeaks(values, 100);
		expect(indices).toHaveLength(100);
		// 2500 and 2503 share a bucket: the larger (−1 dB at 2500) survives.
		for (const at of [17, 2500, 9999]) expect(indices).toContain(at);
		expect(kept[indices.indexOf(2500)]).toBe(-1);
		expect(indices.every((index, i) => i === 0 || index > indices[i - 1])).toBe(true);
	});

	it.each([
		{ value: 1.23456, decimals: 2, expected: 1.23 },
		{ value: -0.001, decimals: 2, expected: 0 },
		{ value: 2.5e-5, decimals: 4, expected: 0 }
	])('roundTo($value, $decimals) = $expected, never −0', ({ value, decimals, expected }) => {
		expect(Object.is(roundTo(value, decimals), expected)).toBe(true);
	});

	it('rejects impossible point counts', () => {
		expect(() => decimateEvenly(new Float64Array(5), 1, 1)).toThrow(RangeError);
		expect(() => decimateKeepingPeaks(new Float64Array(5), 0)).toThrow(RangeError);
	});
});
