import { describe, expect, it } from 'vitest';
import { PLANNING_BANDS_HZ } from '../../../src/lib/treatment/bands';
import { calibrate, predictWithTreatment } from '../../../src/lib/treatment/calibrate';
import { randomIncidenceAbsorption } from '../../../src/lib/treatment/porous';
import { bandRegion, planTreatment, POROUS_TARGET_ALPHA, type Proposal } from '../../../src/lib/treatment/planner';

const byKind = <K extends Proposal['kind']>(ps: Proposal[], kind: K) => ps.find((p): p is Extract<Proposal, { kind: K }> => p.kind === kind);

describe('a modal problem band, 40–60 Hz', () => {
	const plan = planTreatment({ fLoHz: 40, fHiHz: 60, note: 'modal peak' });

	it('is a low band and gets a panel trap whose band of action covers 40–60 Hz', () => {
		expect(plan.region).toBe('low');
		const trap = byKind(plan.proposals, 'membrane-trap');
		expect(trap).toBeDefined();
		if (!trap) return;
		expect(trap.actionRangeHz.loHz).toBeLessThanOrEqual(40);
		expect(trap.actionRangeHz.hiHz).toBeGreaterThanOrEqual(60);
		expect(trap.coversBand).toBe(true);
	});

	it('tunes the trap to the geometric centre √(40·60) ≈ 49 Hz by f0 = (1/2π)√(ρ0c0²/(γ m′ d)) (±2 %: cavity rounded to whole mm)', () => {
		const trap = byKind(plan.proposals, 'membrane-trap');
		if (!trap) throw new Error('no trap');
		const { surfaceMassKgM2: m, cavityDepthM: d } = trap.trap;
		const f0 = Math.sqrt((1.21 * 343 ** 2) / 1.4 / (m * d)) / (2 * Math.PI);
		expect(Math.abs(f0 / Math.sqrt(40 * 60) - 1)).toBeLessThan(0.02);
		expect(trap.trap.resonanceHz).toBeCloseTo(f0, 9);
		expect(d).toBeGreaterThanOrEqual(0.05);
		expect(d).toBeLessThanOrEqual(0.3);
		expect(trap.why).toMatch(/resonates at f0 = /);
	});

	it('any porous proposal reaches the target α at 40 Hz, per the Paris integral of its layer', () => {
		const porous = byKind(plan.proposals, 'porous-absorber');
		if (porous) {
			expect(randomIncidenceAbsorption(porous.layer, 40)).toBeGreaterThanOrEqual(POROUS_TARGET_ALPHA);
			expect(porous.layer.thicknessM + porous.layer.airGapM).toBeLessThanOrEqual(0.5);
		} else {
			expect(plan.notes.join(' ')).toMatch(/no porous absorber/);
		}
	});

	it('the trap lowers the predicted T at 63 Hz in a calibrated room (physical direction)', () => {
		const trap = byKind(plan.proposals, 'membrane-trap');
		if (!trap) throw new Error('no trap');
		const flat = (v: number) => PLANNING_BANDS_HZ.map(() => v);
		const cal = calibrate({ volumeM3: 60, patches: [{ areaM2: 94, coefficients: flat(0.05) }], measuredS: flat(0.8) });
		const [p63] = predictWithTreatment(cal, [{ label: trap.title, areaM2: 4, coefficients: trap.coefficients }]);
		expect(p63.predictedS as number).toBeLessThan(0.8);
	});
});

describe('a flutter band, 2–4 kHz', () => {
	const plan = planTreatment({ fLoHz: 2000, fHiHz: 4000, note: 'flutter' });

	it('is a high band and gets a diffuser whose working range f0 … c/(2w) covers it', () => {
		expect(plan.region).toBe('high');
		const d = byKind(plan.proposals, 'diffuser');
		if (!d) throw new Error('no diffuser');
		expect(d.diffuser.designFrequencyHz).toBeLessThanOrEqual(2000);
		// f_max = c/(2w), computed here from the well width.
		expect(343 / (2 * d.diffuser.wellWidthM)).toBeGreaterThanOrEqual(4000);
		expect(d.coversBand).toBe(true);
		// The first flat-plate frequency N·f0 lies above the working range.
		expect(d.diffuser.prime * d.diffuser.designFrequencyHz).toBeGreaterThan(d.diffuser.wellWidthLimitHz);
	});

	it('also offers an absorber reaching the target α at 2 kHz', () => {
		const porous = byKind(plan.proposals, 'porous-absorber');
		if (!porous) throw new Error('no absorber');
		expect(randomIncidenceAbsorption(porous.layer, 2000)).toBeGreaterThanOrEqual(POROUS_TARGET_ALPHA);
		expect(porous.coversBand).toBe(true);
	});
});

describe('band regions and proposals (thresholds: common practice, no source)', () => {
	it.each([
		[40, 60, 'low'],
		[125, 250, 'low'],
		[300, 800, 'mid'],
		[800, 1600, 'mid'],
		[1000, 2000, 'high'],
		[2000, 4000, 'high']
	] as const)('%i–%i Hz → %s', (lo, hi, region) => {
		expect(bandRegion({ fLoHz: lo, fHiHz: hi })).toBe(region);
	});

	it('a mid band gets a porous panel reaching the target α at its lower edge', () => {
		const plan = planTreatment({ fLoHz: 300, fHiHz: 800 });
		expect(plan.proposals.map((p) => p.kind)).toEqual(['porous-absorber']);
		expect(plan.proposals[0].coversBand).toBe(true);
	});

	it('a one-octave band counts as covered although the cavity is rounded to whole mm (2 % tolerance)', () => {
		const trap = byKind(planTreatment({ fLoHz: 125, fHiHz: 250 }).proposals, 'membrane-trap');
		expect(trap?.actionRangeHz.hiHz).toBeLessThan(250);
		expect(trap?.coversBand).toBe(true);
	});

	it('says so when one trap cannot cover a band wider than its octave', () => {
		const plan = planTreatment({ fLoHz: 30, fHiHz: 120 });
		const trap = byKind(plan.proposals, 'membrane-trap');
		expect(trap?.coversBand).toBe(false);
		expect(trap?.warnings.join(' ')).toMatch(/second trap/);
	});

	it('every proposal gives one coefficient per planning band, each in 0…1, and a why', () => {
		for (const band of [{ fLoHz: 40, fHiHz: 60 }, { fLoHz: 300, fHiHz: 800 }, { fLoHz: 2000, fHiHz: 4000 }]) {
			for (const p of planTreatment(band).proposals) {
				expect(p.coefficients).toHaveLength(PLANNING_BANDS_HZ.length);
				for (const a of p.coefficients) {
					expect(a).toBeGreaterThanOrEqual(0);
					expect(a).toBeLessThanOrEqual(1);
				}
				expect(p.why.length).toBeGreaterThan(40);
			}
		}
	});

	it.each([
		[{ fLoHz: 0, fHiHz: 100 }, /lower edge/],
		[{ fLoHz: 100, fHiHz: 100 }, /upper edge/],
		[{ fLoHz: 200, fHiHz: 100 }, /upper edge/]
	])('rejects %o', (band, message) => {
		expect(() => planTreatment(band)).toThrow(message);
	});
});
