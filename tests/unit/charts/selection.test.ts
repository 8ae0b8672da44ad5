import { describe, expect, it } from 'vitest';
import { selectedRange } from '../../../src/lib/charts/selection';

describe('selectedRange', () => {
	// Three significant figures, rounded by hand.
	const cases = [
		{ a: 42.37, b: 48.912, expected: { fLoHz: 42.4, fHiHz: 48.9 }, why: 'drag left to right' },
		{ a: 48.912, b: 42.37, expected: { fLoHz: 42.4, fHiHz: 48.9 }, why: 'drag right to left gives the same range' },
		{ a: 1987.4, b: 4123.9, expected: { fLoHz: 1990, fHiHz: 4120 }, why: 'kilohertz values keep three figures' },
		{ a: 10, b: 30, limits: { fLoHz: 20, fHiHz: 20000 }, expected: { fLoHz: 20, fHiHz: 30 }, why: 'clipped to the axis' },
		{ a: 100.01, b: 100.04, expected: null, why: 'collapses to one frequency after rounding' },
		{ a: 5, b: 8, limits: { fLoHz: 20, fHiHz: 20000 }, expected: null, why: 'entirely off the axis' },
		{ a: Number.NaN, b: 100, expected: null, why: 'an end that is not a number' },
		{ a: -10, b: 100, expected: null, why: 'a negative frequency' }
	];
	it.each(cases)('$why', ({ a, b, limits, expected }) => {
		expect(selectedRange(a, b, limits)).toEqual(expected);
	});
});
