// The cut list's limits, each at, just below and just above it. All three are product rules:
// a strip takes a part while the part and its kerf fit the sheet's length, leftovers count as
// offcuts from the minimum size up, and the saw takes 3 mm unless told otherwise.
import { describe, expect, it } from 'vitest';
import { cutList, type StockSheet } from '../../../src/lib/treatment/cutlist';
import type { Part } from '../../../src/lib/treatment/parts';

const SHEET: StockSheet = { id: 'ply', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 0, grain: 'along-length' };
const part = (over: Partial<Part>): Part => ({ name: 'p', quantity: 1, lengthMm: 1000, widthMm: 100, thicknessMm: 18, finishedFaces: 0, grain: 'along-length', ...over });

describe('a strip takes a part while it fits the sheet length (product rule)', () => {
	// Two parts of length L and one 3 mm kerf between them: 2L + 3 against the 2440 mm sheet.
	it.each([
		{ lengthMm: 1218.5, strips: 1, case: 'exactly filling the strip (2 · 1218.5 + 3 = 2440)' },
		{ lengthMm: 1218.4, strips: 1, case: '0.2 mm short of the end' },
		{ lengthMm: 1218.6, strips: 2, case: '0.2 mm past the end' }
	])('two parts of $lengthMm mm, $case: $strips strip(s)', ({ lengthMm, strips }) => {
		const r = cutList([part({ quantity: 2, lengthMm })], [SHEET], { kerfMm: 3 });
		expect(r.sheets).toHaveLength(1);
		expect(r.sheets[0].strips).toHaveLength(strips);
		const xs = r.sheets[0].placements.map((p) => p.x);
		expect(xs).toEqual(strips === 1 ? [0, lengthMm + 3] : [0, 0]);
	});
});

describe('leftovers count as offcuts from the minimum size up (product rule)', () => {
	// One 1000 × 100 part: the rest of its strip is 2440 − 1003 = 1437 mm long and 100 mm wide.
	const stripEnd = { x: 1003, y: 0, lengthMm: 1437, widthMm: 100 };
	it.each([
		{ minOffcutMm: 100, kept: true, case: 'exactly the minimum' },
		{ minOffcutMm: 100.001, kept: false, case: 'just under the minimum' },
		{ minOffcutMm: 99.999, kept: true, case: 'just over the minimum' }
	])('a 100 mm wide leftover with a $minOffcutMm mm minimum ($case): kept $kept', ({ minOffcutMm, kept }) => {
		const r = cutList([part({})], [SHEET], { kerfMm: 3, minOffcutMm });
		const found = r.offcuts.some((o) => o.x === stripEnd.x && o.y === stripEnd.y && o.lengthMm === stripEnd.lengthMm && o.widthMm === stripEnd.widthMm);
		expect(found).toBe(kept);
		// The rest of the sheet below the strip (1220 − 103 = 1117 mm) is an offcut in every case.
		expect(r.offcuts.some((o) => o.y === 103 && o.widthMm === 1117 && o.lengthMm === 2440)).toBe(true);
	});

	it('the minimum is 100 mm when none is given (product rule)', () => {
		const at = cutList([part({ widthMm: 100 })], [SHEET], { kerfMm: 3 });
		expect(at.offcuts.some((o) => o.y === 0 && o.widthMm === 100)).toBe(true);
		// A 99 mm wide part leaves a 99 mm wide strip end: under the default minimum.
		const under = cutList([part({ widthMm: 99 })], [SHEET], { kerfMm: 3 });
		expect(under.offcuts.some((o) => o.y === 0)).toBe(false);
	});
});

describe('the saw kerf is 3 mm when none is given (product rule)', () => {
	it('parts along a strip and strips down the sheet sit one 3 mm kerf apart', () => {
		const r = cutList([part({ quantity: 2, lengthMm: 1200 }), part({ name: 'wide', lengthMm: 1500, widthMm: 400 })], [SHEET]);
		const positions = r.sheets[0].placements.map((p) => [p.name, p.x, p.y]);
		// Widest first: the 400 mm part opens strip 1; the 100 mm parts share strip 2 at y = 403.
		expect(positions).toEqual([
			['wide', 0, 0],
			['p', 0, 403],
			['p', 1203, 403]
		]);
		expect(r.sheets[0].kerfMm).toBe(3);
	});
});
