import { describe, expect, it } from 'vitest';
import { alignSeries, interpolateLogFrequency, nearestIndex } from '../../../src/lib/charts/align';
import { runPython } from './helpers/python';

describe('alignSeries', () => {
	it('puts series with different grids on the union of their x values', () => {
		const aligned = alignSeries([
			{ x: [100, 200, 400], y: [1, 2, 3] },
			{ x: [150, 200], y: [5, null] }
		]);
		expect(aligned.x).toEqual([100, 150, 200, 400]);
		expect(aligned.ys).toEqual([
			[1, null, 2, 3],
			[null, 5, null, null]
		]);
	});

	it('keeps series that share one grid on it, as the union would, without sharing their arrays', () => {
		const grid = [20, 40, 80, 160];
		const series = [
			{ x: grid, y: [1, Number.POSITIVE_INFINITY, 3, 4] },
			{ x: [...grid], y: [5, 6, null, 8] }
		];
		const aligned = alignSeries(series);
		expect(aligned).toEqual({ x: grid, ys: [[1, null, 3, 4], [5, 6, null, 8]] });
		expect(aligned.x).not.toBe(grid);
		expect(aligned.ys[1]).not.toBe(series[1].y);
		// A grid out of order, or with a repeat, still goes through the union.
		expect(alignSeries([{ x: [40, 20], y: [2, 1] }])).toEqual({ x: [20, 40], ys: [[1, 2]] });
		expect(alignSeries([{ x: [20, 20, 40], y: [1, 2, 3] }])).toEqual({ x: [20, 40], ys: [[2, 3]] });
	});

	it('turns non-finite values into gaps', () => {
		expect(alignSeries([{ x: [1, 2], y: [Number.NaN, 4] }]).ys).toEqual([[null, 4]]);
	});

	it('rejects mismatched or non-finite input', () => {
		expect(() => alignSeries([{ x: [1, 2], y: [1] }])).toThrow(/2 x values and 1 y values/);
		expect(() => alignSeries([{ x: [1, Number.NaN], y: [1, 2] }])).toThrow(/x\[1\]/);
	});
});

describe('interpolateLogFrequency', () => {
	it('matches numpy.interp on log10 frequency (straight lines on a log axis)', () => {
		const freqHz = [20, 31.5, 50, 80, 125, 200, 315, 500, 1000, 4000, 16000];
		const values = freqHz.map((f, i) => Math.sin(i) * 10 - Math.log10(f));
		const at = [20, 25, 40, 63, 100, 160, 250, 400, 707, 2000, 8000, 16000];
		const reference = runPython<number[]>(
			'import json, sys, numpy as np\nd = json.load(sys.stdin)\nprint(json.dumps(np.interp(np.log10(d["at"]), np.log10(d["f"]), d["v"]).tolist()))',
			{ f: freqHz, v: values, at }
		);
		// 1e-9 dB: both are the same straight-line formula in double precision.
		at.forEach((f, i) => expect(interpolateLogFrequency(freqHz, values, f)).toBeCloseTo(reference[i], 9));
	});

	it('gives nothing outside the curve or next to a gap', () => {
		expect(interpolateLogFrequency([100, 200], [1, 2], 99)).toBeNull();
		expect(interpolateLogFrequency([100, 200], [1, 2], 201)).toBeNull();
		expect(interpolateLogFrequency([100, 200, 400], [1, null, 3], 150)).toBeNull();
		expect(interpolateLogFrequency([100, 200, 400], [1, null, 3], 400)).toBe(3);
		expect(interpolateLogFrequency([], [], 100)).toBeNull();
		expect(() => interpolateLogFrequency([1, 2], [1], 1)).toThrow(RangeError);
	});
});

describe('nearestIndex', () => {
	it('measures distance linearly or in ratio', () => {
		// 500 is 400 from 100 but 500 from 1000; in ratio it is 5× from 100 and 2× from 1000.
		expect(nearestIndex([10, 100, 1000], 500)).toBe(1);
		expect(nearestIndex([10, 100, 1000], 500, true)).toBe(2);
		expect(nearestIndex([0, 10, 20], -5)).toBe(0);
		expect(() => nearestIndex([], 1)).toThrow(RangeError);
	});
});
