import { describe, expect, it } from 'vitest';
import { itemBuild, measuredThicknessOf, planCutList } from '../../../src/lib/plans/build';
import { thicknessText } from '../../../src/lib/plans/format';
import type { PlanItem, StockSheetRow } from '../../../src/lib/plans/types';

// A "1/2 in" sheet is commonly thinner than 12.7 mm (common practice, no source): the caliper
// figure here, 11.9 mm, is the kind a builder enters; 1/2 in = 12.7 mm exactly (1 in = 25.4 mm).
const HALF_INCH_PLY: StockSheetRow = { id: 1, label: 'Ply 1/2 in', lengthMm: 2438.4, widthMm: 1219.2, thicknessMm: 11.9, nominalThicknessMm: 12.7, finishedFaces: 2, grain: 'along-length', price: null };

const diffuser = (construction: 'full-depth' | 'low-waste'): PlanItem => ({
	id: 1,
	label: 'Diffuser',
	surface: 'back',
	quantity: 2,
	widthMm: 0,
	heightMm: 1200,
	unitPrice: null,
	problemBandId: null,
	why: null,
	params: { kind: 'diffuser', sequence: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthMm: 50, finThicknessMm: 12.7, maxDepthMm: null, boardThicknessMm: 12.7, construction, mounting: { method: 'none', notes: '' }, fit: null }
});

describe('actual versus nominal thickness', () => {
	it('a thickness typed at the nominal figure is cut at the measured one; others stay as typed', () => {
		const measured = measuredThicknessOf([HALF_INCH_PLY]);
		expect(measured(12.7)).toBe(11.9);
		expect(measured(12.75)).toBe(11.9); // within 0.1 mm is the same sheet
		expect(measured(18)).toBe(18);
		expect(measuredThicknessOf([{ ...HALF_INCH_PLY, nominalThicknessMm: null }])(12.7)).toBe(12.7);
	});

	it('fin positions and the panel width use the measured thickness; the well width stays 50 mm', () => {
		const b = itemBuild(diffuser('low-waste'), { stock: [HALF_INCH_PLY], kerfMm: 3 });
		const g = b.sheet.diffuser!.geometry;
		// Hand: fin i at i·(50 + 11.9) mm; W = 7·50 + 8·11.9 = 445.2 mm (nominal: 451.6 mm).
		g.fins.forEach((f, i) => expect(f.xMm).toBeCloseTo(i * 61.9, 9));
		expect(g.panelWidthMm).toBeCloseTo(445.2, 9);
		expect(b.sheet.parts.every((p) => p.thicknessMm === 11.9)).toBe(true);
		expect(b.thickness).toEqual([{ nominalMm: 12.7, measuredMm: 11.9 }]);
	});

	it('flags the parts whose fit changes by more than the kerf: the caps (8 × 0.8 = 6.4 mm), not the fins (0.8 mm)', () => {
		// Hand: caps span the panel width, 451.6 → 445.2 mm (−6.4 mm > 3 mm kerf). Fins and strips run
		// between the caps, 1200 − 2·12.7 = 1174.6 → 1200 − 2·11.9 = 1176.2 mm (+1.6 mm); fin depths
		// change by the 0.8 mm of the strip they carry.
		const b = itemBuild(diffuser('low-waste'), { stock: [HALF_INCH_PLY], kerfMm: 3 });
		expect(b.fitChanges.map((f) => f.part)).toEqual(['top/bottom cap']);
		expect(b.fitChanges[0].changeMm).toBeCloseTo(-6.4, 9);
		// With a 1.5 mm kerf the 1.6 mm longer fins and strips are flagged too.
		const fine = itemBuild(diffuser('low-waste'), { stock: [HALF_INCH_PLY], kerfMm: 1.5 });
		expect(fine.fitChanges.some((f) => f.part === 'side' && Math.abs(f.changeMm - 1.6) < 1e-9)).toBe(true);
	});

	it('the cut list lays the measured parts on the sheet that measures so', () => {
		const b = itemBuild(diffuser('full-depth'), { stock: [HALF_INCH_PLY], kerfMm: 3 });
		const cut = planCutList([b], [HALF_INCH_PLY], 3);
		expect(cut.ok).toBe(true);
		if (cut.ok) expect(cut.cutList.sheets.every((s) => s.stock.thicknessMm === 11.9)).toBe(true);
		// Without the measured figure, a 12.7 mm part finds no 11.9 mm sheet.
		const nominal = itemBuild(diffuser('full-depth'));
		expect(planCutList([nominal], [{ ...HALF_INCH_PLY, nominalThicknessMm: null }], 3)).toMatchObject({ ok: false, error: expect.stringMatching(/no stock sheet has that thickness/) });
	});
});

describe('thicknesses in inches, to 1/32 in (exact fractions of 25.4 mm)', () => {
	it.each([
		[(15 / 32) * 25.4, '15/32″'], // 11.90625 mm
		[11.906, '15/32″'], // as stored to 0.001 mm: 0.46874 in, 14.9997/32
		[12.7, '1/2″'],
		[(23 / 32) * 25.4, '23/32″'], // "3/4 in" ply that measures 18.26 mm
		[19.05, '3/4″'],
		[(1 + 1 / 32) * 25.4, '1 1/32″']
	])('%f mm is %s', (mm, text) => {
		expect(thicknessText(mm, 'in')).toBe(text);
	});
	it('and in mm to 0.1', () => {
		expect(thicknessText(11.906, 'mm')).toBe('11.9 mm');
	});
});
