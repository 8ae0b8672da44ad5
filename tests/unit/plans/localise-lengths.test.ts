import { describe, expect, it } from 'vitest';
import { localiseLengths } from '../../../src/lib/plans/format';

// 1 in = 25.4 mm exactly (international yard and pound, 1959); inches to the nearest 1/16″.
describe('sentences in millimetres, shown in inches', () => {
	it('converts every length of a part name or note', () => {
		expect(localiseLengths('spacer block 178 mm', 'in')).toBe('spacer block 7″'); // 178 / 25.4 = 7.008
		expect(localiseLengths('Porous absorber 100 mm + 50.8 mm gap', 'in')).toBe('Porous absorber 3 15/16″ + 2″ gap'); // 3.937 → 3 15/16
		expect(localiseLengths('Loose fibre, about 138 mm thick', 'in')).toBe('Loose fibre, about 5 7/16″ thick'); // 5.433 → 5 7/16
	});

	it('converts each number of a size or a list that shares one unit', () => {
		expect(localiseLengths('Fibre slab 1168.4 × 558.8 × 50.8 mm, held at the front', 'in')).toBe('Fibre slab 46″ × 22″ × 2″, held at the front');
		expect(localiseLengths('cut to the well profile: 0, 25.4, 50.8 mm deep', 'in')).toBe('cut to the well profile: 0″, 1″, 2″ deep');
	});

	it('leaves millimetres alone, and words or other units untouched', () => {
		const text = 'well bottom (depth 49 mm), N = 7, f0 = 500 Hz';
		expect(localiseLengths(text, 'mm')).toBe(text);
		expect(localiseLengths(text, 'in')).toBe('well bottom (depth 1 15/16″), N = 7, f0 = 500 Hz'); // 1.929 → 1 15/16
		expect(localiseLengths('σ = 10 kPa·s/m², 12 mmHg', 'in')).toBe('σ = 10 kPa·s/m², 12 mmHg');
	});
});
