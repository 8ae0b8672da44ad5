// The cut list's rules each shown on a layout small enough to work out by hand: refusals of bad
// input, grain and rotation, the leftover above a narrow part, the offcut's length limit, the
// areas, the sheet numbers and the finished-first order (all product rules).
import { describe, expect, it } from 'vitest';
import { allowedOrientations, cutList, sameThickness, type StockSheet } from '../../../src/lib/treatment/cutlist';
import type { Part } from '../../../src/lib/treatment/parts';

const SHEET: StockSheet = { id: 'ply', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 0, grain: 'along-length' };
const part = (over: Partial<Part>): Part => ({ name: 'p', quantity: 1, lengthMm: 1000, widthMm: 100, thicknessMm: 18, finishedFaces: 0, grain: 'along-length', ...over });

describe('bad input is refused with the reason', () => {
	it.each([
		{ stock: [{ ...SHEET, lengthMm: 0 }], message: 'stock "ply": lengthMm must be a positive number of mm' },
		{ stock: [{ ...SHEET, widthMm: -1 }], message: 'stock "ply": widthMm must be a positive number of mm' },
		{ stock: [{ ...SHEET, thicknessMm: Number.NaN }], message: 'stock "ply": thicknessMm must be a positive number of mm' },
		{ stock: [{ ...SHEET, lengthMm: Number.POSITIVE_INFINITY }], message: 'stock "ply": lengthMm must be a positive number of mm' },
		{ stock: [{ ...SHEET, finishedFaces: 3 as 0 }], message: 'stock "ply": finishedFaces must be 0, 1 or 2' },
		{ stock: [], message: 'give at least one stock sheet' },
		{ stock: [SHEET, SHEET], message: 'stock sheet ids must be unique' }
	])('stock $message', ({ stock, message }) => {
		expect(() => cutList([part({})], stock)).toThrow(message);
	});

	it.each([
		{ options: { kerfMm: -0.1 }, message: 'kerf must be zero or positive, got -0.1 mm' },
		{ options: { kerfMm: Number.NaN }, message: 'kerf must be zero or positive, got NaN mm' },
		{ options: { minOffcutMm: 0 }, message: 'minimum offcut must be positive, got 0 mm' },
		{ options: { order: 'tallest' as 'widest-first' }, message: 'unknown piece order "tallest"' }
	])('options: $message', ({ options, message }) => {
		expect(() => cutList([part({})], [SHEET], options)).toThrow(message);
	});

	it('a kerf of exactly 0 (a knife, not a saw) is allowed: parts then touch', () => {
		const r = cutList([part({ quantity: 2 })], [SHEET], { kerfMm: 0 });
		expect(r.sheets[0].placements.map((p) => p.x)).toEqual([0, 1000]);
	});
});

describe('grain and rotation', () => {
	it('a part with grain on grained stock keeps its length along the sheet; without grain it may turn', () => {
		const locked = allowedOrientations(part({ lengthMm: 300, widthMm: 200 }), SHEET);
		expect(locked).toEqual([{ dx: 300, dy: 200, rotated: false }]);
		const free = allowedOrientations(part({ lengthMm: 300, widthMm: 200, grain: 'none' }), SHEET);
		expect(free).toEqual([
			{ dx: 300, dy: 200, rotated: false },
			{ dx: 200, dy: 300, rotated: true }
		]);
		// Grain on the part but MDF (no grain) stock: both ways.
		expect(allowedOrientations(part({ lengthMm: 300, widthMm: 200 }), { ...SHEET, grain: 'none' })).toHaveLength(2);
		// Grain across the part: only turned.
		expect(allowedOrientations(part({ lengthMm: 300, widthMm: 200, grain: 'along-width' }), SHEET)).toEqual([{ dx: 200, dy: 300, rotated: true }]);
	});

	it.each([
		{ lengthMm: 2440, widthMm: 1220, fits: true, case: 'exactly the sheet' },
		{ lengthMm: 2440.1, widthMm: 1220, fits: false, case: '0.1 mm too long' },
		{ lengthMm: 2440, widthMm: 1220.1, fits: false, case: '0.1 mm too wide' }
	])('a part $case fits: $fits', ({ lengthMm, widthMm, fits }) => {
		expect(allowedOrientations(part({ lengthMm, widthMm }), SHEET).length > 0).toBe(fits);
	});

	it('a part without grain lies with its narrow side across the strip, so strips stay thin', () => {
		const r = cutList([part({ lengthMm: 200, widthMm: 600, grain: 'none' })], [SHEET]);
		expect(r.sheets[0].placements[0]).toMatchObject({ lengthMm: 600, widthMm: 200, rotated: true });
		expect(r.sheets[0].strips[0].widthMm).toBe(200);
	});

	it('of two square orientations the same size, the unturned one is kept', () => {
		const r = cutList([part({ lengthMm: 300, widthMm: 300, grain: 'none' })], [SHEET]);
		expect(r.sheets[0].placements[0].rotated).toBe(false);
	});
});

