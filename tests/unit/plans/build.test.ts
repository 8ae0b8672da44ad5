import { describe, expect, it } from 'vitest';
import {
	HEAVY_UNIT_KG,
	itemBuild,
	missingStock,
	planBuilds,
	planCost,
	planCutList,
	planParts,
	separateParts,
	stockSheetsOf
} from '../../../src/lib/plans/build';
import { expectValidLayout } from '../treatment/helpers/layout';
import { demoLikeItems, item, MEMBRANE, POROUS, QRD7, STOCK, STOCK_18_ONE_FACE, STOCK_18_UTILITY, STOCK_6_TWO_FACES } from './fixtures';

const KERF = 3;
const PLY = 600; // kg/m³, plywood (from memory, typical) — the build's sheet density

describe('unit weights (volume × density, hand arithmetic)', () => {
	it('porous frame 600 × 1200, 100 mm fibre + 50 mm gap, 18 mm frame: 5.71536 kg', () => {
		// Sides 2 × 1200 × 150 × 18, top/bottom 2 × (600 − 2·18 = 564) × 150 × 18 mm³, at 600 kg/m³:
		// (2·1200·150 + 2·564·150)·18 = 9 525 600 mm³ → 0.0095256 m³ × 600 = 5.71536 kg.
		const b = itemBuild(item({ widthMm: 600, heightMm: 1200, params: POROUS }));
		expect(b.unitWeightKg).toBeCloseTo(((2 * 1200 * 150 + 2 * 564 * 150) * 18 * PLY) / 1e9, 9);
		expect(b.unitWeightKg).toBeCloseTo(5.71536, 9);
		expect(b.heavy).toBe(false);
		expect(b.sheet.parts.map((p) => [p.name, p.quantity, p.lengthMm, p.widthMm, p.thicknessMm])).toEqual([
			['frame side', 2, 1200, 150, 18],
			['frame top/bottom', 2, 564, 150, 18]
		]);
	});

	it('a back adds 1200 × 600 × 18 mm³ × 600 kg/m³ = 7.776 kg', () => {
		const b = itemBuild(item({ params: { ...POROUS, withBack: true } }));
		expect(b.unitWeightKg).toBeCloseTo(5.71536 + 7.776, 9);
	});

	it('panel trap 600 × 1200 over 276 mm: 6 mm plywood panel + 18 mm box = 20.884 kg, heavy (above HEAVY_UNIT_KG)', () => {
		// Panel 1200·600·6 = 4 320 000; sides 2·1200·276·18 = 11 923 200; top/bottom 2·564·276·18 = 5 603 904;
		// back 1200·600·18 = 12 960 000 mm³ → 34 807 104 mm³ × 600 kg/m³ = 20.8842624 kg.
		const b = itemBuild(item({ params: MEMBRANE }));
		expect(b.unitWeightKg).toBeCloseTo(20.8842624, 9);
		expect(HEAVY_UNIT_KG).toBeLessThan(20.88);
		expect(b.heavy).toBe(true);
	});

	it('the membrane panel weighs with its own stock: MDF 750 kg/m³ adds 4 320 000 mm³ × 150 kg/m³ = 0.648 kg', () => {
		const ply = itemBuild(item({ params: MEMBRANE }));
		const mdf = itemBuild(item({ params: { ...MEMBRANE, panelStockId: 'mdf' } }));
		expect(mdf.unitWeightKg - ply.unitWeightKg).toBeCloseTo(0.648, 9);
	});

	it('QRD N = 7 at 500 Hz, 1200 mm high, 18 mm board, 6 mm fins: 17.522 kg', () => {
		// Depth 196 mm, width 398 mm, inner height 1200 − 2·18 = 1164 mm. Back 1200·398·18 = 8 596 800;
		// caps 2·398·196·18 = 2 808 288; sides + fins 8·1164·196·6 = 10 950 912; well bottoms for the
		// wells 0, 49, 49, 98, 98 mm deep: 5·1164·50·18 = 5 238 000; spacer blocks (gap − board),
		// 3 per strip (2 + ⌊1164/600⌋): (3·178 + 6·129 + 6·80)·50·18 = 1 609 200 mm³.
		// Sum 29 203 200 mm³ × 600 kg/m³ = 17.52192 kg.
		const b = itemBuild(item({ params: QRD7 }));
		expect(b.unitWeightKg).toBeCloseTo(17.52192, 6);
		expect(b.heavy).toBe(true);
	});
});

