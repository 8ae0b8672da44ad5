import { describe, expect, it } from 'vitest';
import { formatFeetAndInches, formatInches, formatLength, formatMillimetres, inchesToMm, mmToInches, parseLength } from '../../../src/lib/treatment/units';

// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
const IN = 25.4;

/** Nearest sixteenth from the definition, written independently of the module. */
function nearestSixteenth(mm: number): string {
	const sixteenths = Math.round((mm / IN) * 16);
	const whole = Math.floor(sixteenths / 16);
	let num = sixteenths % 16;
	let den = 16;
	while (num > 0 && num % 2 === 0) {
		num /= 2;
		den /= 2;
	}
	if (num === 0) return `${whole}″`;
	return whole === 0 ? `${num}/${den}″` : `${whole} ${num}/${den}″`;
}

describe('mm ⇄ inches', () => {
	it('uses 25.4 mm per inch exactly', () => {
		expect(inchesToMm(1)).toBe(25.4);
		expect(mmToInches(254)).toBeCloseTo(10, 12);
	});

	it.each([
		[196, '7 11/16″'], // 7.7165″: 7 11/16 (7.6875) is nearer than 7 3/4 (7.75)
		[12.7, '1/2″'],
		[304.8, '12″'],
		[49, '1 15/16″'],
		[98, '3 7/8″'],
		[1.5, '1/16″'],
		[0.4, '0″'],
		[303.6, '11 15/16″'],
		[304.4, '12″'] // 11.984″ rounds up to a whole inch
	])('%f mm → %s', (mm, expected) => {
		expect(formatLength(mm, 'in')).toBe(expected);
		expect(formatLength(mm, 'in')).toBe(nearestSixteenth(mm));
	});

	it('formats millimetres rounded to whole mm, with a real minus sign', () => {
		expect(formatLength(196.04, 'mm')).toBe('196 mm');
		expect(formatMillimetres(48.99)).toBe('49 mm');
		expect(formatMillimetres(-3)).toBe('−3 mm');
		expect(formatMillimetres(12.345, 1)).toBe('12.3 mm');
		expect(formatInches(-0.5)).toBe('−1/2″');
	});

	it('rejects non-finite lengths', () => {
		expect(() => formatLength(Number.NaN, 'mm')).toThrow(/cannot format/);
		expect(() => formatInches(Infinity)).toThrow(/cannot format/);
	});
});

describe('parseLength', () => {
	it.each([
		['196mm', 196],
		['196 mm', 196],
		['19.6 cm', 196],
		['0.196 m', 196],
		['7.75in', 7.75 * IN],
		['7.75 inches', 7.75 * IN],
		['7 3/4', 7.75 * IN],
		['7-3/4″', 7.75 * IN],
		['7 3/4"', 7.75 * IN],
		['1/2', 12.7],
		['3/8 in', 0.375 * IN],
		['12', 12],
		['  42.5  ', 42.5],
		['19,6 cm', 196],
		['0', 0]
	])('"%s" → %f mm', (input, mm) => {
		expect(parseLength(input)).toBeCloseTo(mm, 9);
	});

	it('a bare number takes the default unit', () => {
		expect(parseLength('12', 'in')).toBeCloseTo(304.8, 9);
		expect(parseLength('12', 'mm')).toBe(12);
	});

	it.each([
		['', /enter a length/],
		['   ', /enter a length/],
		['abc', /not a length/],
		['12 yd', /not a length/],
		['-5 mm', /negative/],
		['7 3/0', /zero denominator/],
		['1/0', /zero denominator/],
		['7 5/4', /below 1/],
		['7.5 1/2', /whole number before the fraction/],
		['3/4 mm', /fractions are for inches/],
		['1.2.3', /not a length/]
	])('"%s" is refused', (input, message) => {
		expect(() => parseLength(input)).toThrow(message);
	});

	it('round trip: formatting to 1/16″ and parsing back stays within 1/32″ (half a step)', () => {
		for (let mm = 0; mm <= 600; mm += 7.3) {
			const back = parseLength(formatLength(mm, 'in'));
			expect(Math.abs(back - mm)).toBeLessThanOrEqual(IN / 32 + 1e-9);
		}
	});
});

