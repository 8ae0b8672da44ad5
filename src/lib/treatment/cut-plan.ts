// From the cut list to the order of work at the saw: which faces of each sheet to finish before
// cutting (from the faces its parts need), breakdown cuts that bring a whole sheet down to what
// the saw can take (halves, quarters), then rip and crosscut — as numbered steps per sheet.
//
// The builder's practice this follows (common practice, no source): parts deep inside a
// diffuser cannot be reached with a brush afterwards, so sheets are finished before cutting; the
// parts that show both faces are cut first from the sheet finished on both sides, the rest from
// what is left and from sheets finished on one side; a sheet too big for one person at the saw is
// halved first.
import { allowedOrientations, cutList, type CutList, type CutListOptions, type Placement, type Rect, type SheetLayout, type StockSheet, type Strip } from './cutlist';
import type { FinishedFaces, Part } from './parts';

/** The largest piece the saw (and the person at it) can handle, mm; either way round. */
export interface SawLimit {
	lengthMm: number;
	widthMm: number;
}

export const fitsSaw = (lengthMm: number, widthMm: number, limit: SawLimit): boolean =>
	(lengthMm <= limit.lengthMm + 1e-9 && widthMm <= limit.widthMm + 1e-9) || (lengthMm <= limit.widthMm + 1e-9 && widthMm <= limit.lengthMm + 1e-9);

/** A stock sheet cut into `along` × `across` equal panels before anything else. */
export interface Breakdown {
	stockId: string;
	/** Panels along the sheet's length (crosscuts + 1) and across its width (rips + 1). */
	along: number;
	across: number;
	panelLengthMm: number;
	panelWidthMm: number;
}

const MAX_SPLIT = 4;

/**
 * The fewest equal panels (1 … 4 each way) that the saw can take and that every piece still fits
 * on; null when no such breakdown exists (a part longer than the saw takes).
 */
export function chooseBreakdown(stock: StockSheet, pieces: readonly Part[], limit: SawLimit, kerfMm: number): Breakdown | null {
	const options: Breakdown[] = [];
	for (let along = 1; along <= MAX_SPLIT; along++) {
		for (let across = 1; across <= MAX_SPLIT; across++) {
			const panelLengthMm = (stock.lengthMm - (along - 1) * kerfMm) / along;
			const panelWidthMm = (stock.widthMm - (across - 1) * kerfMm) / across;
			options.push({ stockId: stock.id, along, across, panelLengthMm, panelWidthMm });
		}
	}
	// Fewest panels first; of those, the squarer panel (the larger of its short sides).
	options.sort((a, b) => a.along * a.across - b.along * b.across || Math.min(b.panelLengthMm, b.panelWidthMm) - Math.min(a.panelLengthMm, a.panelWidthMm));
	return (
		options.find((o) => {
			if (!fitsSaw(o.panelLengthMm, o.panelWidthMm, limit)) return false;
			const panel = { ...stock, lengthMm: o.panelLengthMm, widthMm: o.panelWidthMm };
			return pieces.every((p) => allowedOrientations(p, panel).length > 0);
		}) ?? null
	);
}

export type CutStep =
	| { n: number; kind: 'breakdown'; direction: 'crosscut' | 'rip'; /** From the sheet's end or edge. */ atMm: number; pieces: number; resultLengthMm: number; resultWidthMm: number }
	| { n: number; kind: 'rip'; panel: number; stripWidthMm: number; placements: Placement[] }
	| { n: number; kind: 'crosscut'; panel: number; placements: Placement[] };

export interface PlannedSheet {
	layout: SheetLayout;
	/** Faces to finish before cutting: the most any of its parts shows. */
	finishFaces: FinishedFaces;
	breakdown: Breakdown | null;
	steps: CutStep[];
}

export interface CutPlan {
	cutList: CutList;
	sheets: PlannedSheet[];
	/** Sheets the saw cannot be given whole and no breakdown fits, with why. */
	warnings: string[];
	/** Fewest sheets any layout could use: per stock, the parts' area over a sheet's (kerf ignored). */
	lowerBoundSheets: number;
	/** Parts area over the area of lowerBoundSheets: the yield no layout can beat, %. */
	yieldUpperBoundPct: number;
}

export interface CutPlanOptions extends Omit<CutListOptions, 'order'> {
	sawLimit?: SawLimit | null;
}

function checkLimit(limit: SawLimit): void {
	for (const v of [limit.lengthMm, limit.widthMm]) if (!(Number.isFinite(v) && v > 0)) throw new Error(`the saw limit must be positive lengths, got ${v} mm`);
}

