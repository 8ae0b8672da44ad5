import { describe, expect, it } from 'vitest';
import { CLEAT_INSET_MM, heavyCaution, mountingPlan, SCREW_SPACING_MM } from '../../../src/lib/treatment/mounting';
import { itemBuild, HEAVY_UNIT_KG } from '../../../src/lib/plans/build';
import type { PlanItem } from '../../../src/lib/plans/types';

// Sizes and spacings are common workshop practice, no source: cleats 40 mm in from each side,
// screws at most 400 mm apart (a stud spacing), one block top and bottom per anchor.
describe('removable mounting', () => {
	it('a cleat pair 40 mm in from each side, screws at both ends at most 400 mm apart: 600 mm panel → 520 mm cleats, 3 screws', () => {
		const m = mountingPlan('french-cleat', { widthMm: 600, heightMm: 1200, boardMm: 18 });
		expect(CLEAT_INSET_MM).toBe(40);
		expect(m.parts.map((p) => [p.name, p.lengthMm])).toEqual([['wall cleat', 520], ['panel cleat', 520], ['bottom spacer', 520]]);
		// Hand: ⌈520/400⌉ + 1 = 3 screws, 260 mm apart.
		expect(m.fixings[0].count).toBe(3);
		expect(m.fixings[0].spacingMm).toBe(SCREW_SPACING_MM);
		// 1200 mm panel: 1120 mm cleat → ⌈1120/400⌉ + 1 = 4 screws, 373 mm apart.
		const wide = mountingPlan('french-cleat', { widthMm: 1200, heightMm: 600, boardMm: 18 });
		expect(wide.fixings[0].count).toBe(4);
		// One screw fewer would leave a gap wider than 400 mm.
		expect(1120 / (wide.fixings[0].count - 2)).toBeGreaterThan(SCREW_SPACING_MM);
		expect(1120 / (wide.fixings[0].count - 1)).toBeLessThanOrEqual(SCREW_SPACING_MM);
	});

	it('screwed blocks: one top and bottom at each side, two each for a panel taller than 1200 mm; at the anchors when given', () => {
		expect(mountingPlan('screwed-blocks', { widthMm: 600, heightMm: 1200, boardMm: 18 }).parts[0].quantity).toBe(4);
		expect(mountingPlan('screwed-blocks', { widthMm: 600, heightMm: 1500, boardMm: 18 }).parts[0].quantity).toBe(8);
		const behindWells = mountingPlan('screwed-blocks', { widthMm: 445, heightMm: 1200, boardMm: 12, anchorXsMm: [136, 322, 400] });
		expect(behindWells.parts[0].quantity).toBe(6);
		expect(behindWells.fixings[1].where).toMatch(/back strip of a deepest well/);
		expect(behindWells.fixings[0].count).toBe(12);
	});

	it('none adds nothing; refusals', () => {
		expect(mountingPlan('none', { widthMm: 600, heightMm: 1200, boardMm: 18 }).parts).toEqual([]);
		expect(() => mountingPlan('french-cleat', { widthMm: 200, heightMm: 1200, boardMm: 18 })).toThrow(/too narrow for a cleat/);
		expect(() => mountingPlan('glue' as never, { widthMm: 600, heightMm: 1200, boardMm: 18 })).toThrow(/unknown mounting/);
		expect(() => mountingPlan('screwed-blocks', { widthMm: 600, heightMm: 0, boardMm: 18 })).toThrow(/height/);
	});

	it('the heavy-panel caution names the structure, the load and two people', () => {
		expect(heavyCaution('22 kg')).toMatch(/22 kg.*into the structure.*rated for the load.*two people/);
	});
});

describe('mounting on a plan item', () => {
	const diffuser = (method: 'none' | 'french-cleat' | 'screwed-blocks'): PlanItem => ({
		id: 1,
		label: 'Diffuser',
		surface: 'back',
		quantity: 1,
		widthMm: 0,
		heightMm: 1800,
		unitPrice: null,
		problemBandId: null,
		why: null,
		params: { kind: 'diffuser', sequence: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthMm: 60, finThicknessMm: 18, maxDepthMm: null, boardThicknessMm: 18, construction: 'low-waste', mounting: { method, notes: '5 × 70 mm screws, wall plugs' }, fit: null }
	});

	it('adds the mounting pieces to the parts and to the last assembly step, every part once', () => {
		const b = itemBuild(diffuser('screwed-blocks'));
		// Low-waste: blocks behind the two deepest wells (s = 4), top and bottom, two each for 1800 mm → 8.
		expect(b.sheet.parts.find((p) => p.name === 'mounting block')?.quantity).toBe(8);
		const last = b.assembly![b.assembly!.length - 1];
		expect(last.title).toBe('Mounting pieces');
		const used = b.assembly!.flatMap((s) => s.pieces);
		for (const part of b.sheet.parts) expect(used.filter((p) => p.part === part).length, part.name).toBe(part.quantity);
	});

	it('a unit over 15 kg is heavy, and its mounting says so', () => {
		const b = itemBuild(diffuser('french-cleat'));
		expect(b.unitWeightKg).toBeGreaterThan(HEAVY_UNIT_KG);
		expect(b.heavy).toBe(true);
		expect(b.mounting?.method).toBe('french-cleat');
		expect(itemBuild(diffuser('none')).mounting).toBeNull();
	});
});