describe('parts of the whole plan', () => {
	it('planParts multiplies by the quantity and prefixes the item’s label', () => {
		const { builds } = planBuilds([item({ label: 'Side absorbers', quantity: 5, params: POROUS })]);
		expect(planParts(builds).map((p) => [p.name, p.quantity])).toEqual([
			['Side absorbers: frame side', 10],
			['Side absorbers: frame top/bottom', 10]
		]);
	});

	it('planBuilds reports an item that cannot be built instead of throwing', () => {
		const tooSmall = item({ id: 7, label: 'Tiny', widthMm: 30, params: POROUS });
		const { builds, errors } = planBuilds([tooSmall, item({ label: 'Fine', params: POROUS })]);
		expect(builds.map((b) => b.label)).toEqual(['Fine']);
		expect(errors).toEqual([{ itemId: 7, label: 'Tiny', message: expect.stringMatching(/too small for its own frame thickness/) }]);
	});

	it('stock rows become stock sheets keyed by their label', () => {
		expect(stockSheetsOf([STOCK_6_TWO_FACES])).toEqual([{ id: 'Birch ply 6 B/B', lengthMm: 2440, widthMm: 1220, thicknessMm: 6, finishedFaces: 2, grain: 'along-length' }]);
	});
});


/** Sheets a naive layout needs: each piece in its own full-length strip (narrow side across), strips stacked. */
function naiveSheetCount(pieces: readonly { lengthMm: number; widthMm: number }[], sheetWidthMm: number, kerf: number): number {
	let sheets = 0;
	let y = Infinity;
	for (const p of pieces) {
		const h = Math.min(p.lengthMm, p.widthMm);
		if (y + h > sheetWidthMm) {
			sheets++;
			y = 0;
		}
		y += h + kerf;
	}
	return sheets;
}

describe('cut list of a plan like the demo’s (traps, absorbers, clouds, three N = 7 diffusers)', () => {
	const items = demoLikeItems();
	const { builds, errors } = planBuilds(items);
	const parts = planParts(builds);
	const cut = planCutList(builds, STOCK, KERF);
	if (!cut.ok) throw new Error(cut.error);

	it('builds every item', () => {
		expect(errors).toEqual([]);
		expect(separateParts(builds)).toEqual([]); // the 500 Hz QRD has no well closer to the back than one board
	});

	it('places every piece exactly once, inside its sheet, no two overlapping, a kerf apart, area conserved', () => {
		expectValidLayout(cut.cutList, parts, KERF);
	});

	it('parts needing two good faces (diffuser fins and sides) only on the two-face 6 mm stock', () => {
		const twoFace = cut.cutList.sheets.flatMap((s) => s.placements.filter((p) => p.part.finishedFaces === 2).map((p) => s.stock.id));
		// 3 diffusers × (2 sides + 6 fins) = 24 pieces.
		expect(twoFace).toHaveLength(24);
		expect(new Set(twoFace)).toEqual(new Set([STOCK_6_TWO_FACES.label]));
	});

	it('hidden parts go on the utility sheet, one-face parts on the one-face sheet (cheapest that will do)', () => {
		for (const s of cut.cutList.sheets.filter((x) => x.stock.thicknessMm === 18)) {
			for (const p of s.placements) expect(s.stock.finishedFaces).toBe(p.part.finishedFaces);
		}
	});

	it('uses fewer sheets than one piece per strip on each stock', () => {
		for (const { stockId, sheets } of cut.cutList.perStock) {
			const pieces = cut.cutList.sheets.filter((s) => s.stock.id === stockId).flatMap((s) => s.placements.map((p) => p.part));
			expect(sheets).toBeLessThan(naiveSheetCount(pieces, 1220, KERF));
		}
		const sheetsArea = cut.cutList.sheetsUsed * 2440 * 1220;
		expect(cut.cutList.yieldPct).toBeCloseTo((cut.cutList.partsAreaMm2 / sheetsArea) * 100, 9);
	});
});

describe('when the parts cannot be laid out', () => {
	const { builds } = planBuilds(demoLikeItems());

	it('without items: a clear message', () => {
		expect(planCutList([], STOCK, KERF)).toEqual({ ok: false, error: 'The plan has no item to build yet.' });
	});

	it('without stock: asks for the sheets', () => {
		const r = planCutList(builds, [], KERF);
		expect(r.ok).toBe(false);
		expect(!r.ok && r.error).toMatch(/Add the sheets you buy/);
	});

	it('without 6 mm stock: the error and missingStock name the thickness and the faces it needs', () => {
		const stock = [STOCK_18_ONE_FACE, STOCK_18_UTILITY];
		const r = planCutList(builds, stock, KERF);
		expect(!r.ok && r.error).toMatch(/6 mm thick; no stock sheet has that thickness/);
		// Fins need 2 good faces, the membrane panel 1: the 6 mm stock must have 2.
		expect(missingStock(builds, stock)).toEqual([{ thicknessMm: 6, finishedFaces: 2 }]);
	});

	it('6 mm stock with one good face is not enough for the fins', () => {
		const stock = [STOCK_18_ONE_FACE, STOCK_18_UTILITY, { ...STOCK_6_TWO_FACES, finishedFaces: 1 as const }];
		expect(missingStock(builds, stock)).toEqual([{ thicknessMm: 6, finishedFaces: 2 }]);
		const r = planCutList(builds, stock, KERF);
		expect(!r.ok && r.error).toMatch(/needs 2 finished face\(s\); no 6 mm stock has that many/);
	});

	it('nothing missing with the full stock list', () => {
		expect(missingStock(builds, STOCK)).toEqual([]);
	});
});

