// Laying parts onto stock sheets as a table saw cuts them (two-stage guillotine):
// first rip the sheet into strips along its length, each as wide as its widest part, then
// crosscut each strip into parts. Parts go widest first into the strip that they fill best
// (best-fit decreasing), a new strip opening only when none has room.
import { checkPart, type FinishedFaces, type Part } from './parts';

export interface StockSheet {
	id: string;
	lengthMm: number;
	widthMm: number;
	thicknessMm: number;
	/** 2: good both sides (e.g. veneered both faces), 1: one good face, 0: utility grade. */
	finishedFaces: FinishedFaces;
	/** Grain along the sheet's length, or none (MDF). */
	grain: 'along-length' | 'none';
}

export interface CutListOptions {
	/** Saw kerf, mm. */
	kerfMm?: number;
	/** Leftovers at least this large in both directions are reported as offcuts, mm. */
	minOffcutMm?: number;
	/**
	 * Order pieces are laid in: widest first (default), or parts with more finished faces first
	 * (then widest), so the parts that show both faces fill the first sheets and those sheets
	 * alone need finishing on both sides.
	 */
	order?: 'widest-first' | 'finished-first';
}

export interface Rect {
	x: number;
	y: number;
	lengthMm: number;
	widthMm: number;
}

export interface Placement extends Rect {
	/** Index of the piece in the expanded parts list (one per unit of quantity). */
	pieceIndex: number;
	name: string;
	/** True when the part's length runs across the sheet (y) instead of along it (x). */
	rotated: boolean;
	part: Part;
}

export interface Strip {
	/** Start of the strip along the sheet: 0, or the panel's start when the sheet is broken down first. */
	x?: number;
	/** Length of sheet the strip runs along (the sheet's, or its panel's, length). */
	lengthMm?: number;
	y: number;
	widthMm: number;
	/** Length used by parts and the kerfs between them. */
	usedLengthMm: number;
}

export interface SheetLayout {
	stock: StockSheet;
	/** 1-based number of this sheet among the sheets of its stock. */
	sheetNumber: number;
	strips: Strip[];
	placements: Placement[];
	offcuts: Rect[];
	kerfMm: number;
	partsAreaMm2: number;
	/** Pieces the sheet is first cut into (halves, quarters) when the saw cannot take it whole. */
	panels?: Rect[];
}

export interface CutList {
	sheets: SheetLayout[];
	sheetsUsed: number;
	perStock: { stockId: string; sheets: number }[];
	partsAreaMm2: number;
	sheetsAreaMm2: number;
	/** Parts area / sheets area, %. */
	yieldPct: number;
	offcuts: (Rect & { stockId: string; sheetNumber: number })[];
	/** Pieces in the order placements refer to (pieceIndex). */
	pieces: Part[];
}

interface Orientation {
	dx: number;
	dy: number;
	rotated: boolean;
}

/** Orientations the grain allows on this stock, of those that fit the sheet at all. */
export function allowedOrientations(part: Part, stock: StockSheet): Orientation[] {
	const straight = { dx: part.lengthMm, dy: part.widthMm, rotated: false };
	const turned = { dx: part.widthMm, dy: part.lengthMm, rotated: true };
	let options: Orientation[];
	if (part.grain === 'none' || stock.grain === 'none') options = [straight, turned];
	else if (part.grain === 'along-length') options = [straight];
	else options = [turned];
	return options.filter((o) => o.dx <= stock.lengthMm && o.dy <= stock.widthMm);
}

function checkStock(stock: readonly StockSheet[]): void {
	if (stock.length === 0) throw new Error('give at least one stock sheet');
	for (const s of stock) {
		for (const key of ['lengthMm', 'widthMm', 'thicknessMm'] as const) {
			if (!(Number.isFinite(s[key]) && s[key] > 0)) throw new Error(`stock "${s.id}": ${key} must be a positive number of mm`);
		}
		if (![0, 1, 2].includes(s.finishedFaces)) throw new Error(`stock "${s.id}": finishedFaces must be 0, 1 or 2`);
	}
}

