import { describe, expect, it } from 'vitest';
import { PLANNING_BANDS_HZ } from '../../../src/lib/treatment/bands';
import { materialBandCoefficients, materialById, MATERIALS, validateCustomMaterial } from '../../../src/lib/treatment/materials';
import { roomPatches, roomSurfaceAreaM2, roomVolumeM3, surfaceAreaM2, type SurfaceId } from '../../../src/lib/treatment/surfaces';

describe('material table', () => {
	it.each([
		// Vorländer, Auralization (Springer 2008), annex, as carried in pyroomacoustics materials.json.
		['hard-surface', [0.02, 0.02, 0.03, 0.03, 0.04, 0.05]],
		['plasterboard', [0.15, 0.1, 0.06, 0.04, 0.04, 0.05]],
		['glass-window', [0.1, 0.05, 0.04, 0.03, 0.03, 0.03]],
		['wood-16mm', [0.18, 0.12, 0.1, 0.09, 0.08, 0.07]],
		['rockwool-50mm-80', [0.22, 0.6, 0.92, 0.9, 0.88, 0.88]],
		['curtains-cotton', [0.3, 0.45, 0.65, 0.56, 0.59, 0.71]],
		['carpet-cotton', [0.07, 0.31, 0.49, 0.81, 0.66, 0.54]]
	])('%s carries the published values', (id, values) => {
		const m = materialById(id);
		expect([...m.coefficients]).toEqual(values);
		expect(m.confidence).toBe('published');
		expect(m.source).toMatch(/Vorländer/);
	});

	it('every row has a unique id, six coefficients in [0, 1], a source and a confidence', () => {
		expect(new Set(MATERIALS.map((m) => m.id)).size).toBe(MATERIALS.length);
		for (const m of MATERIALS) {
			expect(m.coefficients).toHaveLength(6);
			for (const a of m.coefficients) {
				expect(a).toBeGreaterThanOrEqual(0);
				expect(a).toBeLessThanOrEqual(1);
			}
			expect(m.source.length).toBeGreaterThan(10);
			expect(['published', 'from memory']).toContain(m.confidence);
		}
	});

	it('63 Hz borrows the 125 Hz value and 8 kHz the 4 kHz value (nearest published band)', () => {
		const bands = materialBandCoefficients(materialById('carpet-cotton'));
		expect(bands).toHaveLength(PLANNING_BANDS_HZ.length);
		expect(bands[0]).toBe(0.07);
		expect(bands[7]).toBe(0.54);
		expect(bands.slice(1, 7)).toEqual([0.07, 0.31, 0.49, 0.81, 0.66, 0.54]);
	});

	it('an unknown id lists the known ones', () => {
		expect(() => materialById('cardboard')).toThrow(/unknown material "cardboard"; known: hard-surface/);
	});
});

describe('validateCustomMaterial', () => {
	const good = { id: 'cork-wall', name: 'Cork wall tiles', coefficients: [0.05, 0.1, 0.2, 0.55, 0.6, 0.55] };

	it('accepts a well-formed material and marks it as a user entry', () => {
		const r = validateCustomMaterial(good);
		expect(r.ok).toBe(true);
		if (r.ok) {
			expect(r.material.confidence).toBe('user entry');
			expect(r.material.source).toBe('user entry');
		}
	});

	it.each([
		[{ ...good, id: 'Cork Wall' }, /id:/],
		[{ ...good, name: '' }, /name:/],
		[{ ...good, coefficients: [0.1, 0.2] }, /give 6 values/],
		[{ ...good, coefficients: [0.1, 0.2, 0.3, 0.4, 0.5, 1.05] }, /4000 Hz \(1.05\) must lie between 0 and 1/],
		[{ ...good, coefficients: [-0.1, 0.2, 0.3, 0.4, 0.5, 0.6] }, /125 Hz/],
		[{ ...good, coefficients: [0.1, 'x', 0.3, 0.4, 0.5, 0.6] }, /250 Hz is not a number/]
	])('refuses %o', (input, message) => {
		const r = validateCustomMaterial(input);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.errors.join('\n')).toMatch(message);
	});
});

describe('room surfaces', () => {
	const room = { lengthM: 5, widthM: 4, heightM: 3 };
	const finish = (v: number) => PLANNING_BANDS_HZ.map(() => v);
	const finishes: Record<SurfaceId, number[]> = { floor: finish(0.1), ceiling: finish(0.2), front: finish(0.03), back: finish(0.03), left: finish(0.05), right: finish(0.05) };

	it.each([
		['floor', 20],
		['ceiling', 20],
		['front', 12],
		['back', 12],
		['left', 15],
		['right', 15]
	] as const)('%s of 5 × 4 × 3 m is %i m² (front/back W×H, left/right L×H)', (s, area) => {
		expect(surfaceAreaM2(room, s)).toBe(area);
	});

	it('total area 2(LW + LH + WH) = 94 m², volume 60 m³', () => {
		expect(roomSurfaceAreaM2(room)).toBe(94);
		expect(roomVolumeM3(room)).toBe(60);
	});

	it('an opening is cut from its surface and keeps its own finish; total area is conserved', () => {
		const door = { label: 'door', surface: 'front' as const, widthM: 0.9, heightM: 2.1, coefficients: finish(0.1) };
		const patches = roomPatches(room, finishes, [door]);
		const front = patches.find((p) => p.label === 'front');
		expect(front?.areaM2).toBeCloseTo(12 - 1.89, 12);
		expect(patches.find((p) => p.label === 'door')?.coefficients[0]).toBe(0.1);
		expect(patches.reduce((s, p) => s + p.areaM2, 0)).toBeCloseTo(94, 12);
	});

	it.each([
		[{ label: 'wall of glass', surface: 'front' as const, widthM: 4, heightM: 3.01 }, /does not fit the front surface/],
		[{ label: 'huge', surface: 'left' as const, widthM: 6, heightM: 1 }, /does not fit/],
		[{ label: 'flat', surface: 'floor' as const, widthM: 0, heightM: 1 }, /positive width and height/]
	])('rejects opening %o', (o, message) => {
		expect(() => roomPatches(room, finishes, [{ ...o, coefficients: finish(0.1) }])).toThrow(message);
	});

	it('rejects openings whose areas together exceed their surface', () => {
		const win = { surface: 'front' as const, widthM: 4, heightM: 2, coefficients: finish(0.05) };
		expect(() => roomPatches(room, finishes, [{ ...win, label: 'a' }, { ...win, label: 'b' }])).toThrow(/openings on the front surface total 16.00 m², more than the surface's 12.00 m²/);
	});

	it('rejects a room with a non-positive dimension and a missing finish', () => {
		expect(() => roomPatches({ ...room, heightM: 0 }, finishes)).toThrow(/heightM/);
		const { floor: _floor, ...noFloor } = finishes;
		expect(() => roomPatches(room, noFloor as Record<SurfaceId, number[]>)).toThrow(/no finish given for the floor/);
	});
});
