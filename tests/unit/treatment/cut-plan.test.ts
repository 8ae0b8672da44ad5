import { describe, expect, it } from 'vitest';
import { cutList, type StockSheet } from '../../../src/lib/treatment/cutlist';
import { chooseBreakdown, cutPlan, fitsSaw, type CutPlan } from '../../../src/lib/treatment/cut-plan';
import type { FinishedFaces, Grain, Part } from '../../../src/lib/treatment/parts';
import { expectValidLayout } from './helpers/layout';

const KERF = 3;
/** 8 ft × 4 ft sheet, 2438.4 × 1219.2 mm (1 ft = 304.8 mm exactly). */
const PLY: StockSheet = { id: 'ply 1/2', lengthMm: 2438.4, widthMm: 1219.2, thicknessMm: 12, finishedFaces: 2, grain: 'along-length' };

const part = (name: string, quantity: number, lengthMm: number, widthMm: number, finishedFaces: FinishedFaces, grain: Grain = 'along-length'): Part => ({
	name,
	quantity,
	lengthMm,
	widthMm,
	thicknessMm: 12,
	finishedFaces,
	grain
});

/** The parts of two diffusers: fins that show both faces, strips and caps with one. */
const DIFFUSER_PARTS: Part[] = [
	part('side', 4, 1150, 60, 2),
	part('fin deep', 16, 1150, 210, 2),
	part('fin shallow', 4, 1150, 110, 2),
	part('well bottom', 14, 1150, 50, 1),
	part('cap', 4, 500, 210, 1),
	part('mounting block', 8, 100, 60, 0, 'none')
];

const everyPlacement = (plan: CutPlan) => plan.sheets.flatMap((s) => s.layout.placements);

describe('finishing before cutting and the cut order (common practice, no source)', () => {
	const plan = cutPlan(DIFFUSER_PARTS, [PLY], { kerfMm: KERF });

	it('is a valid two-stage guillotine layout of every piece', () => {
		expectValidLayout(plan.cutList, DIFFUSER_PARTS, KERF);
	});

	it('each sheet is finished on as many faces as its most demanding part shows', () => {
		for (const s of plan.sheets) expect(s.finishFaces).toBe(Math.max(...s.layout.placements.map((p) => p.part.finishedFaces)));
	});

	it('the double-finished parts fill the first sheets: no more sheets are finished both sides than those parts alone need', () => {
		const doubles = DIFFUSER_PARTS.filter((p) => p.finishedFaces === 2);
		const alone = cutList(doubles, [PLY], { kerfMm: KERF }).sheetsUsed;
		const doubleSheets = plan.sheets.filter((s) => s.finishFaces === 2);
		expect(doubleSheets.length).toBe(alone);
		// They come first, and every double-finished piece is on one of them.
		expect(plan.sheets.slice(0, alone).every((s) => s.finishFaces === 2)).toBe(true);
		for (const p of everyPlacement(plan).filter((q) => q.part.finishedFaces === 2)) {
			expect(doubleSheets.some((s) => s.layout.placements.includes(p))).toBe(true);
		}
	});

	it('on each sheet, the strips holding double-finished parts are ripped before any other', () => {
		for (const s of plan.sheets) {
			const rips = s.steps.filter((st) => st.kind === 'rip');
			const faces = rips.map((r) => (r.kind === 'rip' ? Math.max(...r.placements.map((p) => p.part.finishedFaces)) : 0));
			expect(faces).toEqual([...faces].sort((a, b) => b - a));
		}
	});

	it('numbers the steps 1, 2, 3 … per sheet: each strip ripped, then crosscut into its parts, every piece once', () => {
		for (const s of plan.sheets) {
			expect(s.steps.map((st) => st.n)).toEqual(s.steps.map((_, i) => i + 1));
			s.steps.forEach((st, i) => expect(st.kind).toBe(i % 2 === 0 ? 'rip' : 'crosscut'));
			const cut = s.steps.flatMap((st) => (st.kind === 'crosscut' ? st.placements : []));
			expect(new Set(cut.map((p) => p.pieceIndex))).toEqual(new Set(s.layout.placements.map((p) => p.pieceIndex)));
			expect(cut).toHaveLength(s.layout.placements.length);
		}
	});
});

