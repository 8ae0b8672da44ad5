import { describe, expect, it } from 'vitest';
import type { TargetBand } from '../../../src/lib/analysis/targets';
import { compareSessions } from '../../../src/lib/results/comparison';
import { makeRoom, makeSession, type BandInput } from './factories';

const bands = (t30: [number, number | null][], extra: Partial<BandInput> = {}): BandInput[] =>
	t30.map(([centerHz, t30S]) => ({ centerHz, t30S, ...extra }));

describe('compareSessions: positions matched by label', () => {
	// P4 only before (with a T30 far from the rest) and P5 only after: neither may enter the averages compared.
	const baseline = makeSession([
		{ label: 'P1', bands: bands([[500, 0.6], [1000, 0.5]]) },
		{ label: 'P2', bands: bands([[500, 0.7], [1000, 0.5]]) },
		{ label: 'P10', bands: bands([[500, 0.8], [1000, 0.6]]) },
		{ label: 'P4', bands: bands([[500, 3.0], [1000, 3.0]]) }
	]);
	const treated = makeSession([
		{ label: 'P2', bands: bands([[500, 0.4], [1000, 0.3]]) },
		{ label: 'P1', bands: bands([[500, 0.3], [1000, 0.3]]) },
		{ label: 'P10', bands: bands([[500, 0.5], [1000, null]]) },
		{ label: 'P5', bands: bands([[500, 0.1], [1000, 0.1]]) }
	]);
	const model = compareSessions(makeRoom({ roomUse: 'other' }), baseline, treated);

	it('lists matched and unmatched labels in natural order', () => {
		expect(model.matchedPositions).toEqual(['P1', 'P2', 'P10']);
		expect(model.baselineOnly).toEqual(['P4']);
		expect(model.treatedOnly).toEqual(['P5']);
	});

	// Means worked by hand over P1, P2, P10 only; the difference is after − before (definition).
	it.each([
		{ centerHz: 500, before: (0.6 + 0.7 + 0.8) / 3, after: (0.3 + 0.4 + 0.5) / 3, beforeCount: 3, afterCount: 3 },
		{ centerHz: 1000, before: (0.5 + 0.5 + 0.6) / 3, after: 0.3, beforeCount: 3, afterCount: 2 }
	])('T30 at $centerHz Hz: matched means, after − before, relative change', ({ centerHz, before, after, beforeCount, afterCount }) => {
		const d = model.differences.find((band) => band.centerHz === centerHz)?.metrics.t30S;
		expect(d?.before).toBeCloseTo(before, 12);
		expect(d?.after).toBeCloseTo(after, 12);
		expect(d?.difference).toBeCloseTo(after - before, 12);
		expect(d?.relativeChange).toBeCloseTo((after - before) / before, 12);
		expect(d?.beforeCount).toBe(beforeCount);
		expect(d?.afterCount).toBe(afterCount);
	});

	it('keeps both visits as given for display, unmatched positions included', () => {
		expect(model.baseline).toBe(baseline);
		expect(model.treated).toBe(treated);
		expect(model.baseline.average.find((b) => b.centerHz === 500)?.values.t30S.count).toBe(4);
		expect(model.matchedAverage.baseline.find((b) => b.centerHz === 500)?.values.t30S.count).toBe(3);
	});

	it('has no target and no verdicts for a room used for other purposes', () => {
		expect(model.target).toEqual([]);
		expect(model.verdicts).toEqual({ before: [], after: [] });
	});

	it('compares nothing when no label is shared', () => {
		const none = compareSessions(makeRoom(), baseline, makeSession([{ label: 'Q1', bands: bands([[500, 0.4]]) }]));
		expect(none.matchedPositions).toEqual([]);
		expect(none.differences).toEqual([]);
		expect(none.baselineOnly).toEqual(['P1', 'P2', 'P4', 'P10']);
		expect(none.summary).toEqual(['No position was measured in both visits, so the visits cannot be compared position by position.']);
	});
});

