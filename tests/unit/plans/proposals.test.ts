import { describe, expect, it } from 'vitest';
import { diffuserDesignOf, paramsAcoustics } from '../../../src/lib/plans/items';
import { proposalsForBand } from '../../../src/lib/plans/proposals';
import { itemParamsSchema } from '../../../src/lib/schemas/treatment';
import { C } from './fixtures';

// Problem bands of the three regions (region rule: common practice, no source): modal boom,
// low-mid decay, flutter echo.
const BANDS = [
	{ name: 'low', band: { id: 1, fLoHz: 36, fHiHz: 72 }, kinds: ['membrane-trap', 'porous-absorber'] },
	{ name: 'mid', band: { id: 2, fLoHz: 250, fHiHz: 500 }, kinds: ['porous-absorber'] },
	{ name: 'high', band: { id: 3, fLoHz: 2000, fHiHz: 5000 }, kinds: ['diffuser', 'porous-absorber'] }
] as const;

describe.each(BANDS)('proposals for the $name band', ({ name, band, kinds }) => {
	const result = proposalsForBand(band);

	it('sits in its region and proposes the expected kinds', () => {
		expect(result.region).toBe(name);
		expect(result.proposals.map((p) => p.proposal.kind)).toEqual([...kinds]);
	});

	it('each draft passes the stored-parameter schema and links the band', () => {
		for (const { draft } of result.proposals) {
			const parsed = itemParamsSchema.safeParse(draft.params);
			expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
			expect(draft.problemBandId).toBe(band.id);
			expect(draft.quantity).toBeGreaterThanOrEqual(1);
		}
	});

	it('each draft absorbs what its proposal promised (same coefficients within 1e-6: lengths are whole mm in both)', () => {
		for (const { proposal, draft } of result.proposals) {
			const coefficients = paramsAcoustics(draft.params).coefficients;
			expect(coefficients).toHaveLength(proposal.coefficients.length);
			coefficients.forEach((a, i) => expect(Math.abs(a - proposal.coefficients[i])).toBeLessThan(1e-6));
		}
	});

	it('each draft carries the proposal’s reason', () => {
		for (const { proposal, draft } of result.proposals) expect(draft.why).toBe(proposal.why);
	});
});

describe('drafts in detail', () => {
	it('the boom trap: 6 mm plywood over 276 mm of fibre-filled cavity, f0 ≈ 51 Hz (√(36·72) = 50.9 Hz)', () => {
		const trap = proposalsForBand(BANDS[0].band).proposals[0].draft;
		expect(trap.params).toEqual({ kind: 'membrane', panelThicknessMm: 6, panelStockId: 'plywood', cavityDepthMm: 276, cavityFill: 'porous', frameThicknessMm: 18, mounting: { method: 'none', notes: '' }, fit: null });
		expect(trap.label).toBe('Panel trap 50.9 Hz');
		const range = paramsAcoustics(trap.params).actionRangeHz!;
		expect(Math.sqrt(range.loHz * range.hiHz)).toBeCloseTo(Math.sqrt(36 * 72), 0);
	});

	it('the flutter diffuser: wells w ≤ c/(2·5000) rounded down to 5 mm = 30 mm, panel 7·30 + 8·6 = 258 mm wide', () => {
		const draft = proposalsForBand(BANDS[2].band).proposals[0].draft;
		if (draft.params.kind !== 'diffuser') throw new Error('expected a diffuser');
		expect(C / (2 * 5000)).toBeCloseTo(0.0343, 12); // → 30 mm after rounding down to 5 mm
		expect(draft.params.wellWidthMm).toBe(30);
		expect(draft.params.designFrequencyHz).toBe(2000);
		expect(draft.widthMm).toBe(258);
		expect(diffuserDesignOf(draft.params).panelWidthM * 1000).toBeCloseTo(258, 9);
	});

	it('a porous draft keeps the planner’s layer in mm and a back when it has a gap', () => {
		const porous = proposalsForBand(BANDS[1].band).proposals[0];
		if (porous.proposal.kind !== 'porous-absorber' || porous.draft.params.kind !== 'porous') throw new Error('expected porous');
		expect(porous.draft.params.thicknessMm).toBeCloseTo(porous.proposal.layer.thicknessM * 1000, 9);
		expect(porous.draft.params.airGapMm).toBeCloseTo(porous.proposal.layer.airGapM * 1000, 9);
		expect(porous.draft.params.flowResistivity).toBe(porous.proposal.layer.flowResistivity);
		expect(porous.draft.params.withBack).toBe(porous.proposal.layer.airGapM > 0);
	});
});

describe('a diffuser draft keeps the planner’s depth limit', () => {
	// With diffuserMaxDepthM = 30 mm the planner raises f0 so the deepest well is 30 mm
	// (f0 = s_max·c/(2N·d) = 4·343/(14·0.03) = 3267 Hz). The draft built from that proposal must
	// describe the same panel; it keeps the requested 2 kHz and no depth limit, so its deepest well
	// is 4·(343/2000)/14 = 49 mm, deeper than the room allows.
	const { proposal, draft } = proposalsForBand(BANDS[2].band, { diffuserMaxDepthM: 0.03 }).proposals[0];

	it('the proposal honours the limit (precondition)', () => {
		if (proposal.kind !== 'diffuser') throw new Error('expected a diffuser');
		expect(proposal.diffuser.deepestWellM).toBeCloseTo(0.03, 12);
		expect(proposal.diffuser.designFrequencyHz).toBeCloseTo((4 * C) / (14 * 0.03), 9);
	});

	it('the draft’s design is no deeper than the limit', () => {
		if (draft.params.kind !== 'diffuser') throw new Error('expected a diffuser');
		expect(diffuserDesignOf(draft.params).deepestWellM * 1000).toBeLessThanOrEqual(30 + 1e-6);
	});
});