const maxFaces = (placements: readonly Placement[]): FinishedFaces => placements.reduce((m, p) => Math.max(m, p.part.finishedFaces) as FinishedFaces, 0 as FinishedFaces);

/** Strips of one panel (or of the whole sheet) with their parts; double-finished first, then from the edge. */
function stripsOf(layout: SheetLayout, panel: Rect): { strip: Strip; placements: Placement[] }[] {
	const inside = (x: number, y: number) => x >= panel.x - 1e-6 && x < panel.x + panel.lengthMm - 1e-6 && y >= panel.y - 1e-6 && y < panel.y + panel.widthMm - 1e-6;
	return layout.strips
		.filter((s) => inside(s.x ?? 0, s.y))
		.map((strip) => ({ strip, placements: layout.placements.filter((p) => p.y === strip.y && inside(p.x, p.y)).sort((a, b) => a.x - b.x) }))
		.sort((a, b) => maxFaces(b.placements) - maxFaces(a.placements) || a.strip.y - b.strip.y);
}

function stepsOf(layout: SheetLayout, breakdown: Breakdown | null): CutStep[] {
	const steps: CutStep[] = [];
	let n = 0;
	const { stock, kerfMm: kerf } = layout;
	if (breakdown && breakdown.along * breakdown.across > 1) {
		for (let c = 1; c < breakdown.along; c++) {
			steps.push({ n: ++n, kind: 'breakdown', direction: 'crosscut', atMm: c * breakdown.panelLengthMm + (c - 1) * kerf, pieces: breakdown.along, resultLengthMm: breakdown.panelLengthMm, resultWidthMm: stock.widthMm });
		}
		for (let r = 1; r < breakdown.across; r++) {
			steps.push({ n: ++n, kind: 'breakdown', direction: 'rip', atMm: r * breakdown.panelWidthMm + (r - 1) * kerf, pieces: breakdown.along * breakdown.across, resultLengthMm: breakdown.panelLengthMm, resultWidthMm: breakdown.panelWidthMm });
		}
	}
	const panels = layout.panels ?? [{ x: 0, y: 0, lengthMm: stock.lengthMm, widthMm: stock.widthMm }];
	panels.forEach((panel, i) => {
		for (const { strip, placements } of stripsOf(layout, panel)) {
			if (placements.length === 0) continue;
			steps.push({ n: ++n, kind: 'rip', panel: i + 1, stripWidthMm: strip.widthMm, placements });
			steps.push({ n: ++n, kind: 'crosscut', panel: i + 1, placements });
		}
	});
	return steps;
}

/** Lays the local layouts of panels onto whole sheets, `along` × `across` panels a sheet. */
function assemblePanels(panels: readonly SheetLayout[], stock: StockSheet, b: Breakdown, kerf: number, globalIndex: readonly number[]): SheetLayout[] {
	const perSheet = b.along * b.across;
	const sheets: SheetLayout[] = [];
	for (let first = 0; first < panels.length; first += perSheet) {
		const sheet: SheetLayout = { stock, sheetNumber: sheets.length + 1, strips: [], placements: [], offcuts: [], kerfMm: kerf, partsAreaMm2: 0, panels: [] };
		for (let j = 0; j < perSheet; j++) {
			const x0 = (j % b.along) * (b.panelLengthMm + kerf);
			const y0 = Math.floor(j / b.along) * (b.panelWidthMm + kerf);
			const rect = { x: x0, y: y0, lengthMm: b.panelLengthMm, widthMm: b.panelWidthMm };
			sheet.panels!.push(rect);
			const local = panels[first + j];
			if (!local) {
				sheet.offcuts.push(rect); // a whole panel left over
				continue;
			}
			sheet.strips.push(...local.strips.map((s) => ({ ...s, x: x0, lengthMm: b.panelLengthMm, y: s.y + y0 })));
			sheet.placements.push(...local.placements.map((p) => ({ ...p, x: p.x + x0, y: p.y + y0, pieceIndex: globalIndex[p.pieceIndex] })));
			sheet.offcuts.push(...local.offcuts.map((o) => ({ ...o, x: o.x + x0, y: o.y + y0 })));
			sheet.partsAreaMm2 += local.partsAreaMm2;
		}
		sheets.push(sheet);
	}
	return sheets;
}

const doubleSheets = (c: CutList) => c.sheets.filter((l) => maxFaces(l.placements) === 2).length;

/**
 * The parts laid with those that show both faces first, so they fill the fewest sheets — unless
 * laying them widest first saves a sheet (or a double-finished one) — with each stock's sheets
 * in finishing order: both faces, one, none.
 */
