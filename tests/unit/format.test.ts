import { describe, expect, it } from 'vitest';
import {
	capitalise,
	formatArea,
	formatBand,
	formatCoefficient,
	formatCount,
	formatDb,
	formatHz,
	formatHzAxis,
	formatHzRange,
	formatList,
	formatMsRange,
	formatNumber,
	formatPercent,
	formatRange,
	formatRoomSize,
	formatRoomSizeBare,
	formatSampleRate,
	formatSeconds,
	formatSigned,
	formatVolume,
	MISSING,
	roundSignificant
} from '../../src/lib/format';

const MINUS = '\u2212';

describe('formatHz: three significant figures, kHz from 1 kHz after rounding', () => {
	// ISO 266 preferred frequencies: each is written with at most three significant figures.
	const nominal: [number, string, string][] = [
		[20, '20 Hz', '20'],
		[31.5, '31.5 Hz', '31.5'],
		[63, '63 Hz', '63'],
		[125, '125 Hz', '125'],
		[1000, '1 kHz', '1k'],
		[1250, '1.25 kHz', '1.25k'],
		[3150, '3.15 kHz', '3.15k'],
		[12500, '12.5 kHz', '12.5k'],
		[20000, '20 kHz', '20k']
	];
	it.each(nominal)('ISO 266 nominal %d Hz → %s / axis "%s"', (hz, text, axis) => {
		expect(formatHz(hz)).toBe(text);
		expect(formatHzAxis(hz)).toBe(axis);
	});

	const computed: [number, string][] = [
		[0, '0 Hz'],
		[0.5, '0.5 Hz'],
		[50.94, '50.9 Hz'],
		[125.893, '126 Hz'], // exact IEC 61260-1 centre of the 125 Hz band, 10^2.1
		[999.4, '999 Hz'],
		[999.5, '1 kHz'], // rounds up into the next unit: never "1000 Hz"
		[999.7, '1 kHz'],
		[1004.9, '1 kHz'],
		[1005, '1.01 kHz'],
		[1414.2, '1.41 kHz'],
		[3430, '3.43 kHz'],
		[11313.7, '11.3 kHz'],
		[123456, '123 kHz']
	];
	it.each(computed)('%d Hz → %s', (hz, text) => {
		expect(formatHz(hz)).toBe(text);
	});

	it.each([-1, -0.001, Number.NaN, Infinity])('refuses %d', (hz) => {
		expect(() => formatHz(hz)).toThrow(RangeError);
		expect(() => formatHzAxis(hz)).toThrow(RangeError);
	});

	it('names the broadband curve and bands by their centre', () => {
		expect(formatBand('broadband')).toBe('Broadband');
		expect(formatBand(2500)).toBe('2.5 kHz');
	});
});

describe('formatHzRange: the unit written once when both ends share it', () => {
	const cases: [number, number, string][] = [
		[42, 48, '42–48 Hz'],
		[31.5, 63, '31.5–63 Hz'],
		[2000, 4000, '2–4 kHz'],
		[800, 1250, '800 Hz–1.25 kHz'],
		[707.1, 999.6, '707 Hz–1 kHz'] // the upper end's unit follows its rounding
	];
	it.each(cases)('%d–%d → %s', (lo, hi, text) => {
		expect(formatHzRange(lo, hi)).toBe(text);
	});
});

describe('formatSampleRate: exact, not rounded', () => {
	it.each([
		[44100, '44.1 kHz'],
		[48000, '48 kHz'],
		[176400, '176.4 kHz'],
		[192000, '192 kHz']
	])('%d → %s', (hz, text) => {
		expect(formatSampleRate(hz)).toBe(text);
	});

	it.each([0, -48000, 44100.5])('refuses %d', (hz) => {
		expect(() => formatSampleRate(hz)).toThrow(RangeError);
	});
});

describe('formatSeconds (2 decimals) and formatDb (1 decimal)', () => {
	const seconds: [number | null, string][] = [
		[0.476, '0.48'],
		[1.2, '1.20'],
		[0, '0.00'],
		[-0.001, '0.00'], // no "−0.00"
		[-0.256, `${MINUS}0.26`],
		[null, MISSING],
		[Number.NaN, MISSING]
	];
	it.each(seconds)('seconds %d → %s', (value, text) => {
		expect(formatSeconds(value)).toBe(text);
	});

	const decibels: [number | null | undefined, string][] = [
		[3.14, '3.1'],
		[-0.04, '0.0'],
		[-6.25, `${MINUS}6.3`], // −6.25 is exact in binary; toFixed rounds the tie away from zero
		[0, '0.0'],
		[undefined, MISSING]
	];
	it.each(decibels)('decibels %d → %s', (value, text) => {
		expect(formatDb(value)).toBe(text);
	});
});

