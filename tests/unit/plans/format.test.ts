import { describe, expect, it } from 'vitest';
import { areaText, KG_PER_LB, lengthInput, lengthText, M2_PER_FT2, moneyText, roomLengthText, sizeText, weightText } from '../../../src/lib/plans/format';
import { parseLength } from '../../../src/lib/treatment/units';

// International yard and pound agreement (1959): 1 in = 25.4 mm, 1 ft = 0.3048 m, 1 lb = 0.45359237 kg, exactly.

describe('conversion constants', () => {
	it('1 ft² = 0.3048² m² = 0.09290304 m² (tolerance 1e-17: the binary product of 0.3048 by itself)', () => {
		expect(Math.abs(M2_PER_FT2 - 0.09290304)).toBeLessThan(1e-17);
	});

	it('1 lb = 0.45359237 kg', () => {
		expect(KG_PER_LB).toBe(0.45359237);
	});
});

describe('lengths', () => {
	it.each([
		[196, 'mm', '196 mm'],
		[6.5, 'mm', '6.5 mm'],
		[12.25, 'mm', '12.3 mm'], // one decimal
		[600.0, 'mm', '600 mm'],
		// 196 / 25.4 = 7.7165 in; ×16 = 123.46 → 123/16 = 7 11/16
		[196, 'in', '7 11/16″'],
		// 25.4 mm is exactly one inch
		[25.4, 'in', '1″'],
		// 18 / 25.4 = 0.7087 in; ×16 = 11.34 → 11/16
		[18, 'in', '11/16″'],
		// 1200 / 25.4 = 47.244 in; ×16 = 755.9 → 756/16 = 47 1/4
		[1200, 'in', '47 1/4″']
	] as const)('lengthText(%f, %s) = %s', (mm, unit, text) => {
		expect(lengthText(mm, unit)).toBe(text);
	});

	it.each([
		// 600 / 25.4 = 23.622 in; ×32 = 755.9 → 756/32 = 23 5/8
		[600, 'in', '23 5/8 in'],
		// 6 / 25.4 = 0.2362 in; ×32 = 7.56 → 8/32 = 1/4
		[6, 'in', '1/4 in'],
		[0, 'in', '0 in'],
		[47.5, 'mm', '47.5 mm']
	] as const)('lengthInput(%f, %s) = %s, read back within half a step', (mm, unit, text) => {
		expect(lengthInput(mm, unit)).toBe(text);
		const back = parseLength(text, unit);
		expect(Math.abs(back - mm)).toBeLessThanOrEqual(unit === 'in' ? 25.4 / 64 : 0.05);
	});

	it('sizeText joins width and height', () => {
		expect(sizeText(600, 1200, 'mm')).toBe('600 mm × 1200 mm');
		expect(sizeText(600, 1200, 'in')).toBe('23 5/8″ × 47 1/4″');
	});

	it.each([
		[3, 'mm', '3.00 m'],
		// 3 m = 118.11 in → 118 in = 9 ft 10 in
		[3, 'in', '9′ 10″'],
		// 2.4384 m = 96 in exactly = 8 ft
		[2.4384, 'in', '8′ 0″']
	] as const)('roomLengthText(%f, %s) = %s', (m, unit, text) => {
		expect(roomLengthText(m, unit)).toBe(text);
	});
});

describe('areas and weights', () => {
	it.each([
		[1.44, 'mm', '1.44 m²'],
		// 1 m² / 0.09290304 = 10.764 ft²
		[1, 'in', '10.8 ft²'],
		[0.09290304, 'in', '1.0 ft²'],
		// 1.44 m² = 15.50 ft²
		[1.44, 'in', '15.5 ft²']
	] as const)('areaText(%f, %s) = %s', (m2, unit, text) => {
		expect(areaText(m2, unit)).toBe(text);
	});

	it.each([
		[5.71536, 'mm', '5.7 kg'],
		// 5.71536 / 0.45359237 = 12.600 lb
		[5.71536, 'in', '12.6 lb'],
		[0.45359237, 'in', '1.0 lb'],
		// 20.884 kg / 0.45359237 = 46.04 lb
		[20.8842624, 'in', '46.0 lb']
	] as const)('weightText(%f, %s) = %s', (kg, unit, text) => {
		expect(weightText(kg, unit)).toBe(text);
	});
});

describe('money', () => {
	it('money in the plan’s currency, two decimals', () => {
		expect(moneyText(1234.5, 'EUR')).toBe('€1,234.50');
		expect(moneyText(12, 'USD')).toBe('$12.00');
	});

	it('an unknown currency code falls back to the amount and the code', () => {
		expect(moneyText(12.5, 'EURO')).toBe('12.50 EURO');
	});
});