describe('thin shims are cut separately', () => {
	// Primitive-root N = 7 (g = 3: wells 3, 2, 6, 4, 5, 1) at f0 = 2 kHz, 30 mm wells: d = s·λ0/14,
	// λ0 = 343/2000 m → 12.25 mm per step. The s = 5 well sits (6 − 5)·12.25 = 12.25 mm in front of
	// the back, less than the 18 mm board: a shim, not a strip on spacers.
	const prd = item({
		label: 'High diffuser',
		quantity: 2,
		heightMm: 600,
		params: { ...QRD7, sequence: 'primitive-root', designFrequencyHz: 2000, wellWidthMm: 30 }
	});
	const { builds } = planBuilds([prd]);

	it('separateParts lists the shim, 12.25 mm thick (0.1 mm rounding), one per unit', () => {
		const shims = separateParts(builds);
		expect(shims).toHaveLength(1);
		expect(shims[0].name).toBe('High diffuser: well shim');
		expect(shims[0].quantity).toBe(2);
		// Half the 0.1 mm rounding step, plus float slack (12.3 − 12.25 is 0.0500000000000007 in binary).
		expect(Math.abs(shims[0].thicknessMm - 12.25)).toBeLessThanOrEqual(0.05 + 1e-9);
		expect(shims[0].widthMm).toBe(30);
		expect(shims[0].lengthMm).toBe(600 - 2 * 18);
	});

	it('the shim stays off the sheets and out of the missing stock', () => {
		const cut = planCutList(builds, STOCK, KERF);
		if (!cut.ok) throw new Error(cut.error);
		expect(cut.cutList.sheets.flatMap((s) => s.placements).some((p) => /shim/.test(p.name))).toBe(false);
		expect(missingStock(builds, STOCK)).toEqual([]);
		expectValidLayout(cut.cutList, planParts(builds).filter((p) => !/shim/.test(p.name)), KERF);
	});
});

describe('cost', () => {
	const items = demoLikeItems(); // 4 × 24 + 10 × 41 + 4 × 46 + 3 × 12 = 96 + 410 + 184 + 36 = 726
	const { builds } = planBuilds(items);

	it('sums quantity × unit price and sheets used × sheet price', () => {
		const cut = planCutList(builds, STOCK, KERF);
		if (!cut.ok) throw new Error(cut.error);
		const used = (label: string) => cut.cutList.perStock.find((p) => p.stockId === label)?.sheets ?? 0;
		const sheets = used(STOCK_18_ONE_FACE.label) * 96 + used(STOCK_18_UTILITY.label) * 58 + used(STOCK_6_TWO_FACES.label) * 44;
		const cost = planCost(items, STOCK, cut);
		expect(cost.itemsTotal).toBe(726);
		expect(cost.sheetsTotal).toBe(sheets);
		expect(cost.total).toBe(726 + sheets);
		expect(cost.unpriced).toEqual([]);
		expect(cost.priced).toBe(true);
	});

	it('lists unpriced items and sheets and leaves them out of the totals', () => {
		const stock = [STOCK_18_ONE_FACE, STOCK_18_UTILITY, { ...STOCK_6_TWO_FACES, price: null }];
		const cut = planCutList(builds, stock, KERF);
		if (!cut.ok) throw new Error(cut.error);
		const withUnpriced = items.map((i) => (i.label === 'Rear diffuser' ? { ...i, unitPrice: null } : i));
		const cost = planCost(withUnpriced, stock, cut);
		expect(cost.itemsTotal).toBe(726 - 36);
		expect(cost.unpriced).toEqual(['Rear diffuser', 'sheet Birch ply 6 B/B']);
		const used = (label: string) => cut.cutList.perStock.find((p) => p.stockId === label)!.sheets;
		expect(cost.sheetsTotal).toBe(used(STOCK_18_ONE_FACE.label) * 96 + used(STOCK_18_UTILITY.label) * 58);
	});

	it('no sheets counted without a cut list; nothing priced → priced false', () => {
		const cost = planCost(
			items.map((i) => ({ ...i, unitPrice: null })),
			STOCK.map((s) => ({ ...s, price: null })),
			{ ok: false, error: 'x' }
		);
		expect(cost).toEqual({ itemsTotal: 0, sheetsTotal: 0, total: 0, unpriced: items.map((i) => i.label), priced: false });
	});
});
