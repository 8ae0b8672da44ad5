import { describe, expect, it } from 'vitest';
import { formatCount, formatDecibels, formatFrequency, formatPercent, formatSeconds, joinList } from '../../../src/lib/results/format';

describe('formatFrequency: band centres as ISO 266 writes them', () => {
	// Nominal frequencies of ISO 266:1997 (preferred frequencies), in Hz below 1 kHz and kHz from there.
	it.each([
		[31.5, '31.5 Hz'],
		[63, '63 Hz'],
		[125, '125 Hz'],
		[125.893, '125.9 Hz'], // an exact IEC 61260-1 centre keeps one decimal
		[1000, '1 kHz'],
		[1250, '1.25 kHz'],
		[3150, '3.15 kHz'],
		[12500, '12.5 kHz']
	])('%s → %s', (hz, text) => {
		expect(formatFrequency(hz)).toBe(text);
	});

	it.each([0, -5, Number.NaN, Infinity])('refuses %s', (hz) => {
		expect(() => formatFrequency(hz)).toThrow(RangeError);
	});
});

describe('rounding for sentences: s to 2 decimals, dB to 1, % to whole numbers', () => {
	it.each([
		[formatSeconds, 0.476, '0.48'],
		[formatSeconds, -0.001, '0.00'], // no "-0.00"
		[formatDecibels, 3.14, '3.1'],
		[formatDecibels, -0.04, '0.0'],
		[formatPercent, 0.3333, '33'],
		[formatCount, 5, '5'],
		[formatCount, 4.5, '4.5'],
		[formatCount, 2.96, '3']
	] as const)('%o(%s) → %s', (format, value, text) => {
		expect(format(value)).toBe(text);
	});

	it.each([
		[[], ''],
		[['P4'], 'P4'],
		[['P4', 'P6'], 'P4 and P6'],
		[['63 Hz', '125 Hz', '8 kHz'], '63 Hz, 125 Hz and 8 kHz']
	])('joinList(%j) → %s', (items, text) => {
		expect(joinList(items)).toBe(text);
	});
});