/**
 * Thicknesses this close are the same sheet: parts lists round to 0.1 mm, and imperial stock
 * (3/4″ = 19.05 mm) must still match a part drawn from it.
 */
export const SAME_THICKNESS_MM = 0.1;

export const sameThickness = (aMm: number, bMm: number): boolean => Math.abs(aMm - bMm) <= SAME_THICKNESS_MM + 1e-9;

/** The cheapest stock (fewest finished faces) that has the thickness, the faces and the size for the part. */
function stockFor(part: Part, stock: readonly StockSheet[]): StockSheet {
	const sameThicknessStock = stock.filter((s) => sameThickness(s.thicknessMm, part.thicknessMm));
	if (sameThicknessStock.length === 0) {
		throw new Error(`part "${part.name}" is ${part.thicknessMm} mm thick; no stock sheet has that thickness`);
	}
	const goodEnough = sameThicknessStock.filter((s) => s.finishedFaces >= part.finishedFaces);
	if (goodEnough.length === 0) {
		throw new Error(`part "${part.name}" needs ${part.finishedFaces} finished face(s); no ${part.thicknessMm} mm stock has that many`);
	}
	const fitting = goodEnough.filter((s) => allowedOrientations(part, s).length > 0);
	if (fitting.length === 0) {
		throw new Error(
			`part "${part.name}" (${part.lengthMm} × ${part.widthMm} mm) is bigger than any ${part.thicknessMm} mm sheet it may go on, even rotated where the grain allows`
		);
	}
	return [...fitting].sort((a, b) => a.finishedFaces - b.finishedFaces)[0];
}

interface OpenSheet {
	layout: SheetLayout;
	/** y where the next strip would start (after a kerf if strips exist). */
	nextStripY: number;
}

export function cutList(parts: readonly Part[], stock: readonly StockSheet[], options: CutListOptions = {}): CutList {
	const kerf = options.kerfMm ?? 3;
	const minOffcut = options.minOffcutMm ?? 100;
	if (!(kerf >= 0)) throw new Error(`kerf must be zero or positive, got ${kerf} mm`);
	if (!(minOffcut > 0)) throw new Error(`minimum offcut must be positive, got ${minOffcut} mm`);
	if (options.order !== undefined && options.order !== 'widest-first' && options.order !== 'finished-first') throw new Error(`unknown piece order "${String(options.order)}"`);
	checkStock(stock);
	parts.forEach(checkPart);
	if (new Set(stock.map((s) => s.id)).size !== stock.length) throw new Error('stock sheet ids must be unique');

	const pieces: Part[] = parts.flatMap((p) => Array.from({ length: p.quantity }, () => ({ ...p, quantity: 1 })));
	const groups = new Map<string, { stock: StockSheet; pieceIndexes: number[] }>();
	pieces.forEach((piece, i) => {
		const s = stockFor(piece, stock);
		const g = groups.get(s.id) ?? { stock: s, pieceIndexes: [] };
		g.pieceIndexes.push(i);
		groups.set(s.id, g);
	});

	const sheets: SheetLayout[] = [];
	const perStock: CutList['perStock'] = [];
	for (const { stock: s, pieceIndexes } of groups.values()) {
		const laid = packGroup(pieces, pieceIndexes, s, kerf, options.order ?? 'widest-first');
		laid.forEach((l) => (l.offcuts = offcutsOf(l, minOffcut)));
		sheets.push(...laid);
		perStock.push({ stockId: s.id, sheets: laid.length });
	}
	const partsAreaMm2 = pieces.reduce((sum, p) => sum + p.lengthMm * p.widthMm, 0);
	const sheetsAreaMm2 = sheets.reduce((sum, l) => sum + l.stock.lengthMm * l.stock.widthMm, 0);
	return {
		sheets,
		sheetsUsed: sheets.length,
		perStock,
		partsAreaMm2,
		sheetsAreaMm2,
		yieldPct: sheetsAreaMm2 > 0 ? (partsAreaMm2 / sheetsAreaMm2) * 100 : 0,
		offcuts: sheets.flatMap((l) => l.offcuts.map((o) => ({ ...o, stockId: l.stock.id, sheetNumber: l.sheetNumber }))),
		pieces
	};
}