describe('thickness match within 0.1 mm (product rule: parts lists round to 0.1 mm)', () => {
	it.each([
		{ b: 18.1, same: true, case: 'exactly 0.1 mm apart' },
		{ b: 18.0999, same: true, case: 'just under 0.1 mm' },
		{ b: 18.1001, same: false, case: 'just over 0.1 mm' },
		{ b: 17.9, same: true, case: '0.1 mm thinner' }
	])('18 and $b mm ($case): same $same', ({ b, same }) => {
		expect(sameThickness(18, b)).toBe(same);
	});
});

describe('leftovers, areas and sheet numbers, by hand', () => {
	it('a narrower part in a wider strip leaves the strip above it, after a kerf', () => {
		// Strip 1 is 400 mm wide (the 400 mm part); the 250 mm part joins it at x = 1503 and leaves
		// 400 − 250 − 3 = 147 mm above it, 900 mm long.
		const r = cutList([part({ name: 'wide', lengthMm: 1500, widthMm: 400 }), part({ name: 'narrow', lengthMm: 900, widthMm: 250 })], [SHEET], { kerfMm: 3 });
		const sheet = r.sheets[0];
		expect(sheet.strips).toHaveLength(1);
		expect(sheet.placements.map((p) => [p.name, p.x, p.y])).toEqual([
			['wide', 0, 0],
			['narrow', 1503, 0]
		]);
		expect(sheet.offcuts).toContainEqual({ x: 1503, y: 253, lengthMm: 900, widthMm: 147 });
		// Nothing above the full-width part; the strip's end is 2440 − 2406 = 34 mm: too short.
		expect(sheet.offcuts.filter((o) => o.y < 400)).toEqual([{ x: 1503, y: 253, lengthMm: 900, widthMm: 147 }]);
		// Parts 1500·400 + 900·250 = 825 000 mm² of 2440·1220 = 2 976 800 mm²: 27.71 %.
		expect(sheet.partsAreaMm2).toBe(825_000);
		expect(r.partsAreaMm2).toBe(825_000);
		expect(r.sheetsAreaMm2).toBe(2_976_800);
		expect(r.yieldPct).toBeCloseTo(27.714, 3);
	});

	it.each([
		{ lengthMm: 2337, kept: true, case: 'strip end exactly 100 mm long (2440 − 2337 − 3)' },
		{ lengthMm: 2337.001, kept: false, case: 'just under 100 mm' },
		{ lengthMm: 2336.999, kept: true, case: 'just over 100 mm' }
	])('a 200 mm wide strip, part $lengthMm mm ($case): end kept $kept', ({ lengthMm, kept }) => {
		const r = cutList([part({ lengthMm, widthMm: 200 })], [SHEET], { kerfMm: 3, minOffcutMm: 100 });
		expect(r.offcuts.some((o) => o.y === 0 && o.widthMm === 200)).toBe(kept);
	});

	it('no parts: no sheets, and a yield of 0 %, not 0/0', () => {
		const r = cutList([], [SHEET]);
		expect(r).toMatchObject({ sheetsUsed: 0, partsAreaMm2: 0, sheetsAreaMm2: 0, yieldPct: 0, offcuts: [] });
	});

	it('sheets are numbered from 1 per stock; each counts only its own parts', () => {
		// Three 1220 × 2440 parts (whole sheets) need three sheets.
		const r = cutList([part({ quantity: 3, lengthMm: 2440, widthMm: 1220 })], [SHEET]);
		expect(r.sheets.map((s) => s.sheetNumber)).toEqual([1, 2, 3]);
		expect(r.sheets.map((s) => s.partsAreaMm2)).toEqual([2_976_800, 2_976_800, 2_976_800]);
		expect(r.sheets.every((s) => s.offcuts.length === 0)).toBe(true);
		expect(r.yieldPct).toBe(100);
		expect(r.perStock).toEqual([{ stockId: 'ply', sheets: 3 }]);
	});

	it('a second strip opens on the same sheet while its width fits: exactly filling the sheet (two strips of 608.5 mm + 3 mm kerf)', () => {
		const r = cutList([part({ quantity: 2, lengthMm: 2440, widthMm: 608.5 })], [SHEET], { kerfMm: 3 });
		expect(r.sheets).toHaveLength(1);
		expect(r.sheets[0].strips.map((s) => s.y)).toEqual([0, 611.5]);
		const over = cutList([part({ quantity: 2, lengthMm: 2440, widthMm: 608.6 })], [SHEET], { kerfMm: 3 });
		expect(over.sheets).toHaveLength(2);
	});

	it('best fit: a part goes to the strip it leaves least of, not the first with room', () => {
		// Strips of 300 mm (part 2000 long: 437 mm left) and 200 mm (part 1000 long: 1437 left);
		// a 400 × 150 part fits both: in strip 1 it leaves 2440 − 2003 − 400 = 37 mm, in strip 2 1037 mm.
		const r = cutList([part({ name: 'a', lengthMm: 2000, widthMm: 300 }), part({ name: 'b', lengthMm: 1000, widthMm: 200 }), part({ name: 'c', lengthMm: 400, widthMm: 150 })], [SHEET], { kerfMm: 3 });
		expect(r.sheets[0].placements.find((p) => p.name === 'c')).toMatchObject({ x: 2003, y: 0 });
	});

	it('ties go to the first strip with that fit', () => {
		// Two 2000 mm parts each open a 300 mm strip (2003 + 2000 > 2440); a 400 mm part leaves
		// 2440 − 2003 − 400 = 37 mm in either: it goes to strip 1, at y = 0.
		const r = cutList([part({ name: 'a', lengthMm: 2000, widthMm: 300 }), part({ name: 'b', lengthMm: 2000, widthMm: 300 }), part({ name: 'c', lengthMm: 400, widthMm: 300 })], [SHEET], { kerfMm: 3 });
		expect(r.sheets[0].placements.map((p) => [p.name, p.x, p.y])).toEqual([
			['a', 0, 0],
			['b', 0, 303],
			['c', 2003, 0]
		]);
	});
});

describe('finished-first order', () => {
	it('parts with more finished faces are laid first, then the widest', () => {
		const parts = [part({ name: 'hidden', widthMm: 300 }), part({ name: 'shown', widthMm: 100, finishedFaces: 2 })];
		const stock = [{ ...SHEET, finishedFaces: 2 as const }];
		expect(cutList(parts, stock).sheets[0].placements.map((p) => p.name)).toEqual(['hidden', 'shown']);
		expect(cutList(parts, stock, { order: 'finished-first' }).sheets[0].placements.map((p) => p.name)).toEqual(['shown', 'hidden']);
		expect(cutList(parts, stock, { order: 'widest-first' }).sheets[0].placements.map((p) => p.name)).toEqual(['hidden', 'shown']);
	});

	it('widest first, then longest', () => {
		const parts = [part({ name: 'short', lengthMm: 500 }), part({ name: 'long', lengthMm: 900 })];
		expect(cutList(parts, [SHEET]).sheets[0].placements.map((p) => p.name)).toEqual(['long', 'short']);
	});
});
