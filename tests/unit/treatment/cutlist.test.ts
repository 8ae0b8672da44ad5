import { describe, expect, it } from 'vitest';
import { diffuserBuildSheet } from '../../../src/lib/treatment/buildsheet';
import { cutList, type StockSheet } from '../../../src/lib/treatment/cutlist';
import { cuttingDiagramSvg } from '../../../src/lib/treatment/cutting-diagram-svg';
import { designDiffuser } from '../../../src/lib/treatment/diffuser';
import type { FinishedFaces, Grain, Part } from '../../../src/lib/treatment/parts';
import { expectValidLayout } from './helpers/layout';

const KERF = 3.2;

/** Small seeded generator (mulberry32) so the random part lists are the same on every run. */
function mulberry32(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}


/**
 * The naive layout, worked out from the parts list alone: each piece goes on the cheapest stock
 * that takes it (the rule the cut list states: the thickness, enough finished faces, room in an
 * orientation the grain allows), gets a full-length strip of its own as wide as its narrower
 * allowed side, and the strips are stacked widest first down as many sheets as they need, one
 * kerf after each.
 */
function naiveSheetCount(parts: readonly Part[], stock: readonly StockSheet[], kerf: number): Map<string, number> {
	const strips = new Map<string, number[]>();
	for (const part of parts) {
		const sides = (s: StockSheet): [number, number][] => {
			const turnable = part.grain === 'none' || s.grain === 'none';
			const options: [number, number][] = turnable
				? [[part.lengthMm, part.widthMm], [part.widthMm, part.lengthMm]]
				: part.grain === 'along-length'
					? [[part.lengthMm, part.widthMm]]
					: [[part.widthMm, part.lengthMm]];
			return options.filter(([along, across]) => along <= s.lengthMm && across <= s.widthMm);
		};
		const candidates = stock.filter((s) => Math.abs(s.thicknessMm - part.thicknessMm) <= 0.1 && s.finishedFaces >= part.finishedFaces && sides(s).length > 0);
		const cheapest = [...candidates].sort((a, b) => a.finishedFaces - b.finishedFaces)[0];
		const across = Math.min(...sides(cheapest).map(([, w]) => w));
		strips.set(cheapest.id, [...(strips.get(cheapest.id) ?? []), ...Array<number>(part.quantity).fill(across)]);
	}
	const sheets = new Map<string, number>();
	for (const [id, widths] of strips) {
		const sheet = stock.find((s) => s.id === id)!;
		let count = 0;
		let y = Infinity;
		for (const w of widths.sort((a, b) => b - a)) {
			if (y + w > sheet.widthMm) {
				count++;
				y = 0;
			}
			y += w + kerf;
		}
		sheets.set(id, count);
	}
	return sheets;
}

const SHEET_AREA = 2440 * 1220;

const PLY_AA: StockSheet = { id: 'ply-18-AA', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 2, grain: 'along-length' };
const PLY_B: StockSheet = { id: 'ply-18-B', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 1, grain: 'along-length' };
const MDF_18: StockSheet = { id: 'mdf-18', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 0, grain: 'none' };

describe('cut list of a realistic QRD (N = 7, f0 = 500 Hz, 50 mm wells, 18 mm board)', () => {
	const design = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.018 });
	const sheet = diffuserBuildSheet(design, { heightMm: 1200 });
	const parts = [...sheet.parts, ...sheet.parts.map((p) => ({ ...p, quantity: p.quantity * 3 }))]; // four panels
	const result = cutList(parts, [PLY_AA, PLY_B, MDF_18], { kerfMm: KERF });

	it('lays out every part validly (placement, kerf, area, faces, grain)', () => {
		expectValidLayout(result, parts, KERF);
	});

	it('puts parts on the cheapest stock that has their faces: fins on AA, caps on B, hidden parts on MDF', () => {
		for (const s of result.sheets) {
			for (const p of s.placements) expect(s.stock.finishedFaces).toBe(p.part.finishedFaces);
		}
	});

	it('the naive one-piece-per-strip layout needs 14 sheets (by hand)', () => {
		// Four panels: 32 sides and fins 1164 × 196 on AA, 8 caps 494 × 196 and 20 well bottoms
		// 1164 × 50 on B, 4 backs 1200 × 494 (turnable on MDF) and 60 spacer blocks 50 wide on MDF.
		// With a 3.2 mm kerf after each strip, n strips of width w fit while n·(w + 3.2) ≤ 1223.2:
		// 6 of 196, 2 of 494, 22 of 50. AA: ⌈32/6⌉ = 6 sheets. B: 6 caps; 2 caps (398.8 mm) and
		// 15 wells (798 mm); 5 wells: 3 sheets. MDF: 2 backs; 2 backs (994.4 mm) and 4 blocks; 56
		// blocks on ⌈56/22⌉ = 3 more: 5 sheets. 6 + 3 + 5 = 14.
		expect(Object.fromEntries(naiveSheetCount(parts, [PLY_AA, PLY_B, MDF_18], KERF))).toEqual({ [PLY_AA.id]: 6, [PLY_B.id]: 3, [MDF_18.id]: 5 });
	});

	it('needs no more sheets than the parts area allows: 3 of AA, 1 of B, 1 of MDF (by hand)', () => {
		// AA: 32 · 1164 · 196 = 7 300 608 mm² on sheets of 2 976 800 mm² → at least 3. B: 8 · 494 · 196 +
		// 20 · 1164 · 50 = 1 938 592 mm²; MDF: 4 · 1200 · 494 + 50 · (12 · 178 + 24 · 129 + 24 · 80) =
		// 2 728 800 mm²: one sheet each at the least.
		expect(Object.fromEntries(result.perStock.map((p) => [p.stockId, p.sheets]))).toEqual({ [PLY_AA.id]: 3, [PLY_B.id]: 1, [MDF_18.id]: 1 });
		expect(result.sheetsAreaMm2).toBe(5 * SHEET_AREA);
	});

	it('reports usable offcuts at least the minimum size', () => {
		const r = cutList(parts, [PLY_AA, PLY_B, MDF_18], { kerfMm: KERF, minOffcutMm: 150 });
		expect(r.offcuts.length).toBeGreaterThan(0);
		for (const o of r.offcuts) {
			expect(o.lengthMm).toBeGreaterThanOrEqual(150);
			expect(o.widthMm).toBeGreaterThanOrEqual(150);
		}
	});

	it('draws each sheet with its parts labelled and offcuts hatched', () => {
		const finSheet = result.sheets.find((s) => s.stock.id === PLY_AA.id);
		if (!finSheet) throw new Error('expected a sheet of AA plywood');
		const svg = cuttingDiagramSvg(finSheet, { unit: 'in' });
		expect(svg.startsWith('<svg')).toBe(true);
		expect(svg).toContain('pattern id="offcut-hatch"');
		expect(svg.match(/fill="#e7dcc8"/g)?.length).toBe(finSheet.placements.length);
		expect(svg).toMatch(/>fin /);
		expect(svg).toContain('″');
	});
});