describe('breakdown cuts under a saw limit', () => {
	it('a sheet the saw takes whole is not broken down', () => {
		const plan = cutPlan(DIFFUSER_PARTS, [PLY], { kerfMm: KERF, sawLimit: { lengthMm: 2500, widthMm: 1250 } });
		expect(plan.sheets.every((s) => s.breakdown === null && s.steps[0].kind === 'rip')).toBe(true);
	});

	it('a 1250 mm square limit halves each 8 × 4 ft sheet across its length: two 1217.7 × 1219.2 mm panels', () => {
		// Hand: (2438.4 − 3) / 2 = 1217.7 mm; 1219.2 ≤ 1250.
		const plan = cutPlan(DIFFUSER_PARTS, [PLY], { kerfMm: KERF, sawLimit: { lengthMm: 1250, widthMm: 1250 } });
		for (const s of plan.sheets) {
			expect(s.breakdown).toMatchObject({ along: 2, across: 1 });
			expect(s.breakdown!.panelLengthMm).toBeCloseTo(1217.7, 9);
			expect(s.steps[0]).toMatchObject({ n: 1, kind: 'breakdown', direction: 'crosscut' });
			if (s.steps[0].kind === 'breakdown') expect(s.steps[0].atMm).toBeCloseTo(1217.7, 9);
		}
	});

	it('a 1300 × 650 mm limit quarters the sheet (2 × 2), since the fins need 1150 mm along the grain', () => {
		// Hand: halves across the length are 1217.7 × 1219.2 (too wide for 650 either way); halves
		// along it 2438.4 × 608.1 (too long); four along 607.35 × 1219.2 fits turned but a 1150 mm
		// fin cannot lie along 607 mm of grain; 2 × 2 gives 1217.7 × 608.1, which fits.
		const b = chooseBreakdown(PLY, DIFFUSER_PARTS, { lengthMm: 1300, widthMm: 650 }, KERF);
		expect(b).toMatchObject({ along: 2, across: 2 });
		expect(b!.panelWidthMm).toBeCloseTo(608.1, 9);
	});

	it.each([
		[{ lengthMm: 1250, widthMm: 1250 }],
		[{ lengthMm: 1300, widthMm: 650 }],
		[{ lengthMm: 1250, widthMm: 700 }],
		[{ lengthMm: 2000, widthMm: 700 }]
	])('never hands the saw a piece larger than %o, and every part lies inside one panel', (limit) => {
		const plan = cutPlan(DIFFUSER_PARTS, [PLY], { kerfMm: KERF, sawLimit: limit });
		expect(plan.warnings).toEqual([]);
		expect(everyPlacement(plan)).toHaveLength(DIFFUSER_PARTS.reduce((n, p) => n + p.quantity, 0));
		for (const s of plan.sheets) {
			expect(s.breakdown).not.toBeNull();
			for (const panel of s.layout.panels!) {
				expect(fitsSaw(panel.lengthMm, panel.widthMm, limit)).toBe(true);
				expect(panel.x + panel.lengthMm).toBeLessThanOrEqual(PLY.lengthMm + 1e-9);
				expect(panel.y + panel.widthMm).toBeLessThanOrEqual(PLY.widthMm + 1e-9);
			}
			for (const p of s.layout.placements) {
				const inPanel = s.layout.panels!.filter((q) => p.x >= q.x - 1e-9 && p.y >= q.y - 1e-9 && p.x + p.lengthMm <= q.x + q.lengthMm + 1e-9 && p.y + p.widthMm <= q.y + q.widthMm + 1e-9);
				expect(inPanel).toHaveLength(1);
			}
			// The pieces after the breakdown steps are the panels.
			for (const st of s.steps.filter((x) => x.kind === 'breakdown')) {
				if (st.kind === 'breakdown') expect(fitsSaw(st.resultLengthMm, st.resultWidthMm, limit) || st.direction === 'crosscut').toBe(true);
			}
		}
	});

	it('warns, and leaves the sheet whole, when a part is longer than any piece the saw takes', () => {
		const plan = cutPlan(DIFFUSER_PARTS, [PLY], { kerfMm: KERF, sawLimit: { lengthMm: 900, widthMm: 900 } });
		expect(plan.warnings[0]).toMatch(/does not fit on any piece the saw can take/);
		expect(plan.sheets.every((s) => s.breakdown === null)).toBe(true);
	});

	it('refuses a limit that is not a positive length', () => {
		expect(() => cutPlan(DIFFUSER_PARTS, [PLY], { sawLimit: { lengthMm: 0, widthMm: 600 } })).toThrow(/saw limit/);
	});
});

// ---- Yield against the area lower bound and an exhaustive search -------------------------------

/**
 * The fewest sheets any two-stage guillotine layout (the cut list's own model: full-length strips
 * as wide as their widest part, kerf between strips and between parts) can use, by trying every
 * grouping of the pieces into strips and every allowed orientation, then packing the strips onto
 * sheets exactly. Written independently of the module.
 */