describe('formatNumber and formatSigned', () => {
	const numbers: [number | null, number, string][] = [
		[1.234, 2, '1.23'],
		[-6.15, 1, `${MINUS}6.2`], // toFixed rounds the binary value of −6.15 (−6.1500000000000003553) away from zero
		[-0, 0, '0'],
		[42, 0, '42'],
		[null, 1, MISSING],
		[Number.NEGATIVE_INFINITY, 1, MISSING]
	];
	it.each(numbers)('formatNumber(%d, %i) → %s', (value, decimals, text) => {
		expect(formatNumber(value, decimals)).toBe(text);
	});

	it('rejects a bad number of decimals', () => {
		expect(() => formatNumber(1, -1)).toThrow(RangeError);
		expect(() => formatNumber(1, 1.5)).toThrow(RangeError);
	});

	const signed: [number | null, number, string][] = [
		[0.123, 2, '+0.12'],
		[-0.321, 2, `${MINUS}0.32`],
		[0.004, 2, '0.00'], // rounds to nothing: no sign, no direction
		[-0.004, 2, '0.00'],
		[0, 0, '0'],
		[-47.3, 0, `${MINUS}47`],
		[12.5, 0, '+13'],
		[null, 2, MISSING]
	];
	it.each(signed)('formatSigned(%d, %i) → %s', (value, decimals, text) => {
		expect(formatSigned(value, decimals)).toBe(text);
	});
});

describe('percent and counts', () => {
	it.each([
		[0.3333, '33'],
		[-0.124, `${MINUS}12`],
		[0, '0'],
		[null, MISSING]
	])('formatPercent(%d) → %s', (fraction, text) => {
		expect(formatPercent(fraction)).toBe(text);
	});

	it.each([
		[5, '5'],
		[4.5, '4.5'],
		[2.96, '3'],
		[0, '0'],
		[null, MISSING]
	])('formatCount(%d) → %s', (value, text) => {
		expect(formatCount(value)).toBe(text);
	});
});

describe('ranges, lists and capitals', () => {
	it('joins two ends with an en dash, each written by the given format', () => {
		expect(formatRange(0.158, 0.3594, formatSeconds)).toBe('0.16–0.36');
		expect(formatRange(-3, 3, formatDb)).toBe(`${MINUS}3.0–3.0`);
	});

	it.each([
		[20, 120, '20–120 ms'],
		[35, null, 'from 35 ms'],
		[null, 80, 'up to 80 ms'],
		[null, null, MISSING]
	] as const)('formatMsRange(%s, %s) → %s', (lo, hi, text) => {
		expect(formatMsRange(lo, hi)).toBe(text);
	});

	it.each([
		[[], ''],
		[['P4'], 'P4'],
		[['P4', 'P6'], 'P4 and P6'],
		[['63 Hz', '125 Hz', '8 kHz'], '63 Hz, 125 Hz and 8 kHz']
	])('formatList(%j) → %s', (items, text) => {
		expect(formatList(items)).toBe(text);
	});

	it('capitalises the first letter only', () => {
		expect(capitalise('within target')).toBe('Within target');
		expect(capitalise('')).toBe('');
	});
});

describe('roundSignificant', () => {
	// Hand-rounded values: three significant figures.
	const cases = [
		[42.37, 42.4],
		[1234.5, 1230],
		[0.012345, 0.0123],
		[-987.6, -988],
		[999.6, 1000],
		[0, 0]
	] as const;
	it.each(cases)('%d → %d', (value, expected) => {
		expect(roundSignificant(value, 3)).toBe(expected);
	});

	it('keeps more figures when asked, and rejects what it cannot round', () => {
		expect(roundSignificant(31.6227766, 5)).toBe(31.623);
		expect(() => roundSignificant(Number.NaN)).toThrow(RangeError);
		expect(() => roundSignificant(1, 0)).toThrow(RangeError);
	});
});

describe('room geometry and coefficients', () => {
	it('writes a room to the centimetre, length × width × height', () => {
		expect(formatRoomSize({ lengthM: 5.2, widthM: 3.805, heightM: 2.6 })).toBe('5.20 × 3.81 × 2.60 m');
		expect(formatRoomSizeBare({ lengthM: 12, widthM: 7.5, heightM: 3 })).toBe('12.00 × 7.50 × 3.00');
	});

	it('writes volumes and areas to a tenth and coefficients to two decimals', () => {
		expect(formatVolume(51.44)).toBe('51.4 m³');
		expect(formatArea(38.25)).toBe('38.3 m²');
		// Two decimals, as absorption coefficients are tabulated (ISO 354 reports αs to two decimals; from memory).
		expect(formatCoefficient(0.347)).toBe('0.35');
		expect(formatCoefficient(1)).toBe('1.00');
	});
});
