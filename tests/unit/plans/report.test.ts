import { describe, expect, it } from 'vitest';
import { bs1116Target } from '../../../src/lib/analysis/targets';
import type { PlanCost } from '../../../src/lib/plans/build';
import { evaluatePlan } from '../../../src/lib/plans/evaluate';
import { planReport } from '../../../src/lib/plans/report';
import { PLANNING_BANDS_HZ } from '../../../src/lib/treatment/bands';
import { catalogueOf, finishesAll, flatMaterial, item, MEMBRANE, planOf, POROUS, QRD7 } from './fixtures';

const ROOM = { lengthM: 5, widthM: 4, heightM: 3 };
const items = [
	item({ id: 1, label: 'Side absorbers', surface: 'left', quantity: 2, params: { ...POROUS, airGapMm: 0 } }),
	// Stored diffusers carry their design's panel width (398 mm for the N = 7, 50 mm-well QRD).
	item({ id: 2, label: 'Rear diffuser', surface: 'back', quantity: 3, widthMm: 398, params: QRD7 }),
	item({ id: 3, label: 'Corner trap', surface: null, quantity: 1, params: MEMBRANE })
];
const before = [0.9, 0.8, 0.7, 0.6, 0.55, 0.5, 0.45, 0.4];

function evaluation(after: (number | null)[] | null) {
	return evaluatePlan({
		room: ROOM,
		plan: planOf({ finishes: finishesAll('flat-10'), items }),
		catalogue: catalogueOf(flatMaterial('flat-10', 0.1)),
		measuredBeforeS: before,
		measuredAfterS: after,
		target: bs1116Target(60, PLANNING_BANDS_HZ)
	});
}
const priced: PlanCost = { itemsTotal: 100, sheetsTotal: 26.5, total: 126.5, unpriced: [], priced: true };

describe('the plan in plain words', () => {
	const e = evaluation(null);
	const r = planReport(items, e, priced, 'EUR', 'mm');

	it('one sentence per item: quantity, name, kind, size, place, what it does and over which range', () => {
		expect(r.title).toBe('Treatment plan');
		expect(r.lines).toHaveLength(3);
		const porousRange = e.items[0].actionRangeHz!;
		expect(porousRange.loHz).toBeLessThan(1000);
		expect(r.lines[0]).toMatch(/^2 × Side absorbers \(porous absorber, 600 mm × 1200 mm\) on the left wall: absorbs sound, working from \d+ Hz to 11\.3 kHz\.$/);
		// QRD: from f0 = 500 Hz to c/(2w) = 3430 Hz, written "3.43 kHz" (three significant figures).
		expect(r.lines[1]).toBe('3 × Rear diffuser (diffuser, 398 mm × 1200 mm) on the back wall: scatters sound, working from 500 Hz to 3.43 kHz.');
		// Trap f0 = 50.9 Hz: half an octave either side is 36.0 … 72.0 Hz.
		expect(r.lines[2]).toBe('1 × Corner trap (panel bass trap, 600 mm × 1200 mm) free-standing: absorbs sound, working from 36 Hz to 72 Hz.');
	});

	it('sizes in the reader’s unit', () => {
		const imperial = planReport(items, e, priced, 'EUR', 'in');
		// 600 mm = 23 5/8″, 1200 mm = 47 1/4″ (25.4 mm/in, nearest 1/16).
		expect(imperial.lines[2]).toContain('(panel bass trap, 23 5/8″ × 47 1/4″)');
	});

	it('bands carry measured before, predicted and target of the evaluation, nothing after yet', () => {
		expect(r.bands).toHaveLength(8);
		r.bands.forEach((b, i) => {
			expect(b.bandHz).toBe(PLANNING_BANDS_HZ[i]);
			expect(b.measuredBeforeS).toBe(before[i]);
			expect(b.predictedS).toBe(e.bands[i].predictedS);
			expect(b.predictedS as number).toBeLessThan(before[i]); // treatment only adds absorption here
			expect(b.target).toEqual({ targetS: e.bands[i].target!.targetS, lowerS: e.bands[i].target!.lowerS, upperS: e.bands[i].target!.upperS });
			expect(b.measuredAfterS).toBeNull();
			expect(b.differenceS).toBeNull();
		});
		expect(r.measuredAfter).toBe(false);
	});

	it('the method names the calibration and the formula read, without the after-measurement sentence', () => {
		expect(r.method).toContain('starts from the room as measured before treatment and adds');
		const formula = e.bands[0].formula;
		expect(r.method).toContain(`reverberation times by ${formula[0].toUpperCase()}${formula.slice(1)}'s formula`);
		expect(r.method).toContain('ISO 9613-1');
		expect(r.method).not.toContain('Measured after');
	});

	it('says when the room was not measured before, and gives no prediction for a plan that cannot be worked out', () => {
		const unmeasured = evaluatePlan({ room: ROOM, plan: planOf({ finishes: finishesAll('flat-10'), items }), catalogue: catalogueOf(flatMaterial('flat-10', 0.1)), measuredBeforeS: null, measuredAfterS: null, target: [] });
		expect(planReport(items, unmeasured, priced, 'EUR', 'mm').method).toContain('as its surfaces and finishes make it (it has not been measured before treatment)');
		// 40 panels of 0.72 m² on a 15 m² wall (5 × 3 m) cannot be worked out.
		const crowded = [item({ id: 9, label: 'Too many', surface: 'left', quantity: 40, params: POROUS })];
		const impossible = evaluatePlan({ room: ROOM, plan: planOf({ finishes: finishesAll('flat-10'), items: crowded }), catalogue: catalogueOf(flatMaterial('flat-10', 0.1)), measuredBeforeS: before, measuredAfterS: null, target: [] });
		expect(planReport(crowded, impossible, priced, 'EUR', 'mm').method).toMatch(/^No prediction yet: the items on the left surface cover 28\.80 m²/);
	});

	it('the cost line in the plan’s currency, flagged when something is unpriced; none when nothing is priced', () => {
		expect(r.cost).toBe('Materials estimate: €126.50.');
		expect(planReport(items, e, { ...priced, unpriced: ['Corner trap'] }, 'EUR', 'mm').cost).toBe('Materials estimate: €126.50 (some items unpriced).');
		expect(planReport(items, e, { itemsTotal: 0, sheetsTotal: 0, total: 0, unpriced: ['x'], priced: false }, 'EUR', 'mm').cost).toBeNull();
	});
});

describe('once measured again', () => {
	const after = [0.7, 0.5, 0.4, null, 0.35, 0.3, 0.3, 0.3];
	const e = evaluation(after);
	const r = planReport(items, e, priced, 'USD', 'mm');

	it('reports measured after and predicted − measured per band', () => {
		expect(r.measuredAfter).toBe(true);
		r.bands.forEach((b, i) => {
			expect(b.measuredAfterS).toBe(after[i]);
			if (after[i] === null) expect(b.differenceS).toBeNull();
			else expect(b.differenceS as number).toBeCloseTo((b.predictedS as number) - (after[i] as number), 12);
		});
		expect(r.method).toContain('the difference is predicted minus measured');
		expect(r.cost).toBe('Materials estimate: $126.50.');
	});
});