describe('cut list of random part lists (fixed seeds)', () => {
	const grains: Grain[] = ['along-length', 'along-width', 'none'];
	const stock: StockSheet[] = [
		PLY_AA,
		{ id: 'mdf-12', lengthMm: 2440, widthMm: 1220, thicknessMm: 12, finishedFaces: 2, grain: 'none' },
		{ id: 'ply-12-C', lengthMm: 2500, widthMm: 1250, thicknessMm: 12, finishedFaces: 0, grain: 'along-length' }
	];
	it.each(Array.from({ length: 12 }, (_, i) => 1000 + i))('seed %i', (seed) => {
		const rand = mulberry32(seed);
		// Lengths up to 1400 mm; a part with grain across it must still fit the 1220 mm sheet width.
		const parts: Part[] = Array.from({ length: 25 }, (_, i) => {
			const grain = grains[Math.floor(rand() * 3)];
			const length = Math.round(80 + rand() * 1400);
			return {
				name: `p${i}`,
				quantity: 1 + Math.floor(rand() * 3),
				lengthMm: grain === 'along-width' ? Math.min(length, 1200) : length,
				widthMm: Math.round(40 + rand() * 500),
				thicknessMm: rand() < 0.5 ? 18 : 12,
				finishedFaces: Math.floor(rand() * 3) as FinishedFaces,
				grain
			};
		});
		const result = cutList(parts, stock, { kerfMm: KERF });
		expectValidLayout(result, parts, KERF);
		const naive = naiveSheetCount(parts, stock, KERF);
		const naiveArea = stock.reduce((sum, s) => sum + (naive.get(s.id) ?? 0) * s.lengthMm * s.widthMm, 0);
		expect(result.sheetsAreaMm2).toBeLessThan(naiveArea);
	});
});

describe('small exact layouts', () => {
	const sheet: StockSheet = { id: 's', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 2, grain: 'along-length' };
	const part = (over: Partial<Part>): Part => ({ name: 'p', quantity: 1, lengthMm: 1000, widthMm: 100, thicknessMm: 18, finishedFaces: 0, grain: 'along-length', ...over });

	it('crosscuts along a strip one kerf apart, and rips the next strip one kerf below', () => {
		const r = cutList([part({ quantity: 3, lengthMm: 1200, widthMm: 600 })], [sheet], { kerfMm: 3 });
		const xs = r.sheets[0].placements.map((p) => [p.x, p.y]);
		expect(xs).toEqual([
			[0, 0],
			[1203, 0],
			[0, 603]
		]);
		expect(r.sheetsUsed).toBe(1);
	});

	it('turns a part without grain that only fits across the sheet', () => {
		const r = cutList([part({ lengthMm: 100, widthMm: 2000, grain: 'none' })], [sheet]);
		expect(r.sheets[0].placements[0].rotated).toBe(true);
	});

	it('a too-big part throws, even rotated', () => {
		expect(() => cutList([part({ lengthMm: 2500, widthMm: 1300, grain: 'none' })], [sheet])).toThrow(/bigger than any 18 mm sheet/);
	});

	it('a grain-locked part that would fit only rotated throws', () => {
		expect(() => cutList([part({ lengthMm: 100, widthMm: 2000, grain: 'along-length' })], [sheet])).toThrow(/bigger than any/);
	});

	it.each([
		[part({ thicknessMm: 12 }), /no stock sheet has that thickness/],
		[part({ finishedFaces: 2 }), /needs 2 finished face\(s\)/]
	])('refuses %o without suitable stock', (p, message) => {
		expect(() => cutList([p], [{ ...sheet, finishedFaces: 1 }])).toThrow(message);
	});

	it.each([
		[[part({ quantity: 0 })], [sheet], /quantity/],
		[[part({ lengthMm: -1 })], [sheet], /lengthMm/],
		[[part({})], [], /at least one stock sheet/],
		[[part({})], [sheet, sheet], /unique/]
	])('rejects bad input %#', (parts, stock, message) => {
		expect(() => cutList(parts, stock)).toThrow(message);
	});
});