function layout(parts: readonly Part[], stock: readonly StockSheet[], options: CutListOptions): CutList {
	const first = cutList(parts, stock, { ...options, order: 'finished-first' });
	const widest = cutList(parts, stock, { ...options, order: 'widest-first' });
	const chosen = widest.sheetsUsed < first.sheetsUsed || (widest.sheetsUsed === first.sheetsUsed && doubleSheets(widest) < doubleSheets(first)) ? widest : first;
	const sheets: SheetLayout[] = [];
	for (const { stockId } of chosen.perStock) {
		const own = chosen.sheets.filter((l) => l.stock.id === stockId);
		const ordered = own.map((l, i) => ({ l, i })).sort((a, b) => maxFaces(b.l.placements) - maxFaces(a.l.placements) || a.i - b.i);
		sheets.push(...ordered.map(({ l }, i) => ({ ...l, sheetNumber: i + 1 })));
	}
	return { ...chosen, sheets, offcuts: sheets.flatMap((l) => l.offcuts.map((o) => ({ ...o, stockId: l.stock.id, sheetNumber: l.sheetNumber }))) };
}

/**
 * The cut list laid with the parts that show both faces first, each sheet's finishing, the
 * breakdown the saw limit asks for, and the numbered cuts of every sheet.
 */
export function cutPlan(parts: readonly Part[], stock: readonly StockSheet[], options: CutPlanOptions = {}): CutPlan {
	const kerf = options.kerfMm ?? 3;
	const listOptions: CutListOptions = { kerfMm: kerf, minOffcutMm: options.minOffcutMm };
	const base = layout(parts, stock, listOptions);
	const limit = options.sawLimit ?? null;
	if (limit) checkLimit(limit);
	const warnings: string[] = [];
	const sheets: SheetLayout[] = [];
	const breakdowns = new Map<string, Breakdown | null>();
	for (const { stockId } of base.perStock) {
		const own = base.sheets.filter((s) => s.stock.id === stockId);
		const s = own[0].stock;
		if (!limit || fitsSaw(s.lengthMm, s.widthMm, limit)) {
			breakdowns.set(stockId, null);
			sheets.push(...own);
			continue;
		}
		const placed = own.flatMap((l) => l.placements);
		const b = chooseBreakdown(s, placed.map((p) => p.part), limit, kerf);
		breakdowns.set(stockId, b);
		if (!b) {
			const longest = [...placed].sort((a, c) => Math.max(c.lengthMm, c.widthMm) - Math.max(a.lengthMm, a.widthMm))[0];
			warnings.push(`${s.id}: "${longest.name}" does not fit on any piece the saw can take; have the sheet cut down (a track saw, or at the yard) before ripping.`);
			sheets.push(...own);
			continue;
		}
		const panel = { ...s, lengthMm: b.panelLengthMm, widthMm: b.panelWidthMm };
		const local = layout(placed.map((p) => p.part), [panel], listOptions);
		sheets.push(...assemblePanels(local.sheets, s, b, kerf, placed.map((p) => p.pieceIndex)));
	}
	const sheetsAreaMm2 = sheets.reduce((sum, l) => sum + l.stock.lengthMm * l.stock.widthMm, 0);
	const perStock = base.perStock.map((p) => ({ stockId: p.stockId, sheets: sheets.filter((l) => l.stock.id === p.stockId).length }));
	const cut: CutList = {
		...base,
		sheets,
		sheetsUsed: sheets.length,
		perStock,
		sheetsAreaMm2,
		yieldPct: sheetsAreaMm2 > 0 ? (base.partsAreaMm2 / sheetsAreaMm2) * 100 : 0,
		offcuts: sheets.flatMap((l) => l.offcuts.map((o) => ({ ...o, stockId: l.stock.id, sheetNumber: l.sheetNumber })))
	};
	let lowerBoundSheets = 0;
	let lowerBoundArea = 0;
	for (const { stockId } of perStock) {
		const own = sheets.filter((l) => l.stock.id === stockId);
		const area = own[0].stock.lengthMm * own[0].stock.widthMm;
		const partsArea = own.reduce((sum, l) => sum + l.placements.reduce((a, p) => a + p.lengthMm * p.widthMm, 0), 0);
		const bound = Math.ceil(partsArea / area - 1e-9);
		lowerBoundSheets += bound;
		lowerBoundArea += bound * area;
	}
	return {
		cutList: cut,
		sheets: sheets.map((layout) => {
			const b = breakdowns.get(layout.stock.id) ?? null;
			return { layout, finishFaces: maxFaces(layout.placements), breakdown: b, steps: stepsOf(layout, b) };
		}),
		warnings,
		lowerBoundSheets,
		yieldUpperBoundPct: lowerBoundArea > 0 ? (base.partsAreaMm2 / lowerBoundArea) * 100 : 0
	};
}
