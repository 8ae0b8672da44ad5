import { describe, expect, it } from 'vitest';
import { formatInches, formatLength, formatMillimetres, inchesToMm, mmToInches, parseLength } from '../../../src/lib/treatment/units';

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
		['12 ft', /not a length/],
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