function exhaustiveSheets(pieces: readonly Part[], sheet: StockSheet, kerf: number): number {
	const orient = (p: Part): [number, number][] => {
		const both: [number, number][] = [[p.lengthMm, p.widthMm], [p.widthMm, p.lengthMm]];
		const allowed = p.grain === 'none' ? both : p.grain === 'along-length' ? [both[0]] : [both[1]];
		return allowed.filter(([l, w]) => l <= sheet.lengthMm && w <= sheet.widthMm);
	};
	let best = Infinity;
	/** Fewest sheets for strips of these widths: exact, by trying each strip on each open sheet. */
	const binCache = new Map<string, number>();
	const bins = (widths: number[]): number => {
		const sorted = [...widths].sort((a, b) => b - a);
		const key = sorted.join(',');
		const cached = binCache.get(key);
		if (cached !== undefined) return cached;
		let fewest = Infinity;
		const used: number[] = [];
		const place = (i: number) => {
			if (used.length >= fewest) return;
			if (i === sorted.length) {
				fewest = used.length;
				return;
			}
			const w = sorted[i];
			for (let b = 0; b < used.length; b++) {
				if (used[b] + kerf + w <= sheet.widthMm + 1e-9) {
					used[b] += kerf + w;
					place(i + 1);
					used[b] -= kerf + w;
				}
			}
			used.push(w);
			place(i + 1);
			used.pop();
		};
		place(0);
		binCache.set(key, fewest);
		return fewest;
	};
	const strips: { length: number; width: number }[] = [];
	const assign = (i: number) => {
		if (i === pieces.length) {
			best = Math.min(best, bins(strips.map((s) => s.width)));
			return;
		}
		for (const [l, w] of orient(pieces[i])) {
			for (const s of strips) {
				if (s.length + kerf + l <= sheet.lengthMm + 1e-9) {
					const before = { ...s };
					s.length += kerf + l;
					s.width = Math.max(s.width, w);
					assign(i + 1);
					Object.assign(s, before);
				}
			}
			strips.push({ length: l, width: w });
			assign(i + 1);
			strips.pop();
		}
	};
	assign(0);
	return best;
}

const SMALL_STOCK: StockSheet = { id: 'board', lengthMm: 1200, widthMm: 600, thicknessMm: 12, finishedFaces: 2, grain: 'along-length' };

/** Seeded generator (mulberry32), so the part sets are the same on every run. */
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

function randomParts(seed: number, count: number): Part[] {
	const rnd = mulberry32(seed);
	return Array.from({ length: count }, (_, i) =>
		part(`p${i}`, 1, Math.round(150 + rnd() * 900), Math.round(50 + rnd() * 350), (Math.floor(rnd() * 3) as FinishedFaces), rnd() < 0.3 ? 'none' : 'along-length')
	);
}

describe('yield against the area lower bound and an exhaustive search (≤ 8 parts)', () => {
	const rows: string[] = [];
	const cases = Array.from({ length: 10 }, (_, i) => ({ seed: 101 + i, count: 5 + (i % 4) }));

	it.each(cases)('seed $seed, $count parts: lower bound ≤ best possible ≤ the cut list', ({ seed, count }) => {
		const parts = randomParts(seed, count);
		const plan = cutPlan(parts, [SMALL_STOCK], { kerfMm: KERF });
		expectValidLayout(plan.cutList, parts, KERF);
		const best = exhaustiveSheets(parts, SMALL_STOCK, KERF);
		const area = parts.reduce((s, p) => s + p.lengthMm * p.widthMm, 0);
		const bound = Math.ceil(area / (SMALL_STOCK.lengthMm * SMALL_STOCK.widthMm));
		expect(plan.lowerBoundSheets).toBe(bound);
		expect(plan.yieldUpperBoundPct).toBeCloseTo((area / (bound * SMALL_STOCK.lengthMm * SMALL_STOCK.widthMm)) * 100, 9);
		expect(best).toBeGreaterThanOrEqual(bound);
		expect(plan.cutList.sheetsUsed).toBeGreaterThanOrEqual(best);
		// The greedy layout stays within one sheet of the best two-stage layout on these sets, and
		// never uses more than the widest-first order alone.
		expect(plan.cutList.sheetsUsed).toBeLessThanOrEqual(best + 1);
		const y = (sheets: number) => ((area / (sheets * SMALL_STOCK.lengthMm * SMALL_STOCK.widthMm)) * 100).toFixed(1);
		const widest = cutList(parts, [SMALL_STOCK], { kerfMm: KERF }).sheetsUsed;
		expect(widest).toBeGreaterThanOrEqual(best);
		expect(plan.cutList.sheetsUsed).toBeLessThanOrEqual(widest);
		rows.push(`seed ${seed}, ${count} parts: cut list ${plan.cutList.sheetsUsed} sheets (${y(plan.cutList.sheetsUsed)} %; widest-first order ${widest}), exhaustive ${best} (${y(best)} %), area bound ${bound} (${y(bound)} %)`);
	});

	it('prints the figures', () => {
		expect(rows).toHaveLength(cases.length);
		console.log(`Cut-list yield on 1200 × 600 mm stock, kerf ${KERF} mm:\n${rows.join('\n')}`);
	});
});
