import { describe, expect, it } from 'vitest';
import { formatArea, formatRoomLength, formatRoomSize, formatRoomSizeBare, formatVolume, roomLengthInput } from '../../src/lib/format';
import { formUnitSystem, positionSchemaFor, roomSchemaFor } from '../../src/lib/schemas/projects';

// Room and position dimensions in feet and inches, stored in metres. The conversion is the
// definition, not a rounded factor: 1 in = 25.4 mm, so 1 ft = 0.3048 m, 1 ft² = 0.09290304 m² and
// 1 ft³ = 0.028316846592 m³ exactly (international yard and pound agreement, 1959; NIST SP 811
// (2008), Appendix B, foot and inch marked exact).
const FT_M = 0.3048;
const IN_M = 0.0254;

describe('room lengths, areas and volumes in the reader’s units', () => {
	it('metric stays as it was: metres to the centimetre, m² and m³ to a tenth', () => {
		expect(formatRoomSize({ lengthM: 5.2, widthM: 3.805, heightM: 2.6 })).toBe('5.20 × 3.81 × 2.60 m');
		expect(formatRoomSize({ lengthM: 5.2, widthM: 3.805, heightM: 2.6 }, 'metric')).toBe('5.20 × 3.81 × 2.60 m');
		expect(formatVolume(51.44, 'metric')).toBe('51.4 m³');
		expect(formatArea(38.25, 'metric')).toBe('38.3 m²');
		expect(formatRoomLength(5.2)).toBe('5.20 m');
	});

	it('imperial: feet and inches to 1/16″, each length with its marks', () => {
		// 12 ft 6 in = 150 in = 3.81 m; 10 ft = 3.048 m; 8 ft 2 in = 98 in = 2.4892 m.
		const room = { lengthM: 150 * IN_M, widthM: 10 * FT_M, heightM: 98 * IN_M };
		expect(formatRoomSize(room, 'imperial')).toBe('12′ 6″ × 10′ 0″ × 8′ 2″');
		expect(formatRoomSizeBare(room, 'imperial')).toBe('12′ 6″ × 10′ 0″ × 8′ 2″');
		// A room entered in metres: 5.20 m = 204.724 in → 204 3/4 in to the sixteenth.
		expect(formatRoomLength(5.2, 'imperial')).toBe('17′ 0 3/4″');
	});

	it('imperial: ft² and ft³ by the exact factors, whole', () => {
		// 12.5 × 10 × 8 ft = 1000 ft³ = 28.316846592 m³; 12.5 × 10 ft = 125 ft² = 11.6128800 m².
		expect(formatVolume(1000 * FT_M ** 3, 'imperial')).toBe('1000 ft³');
		expect(formatArea(125 * FT_M ** 2, 'imperial')).toBe('125 ft²');
		expect(formatVolume(28.316846592, 'imperial')).toBe('1000 ft³');
		// 51.4 m³ = 1815.2 ft³ and 38.2 m² = 411.2 ft² (m³ / 0.028316846592, m² / 0.09290304).
		expect(formatVolume(51.4, 'imperial')).toBe('1815 ft³');
		expect(formatArea(38.2, 'imperial')).toBe('411 ft²');
	});

	it('form values: metres to the millimetre, or feet and inches with keyboard marks that parse back to the stored length', () => {
		expect(roomLengthInput(5.2, 'metric')).toBe('5.2');
		expect(roomLengthInput(3.81, 'imperial')).toBe(`12' 6"`);
		expect(roomLengthInput(null, 'imperial')).toBe('');
		const schema = roomSchemaFor('imperial');
		// Every length stored to the millimetre comes back unchanged after a round through the form.
		for (let mm = 500; mm <= 20_000; mm += 13) {
			const m = mm / 1000;
			const text = roomLengthInput(m, 'imperial');
			const parsed = schema.parse({ name: 'r', roomUse: 'listening', lengthM: text, widthM: text, heightM: '8 ft' });
			expect(Math.round(parsed.lengthM * 1000)).toBe(mm);
		}
	});
});

describe('the room form in imperial units', () => {
	const base = { name: 'Basement', roomUse: 'home-theatre', widthM: '10 ft', heightM: `8' 2"` };
	const imperial = roomSchemaFor('imperial');

	it.each([
		[`12' 6"`, 150 * IN_M],
		['12 ft 6 in', 150 * IN_M],
		['150 in', 150 * IN_M],
		['12.5', 12.5 * FT_M], // a bare number is feet in an imperial form
		['3.8 m', 3.8],
		['381 cm', 3.81],
		["12' 6 1/2\"", 150.5 * IN_M]
	])('takes a length of "%s" as %f m', (lengthM, metres) => {
		const r = imperial.parse({ ...base, lengthM });
		expect(r.lengthM).toBeCloseTo(metres, 12); // exact arithmetic; 1e-12 for float rounding
		expect(r.widthM).toBeCloseTo(3.048, 12);
		expect(r.heightM).toBeCloseTo(98 * IN_M, 12);
	});

	it.each([
		['', /Enter the length/],
		['-12 ft', /more than zero/],
		[`1' 6"`, /under 1′ 7 11\/16″ is not a room/], // 0.5 m = 19.685 in
		['600 ft', /looks like a typing error/], // over 150 m = 492′ 1 5/8″
		['twelve feet', /Length: .*not a length/],
		[`12' 14"`, /below 12/]
	])('refuses "%s" with a reason in feet and inches', (lengthM, reason) => {
		const r = imperial.safeParse({ ...base, lengthM });
		expect(r.success).toBe(false);
		expect(r.error!.issues.find((i) => i.path[0] === 'lengthM')?.message).toMatch(reason);
	});

	it('a bare number in a metric form is metres, and its units come from the form', () => {
		expect(roomSchemaFor('metric').parse({ ...base, lengthM: '12.5', widthM: '4', heightM: '2.7' }).lengthM).toBe(12.5);
		const form = new FormData();
		form.set('units', 'imperial');
		expect(formUnitSystem(form, 'metric')).toBe('imperial');
		form.set('units', 'furlongs');
		expect(formUnitSystem(form, 'metric')).toBe('metric');
		expect(formUnitSystem(new FormData(), 'imperial')).toBe('imperial');
	});
});

describe('position coordinates in imperial units', () => {
	it('are parsed to metres, empty is none, text that is no length is refused', () => {
		const p = positionSchemaFor('imperial').parse({ label: 'P1', sourceX: '', micX: `4' 6"`, micY: '3', micZ: '42 in' });
		expect(p.sourceX).toBeNull();
		expect(p.micX).toBeCloseTo(54 * IN_M, 12);
		expect(p.micY).toBeCloseTo(3 * FT_M, 12);
		expect(p.micZ).toBeCloseTo(42 * IN_M, 12);
		const bad = positionSchemaFor('imperial').safeParse({ label: 'P1', micY: 'left' });
		expect(bad.success).toBe(false);
		expect(bad.error!.issues[0].message).toMatch(/not a length/);
		expect(positionSchemaFor('imperial').safeParse({ label: 'P1', micY: '-2 ft' }).error!.issues[0].message).toMatch(/cannot be negative/);
	});
});