describe('compareSessions: verdicts against ITU-R BS.1116-3 for V = 72.8 m³', () => {
	// Tm = 0.25·(V/100 m³)^(1/3) s, tolerance ±0.05 s from 200 Hz to 4 kHz (ITU-R BS.1116-3; formula and tolerance from memory, the formula with high confidence).
	const tm = 0.25 * Math.cbrt(72.8 / 100); // 0.2247 s
	const lower = tm - 0.05;
	const upper = tm + 0.05;
	const baseline = makeSession([
		{ label: 'P1', bands: [{ centerHz: 250, t30S: 0.4 }, { centerHz: 500, t30S: 0.35 }, { centerHz: 1000, t30S: null, t20S: 0.3 }, { centerHz: 2000, t30S: 0.15 }, { centerHz: 4000, t30S: null, t20S: null }] }
	]);
	const treated = makeSession([
		{ label: 'P1', bands: [{ centerHz: 250, t30S: 0.26 }, { centerHz: 500, t30S: 0.2 }, { centerHz: 1000, t30S: 0.24 }, { centerHz: 2000, t30S: 0.19 }, { centerHz: 4000, t30S: 0.23 }] }
	]);

	it.each(['listening', 'control', 'home-theatre'])('a %s room gets the BS.1116 target in every band', (roomUse) => {
		const model = compareSessions(makeRoom({ roomUse }), baseline, treated);
		expect(model.target.map((t) => t.centerHz)).toEqual([250, 500, 1000, 2000, 4000]);
		for (const band of model.target) {
			expect(band.targetS).toBeCloseTo(tm, 12);
			expect(band.lowerS).toBeCloseTo(lower, 12);
			expect(band.upperS).toBeCloseTo(upper, 12);
		}
	});

	it.each(['rehearsal', 'speech', 'other'])('a %s room gets no default target', (roomUse) => {
		expect(compareSessions(makeRoom({ roomUse }), baseline, treated).target).toEqual([]);
	});

	const model = compareSessions(makeRoom(), baseline, treated);
	// Expected verdicts from the bounds above: 0.40 > 0.2747 above, 0.15 < 0.1747 below, 0.26 / 0.20 / 0.24 / 0.19 / 0.23 inside.
	it.each([
		{ centerHz: 250, before: 'above', after: 'inside', beforeMetric: 't30S' },
		{ centerHz: 500, before: 'above', after: 'inside', beforeMetric: 't30S' },
		{ centerHz: 1000, before: 'above', after: 'inside', beforeMetric: 't20S' }, // T30 missing before: judged on T20
		{ centerHz: 2000, before: 'below', after: 'inside', beforeMetric: 't30S' },
		{ centerHz: 4000, before: 'unknown', after: 'inside', beforeMetric: null }
	])('$centerHz Hz: $before before, $after after', ({ centerHz, before, after, beforeMetric }) => {
		const b = model.verdicts.before.find((v) => v.centerHz === centerHz);
		const a = model.verdicts.after.find((v) => v.centerHz === centerHz);
		expect(b?.verdict).toBe(before);
		expect(b?.metric).toBe(beforeMetric);
		expect(a?.verdict).toBe(after);
		expect(a?.metric).toBe('t30S');
	});

	it('a given target replaces the default one', () => {
		const target: TargetBand[] = [{ centerHz: 500, targetS: 0.3, lowerS: 0.25, upperS: 0.36 }];
		const custom = compareSessions(makeRoom({ roomUse: 'speech' }), baseline, treated, { target });
		expect(custom.target).toEqual(target);
		expect(custom.verdicts.before.map((v) => v.verdict)).toEqual(['inside']); // 0.35 within 0.25…0.36
		expect(custom.verdicts.after.map((v) => v.verdict)).toEqual(['below']); // 0.20 < 0.25
	});

	it('fills the plain-words summary', () => {
		expect(model.summary.length).toBeGreaterThan(0);
		expect(model.summary.length).toBeLessThanOrEqual(8);
	});
});
