import { describe, expect, it } from 'vitest';
import { formatNumber, MISSING, roundSignificant } from '../../../src/lib/charts/format';

describe('formatNumber', () => {
	const cases: { value: number | null; decimals: number; expected: string }[] = [
		{ value: 1.234, decimals: 2, expected: '1.23' },
		{ value: -6.15, decimals: 1, expected: '\u22126.2' }, // toFixed rounds the binary value of −6.15 (−6.1500000000000003553) away from zero
		{ value: -0.04, decimals: 1, expected: '0.0' }, // no "−0.0" in a table
		{ value: -0, decimals: 0, expected: '0' },
		{ value: 42, decimals: 0, expected: '42' },
		{ value: null, decimals: 1, expected: MISSING },
		{ value: Number.NaN, decimals: 1, expected: MISSING },
		{ value: Number.NEGATIVE_INFINITY, decimals: 1, expected: MISSING }
	];
	it.each(cases)('$value with $decimals decimals → $expected', ({ value, decimals, expected }) => {
		expect(formatNumber(value, decimals)).toBe(expected);
	});

	it('rejects a bad number of decimals', () => {
		expect(() => formatNumber(1, -1)).toThrow(RangeError);
		expect(() => formatNumber(1, 1.5)).toThrow(RangeError);
	});
});

describe('roundSignificant', () => {
	// Hand-rounded values: three significant figures.
	const cases = [
		[42.37, 42.4],
		[48.912, 48.9],
		[1234.5, 1230],
		[0.012345, 0.0123],
		[-987.6, -988],
		[999.6, 1000],
		[0, 0]
	] as const;
	it.each(cases)('%d → %d', (value, expected) => {
		expect(roundSignificant(value, 3)).toBe(expected);
	});

	it('keeps more figures when asked', () => {
		expect(roundSignificant(31.6227766, 5)).toBe(31.623);
	});

	it('rejects what it cannot round', () => {
		expect(() => roundSignificant(Number.NaN)).toThrow(RangeError);
		expect(() => roundSignificant(1, 0)).toThrow(RangeError);
	});
});
