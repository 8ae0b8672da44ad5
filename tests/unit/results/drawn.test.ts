// What the results pages are sent (results/drawn.ts): the responses at the default smoothing and
// the octave tables, every other smoothing and the one-third octaves answered by the on-demand
// routes' shapes — each exactly as in the whole results model, with nothing mixed up between
// smoothings, band kinds, positions or visits.
import { describe, expect, it } from 'vitest';
import type { SmoothingKey } from '../../../src/lib/analysis/types';
import { compareSessions } from '../../../src/lib/results/comparison';
import {
	comparisonBands,
	comparisonResponses,
	comparisonView,
	DEFAULT_SMOOTHING,
	POSITION_OVERLAY_SMOOTHING,
	TABLE_METRICS,
	visitBands,
	visitResponses,
	visitResultsView
} from '../../../src/lib/results/drawn';
import { summariseSession } from '../../../src/lib/results/session';
import { matchedStrongReflections } from '../../../src/lib/results/summary';
import { midFrequencyReverberation } from '../../../src/lib/results/reverberation';
import { reverberationJudgement } from '../../../src/lib/results/statistics';
import type { PositionResult, SessionSummary } from '../../../src/lib/results/types';
import { makePosition, makeRoom, type BandInput } from './factories';

const SMOOTHINGS: SmoothingKey[] = ['1', '3', '6', '12', '24'];
const GRID = [50, 100, 200, 400, 800, 1600];

const octaves = (t30: number): BandInput[] => [125, 250, 500, 1000, 2000].map((c, i) => ({ centerHz: c, t30S: t30 + 0.01 * i, t20S: t30 - 0.02, edtS: t30 * 0.9, c80Db: 1 + i, c50Db: -1 - i, d50: 0.4, tsMs: 80 }));
const thirds = (t30: number): BandInput[] => [400, 500, 630, 800, 1000, 1250].map((c, i) => ({ centerHz: c, t30S: t30 + 0.005 * i, t20S: t30, edtS: t30, c80Db: 2, c50Db: -2 }));

/** A position whose response differs at every smoothing, so a curve of the wrong smoothing shows. */
function position(label: string, captureId: number, t30: number, level: number, reflectionsDb: number[] = []): PositionResult {
	const p = makePosition({ label, captureId, bands: octaves(t30), thirdBands: thirds(t30), freqHz: GRID, reflectionLevelsDb: reflectionsDb });
	const smoothed = Object.fromEntries(SMOOTHINGS.map((k, i) => [k, GRID.map((f, j) => level + 10 * i + j / 7)])) as Record<SmoothingKey, number[]>;
	return { ...p, response: { freqHz: [...GRID], db: GRID.map(() => level), smoothed } };
}

function visit(sessionId: number, t30: number, labels: string[], levelOf = (i: number) => i): SessionSummary {
	return summariseSession(
		{ sessionId, conditionLabel: sessionId === 1 ? 'untreated' : 'treated', measuredOn: '2026-03-01' },
		labels.map((label, i) => position(label, 100 * sessionId + i, t30 * (1 + 0.03 * i), levelOf(i) + sessionId, [-3 - i, -20]))
	);
}

describe('the visit page', () => {
	const s = visit(1, 0.6, ['P1', 'P2', 'P3']);
	const view = visitResultsView(s, '"tag"');

	it('is sent the responses at the default smoothing only, equal to the whole summary', () => {
		expect(view.responses.smoothing).toBe(DEFAULT_SMOOTHING);
		expect(view.responses.positions.map((p) => [p.captureId, p.positionLabel])).toEqual(s.positions.map((p) => [p.captureId, p.positionLabel]));
		view.responses.positions.forEach((p, i) => {
			expect(p.db).toEqual(s.positions[i].response.smoothed[DEFAULT_SMOOTHING]);
			expect(p.freqHz).toEqual(s.positions[i].response.freqHz);
		});
		expect(view.responses.average!.db).toEqual(s.averageResponse!.smoothed[DEFAULT_SMOOTHING]);
		expect(JSON.stringify(view)).not.toContain('smoothed');
		// One grid for every curve, so the page data carries it once.
		expect(new Set([...view.responses.positions.map((p) => p.freqHz), view.responses.average!.freqHz]).size).toBe(1);
	});

	it('answers every other smoothing with that smoothing\'s curves', () => {
		for (const k of SMOOTHINGS) {
			const r = visitResponses(s, k);
			expect(r.smoothing).toBe(k);
			r.positions.forEach((p, i) => expect(p.db).toEqual(s.positions[i].response.smoothed[k]));
			expect(r.average!.db).toEqual(s.averageResponse!.smoothed[k]);
		}
		expect(visitResponses(s, '3').positions[0].db).not.toEqual(visitResponses(s, '6').positions[0].db);
	});

	it('is sent the octave tables: each position\'s offered metrics, the average, the spread and the grade', () => {
		expect(view.octaves.bandKind).toBe('octave');
		expect(view.octaves.average).toBe(s.average);
		expect(view.octaves.statistics).toBe(s.statistics);
		expect(view.grade).toBe(s.statistics.grade);
		view.octaves.positions.forEach((p, i) => {
			expect(p.positionLabel).toBe(s.positions[i].positionLabel);
			expect(p.bands).toEqual(s.positions[i].bands.map((b) => ({ centerHz: b.centerHz, ...Object.fromEntries(TABLE_METRICS.map((m) => [m, b[m]])) })));
		});
		expect(view.outliers).toBe(s.outliers);
		expect(view.hasThirds).toBe(true);
	});

	it('answers the one-third octaves from the positions\' third bands and the thirds statistics', () => {
		const t = visitBands(s, 'third')!;
		expect(t.bandKind).toBe('third');
		expect(t.average).toBe(s.thirds!.average);
		expect(t.statistics).toBe(s.thirds!.statistics);
		t.positions.forEach((p, i) => expect(p.bands.map((b) => [b.centerHz, b.t30S])).toEqual(s.positions[i].thirdBands!.map((b) => [b.centerHz, b.t30S])));
	});

	it('has no third octaves to offer when no position has them', () => {
		const octavesOnly = summariseSession({ sessionId: 3, conditionLabel: 'x', measuredOn: '2026-03-01' }, [{ ...position('P1', 1, 0.5, 0), thirdBands: null }]);
		expect(visitResultsView(octavesOnly, '"t"').hasThirds).toBe(false);
		expect(visitBands(octavesOnly, 'third')).toBeNull();
	});
});

