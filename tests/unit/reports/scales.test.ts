import { describe, expect, it } from 'vitest';
import { extent, gridRange, linearScale, logScale } from '../../../src/lib/server/reports/scales';

// Positions are compared to 1e-9 pt: the only error is double rounding in log().
const POSITION_TOLERANCE = 1e-9;

describe('logScale', () => {
	const x = logScale([20, 20000], [0, 300]);

	it('maps the ends of the domain to the ends of the range', () => {
		expect(x(20)).toBeCloseTo(0, 9);
		expect(x(20000)).toBeCloseTo(300, 9);
	});

	it('places f at range·ln(f/f0)/ln(f1/f0) (log-frequency axis)', () => {
		for (const f of [31.5, 63, 1000, 16000]) {
			expect(Math.abs(x(f) - (300 * Math.log(f / 20)) / Math.log(1000))).toBeLessThan(POSITION_TOLERANCE);
		}
	});

	it('gives every octave the same length: 300 pt / log2(1000) ≈ 30.1 pt', () => {
		const octave = 300 / Math.log2(1000);
		for (const f of [31.25, 125, 1000, 8000]) expect(Math.abs(x(2 * f) - x(f) - octave)).toBeLessThan(POSITION_TOLERANCE);
	});

	it('rejects domains that are not positive and increasing', () => {
		expect(() => logScale([0, 100], [0, 1])).toThrow(RangeError);
		expect(() => logScale([100, 100], [0, 1])).toThrow(RangeError);
		expect(() => logScale([200, 100], [0, 1])).toThrow(RangeError);
	});
});

describe('linearScale', () => {
	it('maps dB onto a y axis that grows downwards', () => {
		const y = linearScale([60, 100], [200, 0]);
		const cases: [number, number][] = [
			[60, 200],
			[100, 0],
			[80, 100],
			[110, -50] // outside the domain extrapolates (the plot clips it)
		];
		for (const [value, expected] of cases) expect(y(value)).toBeCloseTo(expected, 9);
	});

	it('rejects an empty domain', () => {
		expect(() => linearScale([1, 1], [0, 1])).toThrow(RangeError);
	});
});

describe('extent', () => {
	it('ignores nulls and non-finite values', () => {
		expect(extent([[3, null, -2], [Number.NEGATIVE_INFINITY, 7, Number.NaN]])).toEqual([-2, 7]);
	});
	it('is null when nothing is finite', () => {
		expect(extent([[null], [Number.NaN], []])).toBeNull();
	});
});

describe('gridRange', () => {
	// Hand-worked cases of the rule: widen to the 10 dB grid, at least 30 dB, at most 60 dB keeping the top.
	const cases: { data: [number, number]; expected: [number, number] }[] = [
		{ data: [-23.4, 4.2], expected: [-30, 10] },
		{ data: [71.5, 79.2], expected: [60, 90] }, // 10 dB of data grows to 30 dB
		{ data: [70, 80], expected: [60, 90] }, // grid-aligned data
		{ data: [-5, 91.7], expected: [40, 100] }, // 110 dB of data: the deep end is cut
		{ data: [78, 78], expected: [60, 90] } // 70…80 grows at the top, then the bottom
	];
	it.each(cases)('$data → $expected', ({ data, expected }) => {
		expect(gridRange(data, 10, 30, 60)).toEqual(expected);
	});

	it('rejects a span rule that cannot hold', () => {
		expect(() => gridRange([0, 1], 10, 5, 60)).toThrow(RangeError);
		expect(() => gridRange([0, 1], 10, 30, 20)).toThrow(RangeError);
	});
});
