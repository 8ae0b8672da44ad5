import { describe, expect, it } from 'vitest';
import { itemFormValues, NEW_ITEM } from '../../../src/lib/plans/form-values';
import type { ItemDraft } from '../../../src/lib/plans/proposals';
import { ITEM_KINDS, type ItemParams } from '../../../src/lib/plans/types';
import { itemFormSchema, itemParamsSchema, LIMITS } from '../../../src/lib/schemas/treatment';

const MM_PER_IN = 25.4; // exact, international inch (1959)
/** Inputs in inches are written to 1/32 in, so the round trip may move a length by up to half a step, 1/64 in. */
const INCH_TOLERANCE_MM = MM_PER_IN / 64;
/** Inputs in mm are written to 0.1 mm, so up to 0.05 mm (plus float slack). */
const MM_TOLERANCE = 0.05 + 1e-9;

const LENGTH_KEYS: Record<ItemParams['kind'], string[]> = {
	porous: ['thicknessMm', 'airGapMm', 'frameThicknessMm'],
	membrane: ['panelThicknessMm', 'cavityDepthMm', 'frameThicknessMm'],
	diffuser: ['wellWidthMm', 'finThicknessMm', 'boardThicknessMm']
};

function expectRoundTrip(draft: ItemDraft, unit: 'mm' | 'in') {
	const tol = unit === 'in' ? INCH_TOLERANCE_MM : MM_TOLERANCE;
	const parsed = itemFormSchema(unit).safeParse(itemFormValues(draft, unit));
	if (!parsed.success) throw new Error(parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
	const back = parsed.data;
	expect(back.label).toBe(draft.label);
	expect(back.surface).toBe(draft.surface);
	expect(back.quantity).toBe(draft.quantity);
	expect(back.unitPrice).toBe(draft.unitPrice);
	expect(back.problemBandId).toBe(draft.problemBandId);
	expect(back.why).toBe(draft.why);
	expect(Math.abs(back.heightMm - draft.heightMm)).toBeLessThanOrEqual(tol);
	// The schema gives a diffuser width 0: the stored width is its design's panel width.
	if (draft.params.kind === 'diffuser') expect(back.widthMm).toBe(0);
	else expect(Math.abs(back.widthMm - draft.widthMm)).toBeLessThanOrEqual(tol);
	expect(back.params.kind).toBe(draft.params.kind);
	const p = draft.params as unknown as Record<string, unknown>;
	const q = back.params as unknown as Record<string, unknown>;
	for (const key of LENGTH_KEYS[draft.params.kind]) expect(Math.abs((q[key] as number) - (p[key] as number)), key).toBeLessThanOrEqual(tol);
	// The fit into an opening holds lengths too: each within the unit's tolerance.
	const fit = p.fit as Record<string, number | null> | null;
	if (fit === null) expect(q.fit).toBeNull();
	else for (const [key, value] of Object.entries(fit)) {
		const got = (q.fit as Record<string, number | null>)[key];
		if (value === null) expect(got, key).toBeNull();
		else expect(Math.abs((got as number) - value), key).toBeLessThanOrEqual(tol);
	}
	for (const [key, value] of Object.entries(p)) {
		if (LENGTH_KEYS[draft.params.kind].includes(key) || key === 'maxDepthMm' || key === 'fit') continue;
		if (typeof value === 'number') expect(q[key] as number, key).toBeCloseTo(value, 9);
		else expect(q[key], key).toEqual(value);
	}
	if (draft.params.kind === 'diffuser') {
		const max = draft.params.maxDepthMm;
		if (max === null) expect(q.maxDepthMm).toBeNull();
		else expect(Math.abs((q.maxDepthMm as number) - max)).toBeLessThanOrEqual(tol);
	}
	// What comes back is a valid stored item.
	expect(itemParamsSchema.safeParse(back.params).success).toBe(true);
}

describe('form values → item form schema gives the item back', () => {
	it.each(ITEM_KINDS)('new %s item, in mm (exact to 0.05 mm)', (kind) => {
		expectRoundTrip(NEW_ITEM[kind], 'mm');
	});

	it.each(ITEM_KINDS)('new %s item, in inches (within 1/64 in)', (kind) => {
		expectRoundTrip(NEW_ITEM[kind], 'in');
	});

	it.each(ITEM_KINDS)('new %s item has valid stored parameters', (kind) => {
		expect(itemParamsSchema.safeParse(NEW_ITEM[kind].params).success).toBe(true);
	});

	const edited: ItemDraft[] = [
		{ ...NEW_ITEM.porous, surface: null, quantity: 7, widthMm: 595.5, heightMm: 1187.3, unitPrice: 41.5, problemBandId: 12, why: 'Kills the flutter, "mostly"', params: { ...(NEW_ITEM.porous.params as Extract<ItemParams, { kind: 'porous' }>), presetId: null, flowResistivity: 12_500, airGapMm: 47.5, withBack: true, fabricWrapped: false } },
		{ ...NEW_ITEM.membrane, params: { kind: 'membrane', panelThicknessMm: 9, panelStockId: 'mdf', cavityDepthMm: 212.4, cavityFill: 'empty', frameThicknessMm: 19, mounting: { method: 'french-cleat', notes: 'two screws per stud' }, fit: null } },
		{ ...NEW_ITEM.diffuser, params: { kind: 'diffuser', sequence: 'primitive-root', prime: 11, designFrequencyHz: 650, wellWidthMm: 42.5, finThicknessMm: 5.5, maxDepthMm: 180, boardThicknessMm: 12, construction: 'low-waste', mounting: { method: 'screwed-blocks', notes: '' }, fit: { widthTopMm: 600, widthBottomMm: 604.8, heightLeftMm: 1250, heightRightMm: 1244.6, diagonalMm: null, clearanceMm: 3.2 } } }
	];
	it.each(edited.flatMap((d) => [[d.params.kind, 'mm', d] as const, [d.params.kind, 'in', d] as const]))('an edited %s item, %s', (_kind, unit, draft) => {
		expectRoundTrip(draft, unit);
	});

	it('writes lengths as the form shows them: "600 mm", "23 5/8 in" (600/25.4 = 23.622 in → 756/32)', () => {
		expect(itemFormValues(NEW_ITEM.porous, 'mm').widthMm).toBe('600 mm');
		expect(itemFormValues(NEW_ITEM.porous, 'in').widthMm).toBe('23 5/8 in');
		expect(itemFormValues(NEW_ITEM.porous, 'in').airGapMm).toBe('0 in');
		expect(itemFormValues(NEW_ITEM.porous, 'mm').preset).toBe('rock-wool-40');
		expect(itemFormValues(NEW_ITEM.porous, 'mm').flowResistivityKPa).toBe('');
		expect(itemFormValues(NEW_ITEM.porous, 'mm').fabricWrapped).toBe('on');
		expect(itemFormValues(NEW_ITEM.porous, 'mm').withBack).toBe('');
		expect(itemFormValues(NEW_ITEM.diffuser, 'mm').maxDepthMm).toBe('');
	});
});

describe('inch lengths written at a limit are taken as the limit (inputs to 1/32″, messages to 1/16″)', () => {
	// A stored length at a limit, shown to an imperial user, must save again unchanged. 3000 mm
	// (the unit-side maximum) = 118.11 in is written 118 1/8 in = 3000.175 mm; 20 mm (the cavity
	// minimum) = 0.787 in is written 25/32 in = 19.84 mm. Both lie within 1/64 in of the limit.
	it.each([
		['height 3000 mm', { ...NEW_ITEM.porous, heightMm: LIMITS.unitSideMm.max }],
		['cavity depth 20 mm', { ...NEW_ITEM.membrane, params: { ...(NEW_ITEM.membrane.params as Extract<ItemParams, { kind: 'membrane' }>), cavityDepthMm: LIMITS.cavityDepthMm.min } }],
		['well width 300 mm', { ...NEW_ITEM.diffuser, params: { ...(NEW_ITEM.diffuser.params as Extract<ItemParams, { kind: 'diffuser' }>), wellWidthMm: LIMITS.wellWidthMm.max } }]
	] as [string, ItemDraft][])('%s round-trips in inches', (_name, draft) => {
		expectRoundTrip(draft, 'in');
	});
});