describe('the comparison and report pages', () => {
	// P3 only before, P4 only after: two matched positions.
	const model = compareSessions(makeRoom(), visit(1, 0.8, ['P1', 'P2', 'P3']), visit(2, 0.5, ['P1', 'P2', 'P4'], (i) => 3 * i));
	const view = comparisonView(model, '"tag"');

	it('are sent the averaged responses at the default smoothing; every other smoothing is answered on demand', () => {
		expect(view.responses).toEqual(comparisonResponses(model, DEFAULT_SMOOTHING));
		for (const k of SMOOTHINGS) {
			const r = comparisonResponses(model, k);
			expect(r.before!.db).toEqual(model.baseline.averageResponse!.smoothed[k]);
			expect(r.after!.db).toEqual(model.treated.averageResponse!.smoothed[k]);
		}
	});

	it('are sent each matched position\'s own responses at the overlay\'s smoothing, and no other position\'s', () => {
		expect(model.matchedPositions).toEqual(['P1', 'P2']);
		expect(view.positionResponses.map((p) => p.positionLabel)).toEqual(['P1', 'P2']);
		for (const p of view.positionResponses) {
			expect(p.before!.db).toEqual(model.baseline.positions.find((x) => x.positionLabel === p.positionLabel)!.response.smoothed[POSITION_OVERLAY_SMOOTHING]);
			expect(p.after!.db).toEqual(model.treated.positions.find((x) => x.positionLabel === p.positionLabel)!.response.smoothed[POSITION_OVERLAY_SMOOTHING]);
		}
		expect(JSON.stringify(view.positionResponses)).not.toContain('"P3"');
	});

	it('are sent the octave tables, the verdicts, the summary, the grades and the reflections the pages show', () => {
		// Each band's shown metrics, and the judgements of T30 and T20 the verdict column quotes.
		expect(view.octaves.bandKind).toBe('octave');
		expect(view.octaves.differences.map((d) => d.centerHz)).toEqual(model.differences.map((d) => d.centerHz));
		view.octaves.differences.forEach((d, i) => {
			expect(Object.keys(d.metrics).sort()).toEqual([...TABLE_METRICS].sort());
			for (const m of TABLE_METRICS) expect(d.metrics[m]).toEqual(model.differences[i].metrics[m]);
		});
		view.octaves.judgements.forEach((j, i) => {
			expect(j).toEqual({ centerHz: model.judgements[i].centerHz, metrics: { t30S: model.judgements[i].metrics.t30S, t20S: model.judgements[i].metrics.t20S } });
			expect(reverberationJudgement(j)).toEqual(reverberationJudgement(model.judgements[i]));
		});
		expect(view.octaves.judgements.some((j) => reverberationJudgement(j))).toBe(true);
		expect(view.target).toBe(model.target);
		expect(view.verdictsAfter).toBe(model.verdicts.after);
		expect(view.summary).toBe(model.summary);
		expect(view.treatedMid).toEqual(midFrequencyReverberation(model.treated.average.map((b) => ({ centerHz: b.centerHz, t30S: b.values.t30S?.mean, t20S: b.values.t20S?.mean }))));
		expect(view.treatedMid!.valueS).toBeGreaterThan(0.5);
		expect(view.matchedStatistics.baseline.grade).toBe(model.matchedStatistics.baseline.grade);
		expect(view.matchedStatistics.treated.midFrequency).toBe(model.matchedStatistics.treated.midFrequency);
		expect(view.strongReflections).toEqual(matchedStrongReflections(model));
		expect(view.strongReflections.before).not.toBeNull();
		view.positionDifferences.forEach((p, i) => {
			expect(p.positionLabel).toBe(model.positionDifferences[i].positionLabel);
			p.differences.forEach((d, j) => {
				const whole = model.positionDifferences[i].differences[j];
				expect(Object.keys(d.metrics).sort()).toEqual([...TABLE_METRICS].filter((m) => m in whole.metrics).sort());
				for (const m of TABLE_METRICS) expect(d.metrics[m]).toEqual(whole.metrics[m]);
			});
		});
	});

	it('answer the one-third octaves from the comparison\'s thirds', () => {
		expect(view.hasThirds).toBe(true);
		expect(comparisonBands(model, 'third')).toEqual({ bandKind: 'third', differences: model.thirds!.differences, judgements: model.thirds!.judgements });
	});
});
