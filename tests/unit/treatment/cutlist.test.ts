import { describe, expect, it } from 'vitest';
import { diffuserBuildSheet } from '../../../src/lib/treatment/buildsheet';
import { cutList, type CutList, type StockSheet } from '../../../src/lib/treatment/cutlist';
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


/** The naive layout: every piece in its own full-length strip, strips stacked down each sheet. */
function naiveSheetsArea(result: CutList, kerf: number): number {
	let area = 0;
	for (const { stockId } of result.perStock) {
		const sheet = result.sheets.find((s) => s.stock.id === stockId);
		if (!sheet) continue;
		const stock = sheet.stock;
		const heights = result.sheets.filter((s) => s.stock.id === stockId).flatMap((s) => s.placements.map((p) => Math.min(p.widthMm, p.lengthMm <= stock.widthMm && (p.part.grain === 'none' || stock.grain === 'none') ? p.lengthMm : p.widthMm)));
		let sheets = 0;
		let y = Infinity;
		for (const h of heights) {
			if (y + h > stock.widthMm) {
				sheets++;
				y = 0;
			}
			y += h + kerf;
		}
		area += sheets * stock.lengthMm * stock.widthMm;
	}
	return area;
}

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

	it('beats the naive one-part-per-strip layout', () => {
		expect(result.sheetsAreaMm2).toBeLessThan(naiveSheetsArea(result, KERF));
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
		expect(result.sheetsAreaMm2).toBeLessThan(naiveSheetsArea(result, KERF));
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