function packGroup(pieces: readonly Part[], indexes: readonly number[], stock: StockSheet, kerf: number, order: 'widest-first' | 'finished-first'): SheetLayout[] {
	// Preferred orientation: the narrower side across the strip, so strips stay thin.
	const items = indexes.map((i) => {
		const options = allowedOrientations(pieces[i], stock);
		const preferred = [...options].sort((a, b) => a.dy - b.dy || b.dx - a.dx)[0];
		return { index: i, options, preferred };
	});
	const faces = (i: number) => (order === 'finished-first' ? pieces[i].finishedFaces : 0);
	items.sort((a, b) => faces(b.index) - faces(a.index) || b.preferred.dy - a.preferred.dy || b.preferred.dx - a.preferred.dx);

	const open: OpenSheet[] = [];
	const newSheet = (): OpenSheet => {
		const sheet: OpenSheet = {
			layout: { stock, sheetNumber: open.length + 1, strips: [], placements: [], offcuts: [], kerfMm: kerf, partsAreaMm2: 0 },
			nextStripY: 0
		};
		open.push(sheet);
		return sheet;
	};

	for (const item of items) {
		const part = pieces[item.index];
		// Best fit among existing strips: the placement that leaves the least length unused.
		let best: { sheet: OpenSheet; strip: Strip; o: Orientation; left: number } | null = null;
		for (const sheet of open) {
			for (const strip of sheet.layout.strips) {
				for (const o of item.options) {
					if (o.dy > strip.widthMm) continue;
					const start = strip.usedLengthMm === 0 ? 0 : strip.usedLengthMm + kerf;
					const left = stock.lengthMm - (start + o.dx);
					if (left < 0) continue;
					if (!best || left < best.left) best = { sheet, strip, o, left };
				}
			}
		}
		if (!best) {
			const o = item.preferred;
			let sheet = open.find((s) => s.nextStripY + o.dy <= stock.widthMm);
			if (!sheet) sheet = newSheet();
			const strip: Strip = { y: sheet.nextStripY, widthMm: o.dy, usedLengthMm: 0 };
			sheet.layout.strips.push(strip);
			sheet.nextStripY = strip.y + strip.widthMm + kerf;
			best = { sheet, strip, o, left: stock.lengthMm - o.dx };
		}
		const { sheet, strip, o } = best;
		const x = strip.usedLengthMm === 0 ? 0 : strip.usedLengthMm + kerf;
		sheet.layout.placements.push({ pieceIndex: item.index, name: part.name, x, y: strip.y, lengthMm: o.dx, widthMm: o.dy, rotated: o.rotated, part });
		sheet.layout.partsAreaMm2 += o.dx * o.dy;
		strip.usedLengthMm = x + o.dx;
	}
	return open.map((s) => s.layout);
}

/** Guillotine leftovers: above each part in its strip, the end of each strip, the sheet beyond the last strip. */
function offcutsOf(layout: SheetLayout, minOffcut: number): Rect[] {
	const { stock, kerfMm: kerf } = layout;
	const out: Rect[] = [];
	const keep = (r: Rect) => {
		if (r.lengthMm >= minOffcut && r.widthMm >= minOffcut) out.push(r);
	};
	for (const strip of layout.strips) {
		for (const p of layout.placements.filter((q) => q.y === strip.y)) {
			if (p.widthMm < strip.widthMm) {
				keep({ x: p.x, y: p.y + p.widthMm + kerf, lengthMm: p.lengthMm, widthMm: strip.widthMm - p.widthMm - kerf });
			}
		}
		const endX = strip.usedLengthMm + kerf;
		keep({ x: endX, y: strip.y, lengthMm: stock.lengthMm - endX, widthMm: strip.widthMm });
	}
	const last = layout.strips[layout.strips.length - 1];
	const restY = last ? last.y + last.widthMm + kerf : 0;
	keep({ x: 0, y: restY, lengthMm: stock.lengthMm, widthMm: stock.widthMm - restY });
	return out;
}
