import { describe, expect, it } from 'vitest';
import { planBuilds, planCutList } from '../../../src/lib/plans/build';
import { pieceKeys, sheetLegend } from '../../../src/lib/plans/cut-keys';
import { cutList, type StockSheet } from '../../../src/lib/treatment/cutlist';
import type { Part } from '../../../src/lib/treatment/parts';
import { demoLikeItems, STOCK } from './fixtures';

const identity = (p: { name: string; part: { lengthMm: number; widthMm: number; thicknessMm: number } }) => `${p.name}|${p.part.lengthMm}|${p.part.widthMm}|${p.part.thicknessMm}`;

describe('keys of a plan like the demo’s', () => {
	const cut = planCutList(planBuilds(demoLikeItems()).builds, STOCK, 3);
	if (!cut.ok) throw new Error(cut.error);
	const keys = pieceKeys(cut.cutList);
	const placements = cut.cutList.sheets.flatMap((s) => s.placements);

	it('one key per distinct part (same name and size), numbered 1, 2, 3 … in cutting order', () => {
		const distinct = [...new Set(placements.map(identity))];
		expect(keys.legend).toHaveLength(distinct.length);
		expect(keys.legend.map((k) => k.key)).toEqual(distinct.map((_, i) => String(i + 1)));
		expect(keys.legend.map((k) => `${k.name}|${k.lengthMm}|${k.widthMm}|${k.thicknessMm}`)).toEqual(distinct);
	});

	it('pieces of one identity share a key; different identities never do', () => {
		const seen = new Map<string, string>();
		for (const p of placements) {
			const k = keys.keyOf(p);
			const known = seen.get(identity(p));
			if (known) expect(k).toBe(known);
			else seen.set(identity(p), k);
		}
		expect(new Set(seen.values()).size).toBe(seen.size);
	});

	it('legend counts add up to the placements, overall and sheet by sheet', () => {
		expect(keys.legend.reduce((n, k) => n + k.count, 0)).toBe(placements.length);
		for (const k of keys.legend) expect(k.count).toBe(placements.filter((p) => keys.keyOf(p) === k.key).length);
		const perKeyOverSheets = new Map<string, number>();
		for (const sheet of cut.cutList.sheets) {
			const legend = sheetLegend(sheet, keys);
			expect(legend.reduce((n, k) => n + k.onSheet, 0)).toBe(sheet.placements.length);
			for (const k of legend) {
				expect(k.onSheet).toBe(sheet.placements.filter((p) => keys.keyOf(p) === k.key).length);
				perKeyOverSheets.set(k.key, (perKeyOverSheets.get(k.key) ?? 0) + k.onSheet);
			}
		}
		for (const k of keys.legend) expect(perKeyOverSheets.get(k.key)).toBe(k.count);
	});
});

describe('keys on a small hand-made list', () => {
	const sheet: StockSheet = { id: 'S', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 2, grain: 'none' };
	const part = (over: Partial<Part>): Part => ({ name: 'fin', quantity: 1, lengthMm: 1000, widthMm: 200, thicknessMm: 18, finishedFaces: 0, grain: 'none', ...over });

	it('same name, different size → two keys; a turned piece keeps its part’s key', () => {
		// Two 1000 × 200 fins and one 900 × 200 fin; a 1100 × 100 'cap' without grain.
		const cut = cutList([part({ quantity: 2 }), part({ lengthMm: 900 }), part({ name: 'cap', lengthMm: 1100, widthMm: 100 })], [sheet], { kerfMm: 3 });
		const keys = pieceKeys(cut);
		expect(keys.legend.map((k) => [k.name, k.lengthMm, k.count]).sort()).toEqual([
			['cap', 1100, 1],
			['fin', 1000, 2],
			['fin', 900, 1]
		]);
		const turned = { ...cut.sheets[0].placements[0], rotated: true, lengthMm: cut.sheets[0].placements[0].widthMm, widthMm: cut.sheets[0].placements[0].lengthMm };
		expect(keys.keyOf(turned)).toBe(keys.keyOf(cut.sheets[0].placements[0]));
	});

	it('a piece from another cut list gets "?"', () => {
		const keys = pieceKeys(cutList([part({})], [sheet]));
		const other = cutList([part({ name: 'other' })], [sheet]).sheets[0].placements[0];
		expect(keys.keyOf(other)).toBe('?');
	});
});