// Feet and inches at room scale. 1 ft = 12 in = 304.8 mm exactly: the international yard and
// pound agreement (1959) fixed 1 yd = 0.9144 m, so 1 in = 25.4 mm; NIST SP 811 (2008), Appendix B
// lists foot = 3.048 E−01 m and inch = 2.54 E−02 m as exact.
const FT = 12 * IN;

describe('parseLength with feet', () => {
	it.each([
		["12'", 12 * FT],
		['12 ft', 12 * FT],
		['12 feet', 12 * FT],
		['1 foot', FT],
		['12.5 ft', 12.5 * FT],
		['12′', 12 * FT],
		['12’', 12 * FT], // a phone's apostrophe
		[`12' 6"`, 12 * FT + 6 * IN],
		[`12'6"`, 12 * FT + 6 * IN],
		['12′ 6″', 12 * FT + 6 * IN],
		['12’ 6”', 12 * FT + 6 * IN],
		['12 ft 6 in', 12 * FT + 6 * IN],
		['12 ft 6', 12 * FT + 6 * IN], // after the feet, a bare number is inches
		["12' 6 1/2\"", 12 * FT + 6.5 * IN],
		['12 ft 6-1/2 in', 12 * FT + 6.5 * IN],
		["12' 0.75\"", 12 * FT + 0.75 * IN],
		["12' 3/4", 12 * FT + 0.75 * IN],
		["0' 11 15/16\"", (11 + 15 / 16) * IN],
		['150 in', 150 * IN],
		['3.8 m', 3800]
	])('"%s" → %f mm', (input, mm) => {
		expect(parseLength(input)).toBeCloseTo(mm, 9);
	});

	it('150 in is 12 ft 6 in, and 12 ft 6 in is 3810 mm exactly by the definition', () => {
		expect(parseLength('150 in')).toBeCloseTo(parseLength(`12' 6"`), 9);
		expect(parseLength('12 ft 6 in')).toBeCloseTo(3810, 9); // (12·12 + 6) in × 25.4 mm/in
	});

	it.each([
		["12' 13\"", /below 12/],
		["12' 12\"", /below 12/],
		["12.5' 3\"", /whole feet before the inches/],
		["12' 6 mm", /after the feet, give inches/],
		["12' 3 ft", /after the feet, give inches/],
		["12' -3\"", /negative/],
		['1/2 ft', /part of a foot in inches/],
		["-12'", /negative/],
		["12''", /after the feet, give inches/]
	])('"%s" is refused', (input, message) => {
		expect(() => parseLength(input)).toThrow(message);
	});
});

describe('formatFeetAndInches', () => {
	it.each([
		[3810, 16, '12′ 6″'],
		[12 * FT, 16, '12′ 0″'],
		[5200, 16, '17′ 0 3/4″'], // 204.724 in → 204 12/16 in
		[3805, 16, '12′ 5 13/16″'], // 149.803 in → 149 13/16 in
		[6 * IN, 16, '6″'],
		[FT - 0.1, 16, '1′ 0″'], // 11.996″ carries into the next foot
		[2600, 4, '8′ 6 1/4″'], // 102.362 in → 102 1/4 in to the quarter
		[0, 16, '0″']
	])('%f mm to 1/%i″ → %s', (mm, den, text) => {
		expect(formatFeetAndInches(mm, den)).toBe(text);
	});

	it('writes keyboard marks for form fields, and parses back to within half a sixteenth', () => {
		expect(formatFeetAndInches(3810 + 12.7, 16, { ascii: true })).toBe(`12' 6 1/2"`);
		for (let mm = 0; mm <= 20_000; mm += 37.7) {
			const back = parseLength(formatFeetAndInches(mm, 16, { ascii: true }));
			expect(Math.abs(back - mm)).toBeLessThanOrEqual(IN / 32 + 1e-9);
		}
	});

	it('refuses what is not a length', () => {
		expect(() => formatFeetAndInches(Number.NaN)).toThrow(/cannot format/);
		expect(() => formatFeetAndInches(100, 0)).toThrow(/denominator/);
	});
});
