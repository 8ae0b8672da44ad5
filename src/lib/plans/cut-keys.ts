// Short keys for the pieces on the cutting diagrams: one number per distinct part (same name and
// size), so a narrow strip carries "7" and the legend beside the sheet says what 7 is.
import type { CutList, Placement } from '../treatment/cutlist';

export interface PieceKey {
	key: string;
	name: string;
	lengthMm: number;
	widthMm: number;
	thicknessMm: number;
	/** Pieces with this key over all sheets. */
	count: number;
}

const identity = (p: Pick<Placement, 'name' | 'part'>) => `${p.name}|${p.part.lengthMm}|${p.part.widthMm}|${p.part.thicknessMm}`;

/** Keys numbered in cutting order (sheet by sheet, strip by strip). */
export function pieceKeys(cut: CutList): { keyOf: (p: Placement) => string; legend: PieceKey[] } {
	const byIdentity = new Map<string, PieceKey>();
	for (const sheet of cut.sheets) {
		for (const p of sheet.placements) {
			const id = identity(p);
			const known = byIdentity.get(id);
			if (known) known.count++;
			else byIdentity.set(id, { key: String(byIdentity.size + 1), name: p.name, lengthMm: p.part.lengthMm, widthMm: p.part.widthMm, thicknessMm: p.part.thicknessMm, count: 1 });
		}
	}
	return { keyOf: (p) => byIdentity.get(identity(p))?.key ?? '?', legend: [...byIdentity.values()] };
}

/** The legend rows for one sheet: each key on it with how many of its pieces the sheet holds. */
export function sheetLegend(sheet: CutList['sheets'][number], keys: ReturnType<typeof pieceKeys>): (PieceKey & { onSheet: number })[] {
	const counts = new Map<string, number>();
	for (const p of sheet.placements) counts.set(keys.keyOf(p), (counts.get(keys.keyOf(p)) ?? 0) + 1);
	return keys.legend.filter((k) => counts.has(k.key)).map((k) => ({ ...k, onSheet: counts.get(k.key)! }));
}
