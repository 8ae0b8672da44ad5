import { describe, expect, it } from 'vitest';
import { comparisonCsv, comparisonJson, sessionAverageCsv, sessionAverageJson } from '../../../src/lib/results/exports';
import { compareSessions } from '../../../src/lib/results/comparison';
import { makeRoom, makeSession, type PositionInput } from './factories';
import { csvTable as table } from '../../helpers/rfc4180';

/** P1…Pn, one loudspeaker, a seat each, T30 = T20 at 500 Hz as given. */
const positions = (t30s: number[], extra: Partial<PositionInput> = {}): PositionInput[] =>
	t30s.map((t30S, i) => ({ label: `P${i + 1}`, sourceLabel: 'left', micLabel: `seat ${i + 1}`, bands: [{ centerHz: 500, t30S, t20S: t30S }], broadband: { t30S }, ...extra }));

describe('visit exports: spread, confidence interval and grade', () => {
	const summary = makeSession(positions([0.5, 0.6, 0.7]));

	it('adds each mean’s 95 % interval, ISO 3382-2’s σ and the grade to the average CSV', () => {
		const [row500, broadband] = table(sessionAverageCsv(summary));
		// 0.6 ± t(0.975, 2)·0.1/√3 = 0.6 ± 0.248 s (NIST/SEMATECH t table, 4.303); σ(T30) = 0.55·0.6·√(1.152/(3·355·0.6)) = 0.014 s
		// (ISO 3382-2:2008, constants from memory); one source, three seats: survey (ISO 3382-2 Table 1, from memory).
		expect([row500.centre_Hz, row500.T30_mean_s, row500.T30_ci95_low_s, row500.T30_ci95_high_s]).toEqual(['500', '0.6', '0.352', '0.848']);
		expect([row500.T30_iso_sigma_s, row500.T20_iso_sigma_s]).toEqual(['0.014', '0.023']);
		expect([row500.grade, row500.source_positions, row500.microphone_positions, row500.combinations]).toEqual(['survey', '1', '3', '3']);
		expect([broadband.centre_Hz, broadband.T30_ci95_low_s, broadband.T30_iso_sigma_s, broadband.grade]).toEqual(['broadband', '0.352', '', 'survey']);
	});

	it('puts the same in the JSON document', () => {
		const json = sessionAverageJson(summary);
		expect(json.statistics.grade.grade).toBe('survey');
		expect(json.statistics.grade.next?.grade).toBe('engineering');
		expect(json.statistics.bands[0].metrics.t30S.halfWidth).toBeCloseTo(0.2484, 4);
		expect(json.statistics.bands[0].uncertainty.t30S).toBeCloseTo(0.014, 3);
		expect(json.thirds).toBeNull();
		expect(JSON.parse(JSON.stringify(json)).statistics.positions).toBe(3);
	});
});

describe('comparison exports: differences judged against the spread, positions, grades', () => {
	const room = makeRoom({ roomUse: 'other' });
	// Before s = 0.1 s, after s = 0.05 s: Welch limit 0.278 s ≥ 0.1 s (worked by hand in statistics.test.ts).
	const wide = compareSessions(room, makeSession(positions([0.5, 0.6, 0.7])), makeSession(positions([0.45, 0.5, 0.55])));
	// Positions agree to 0.01 s: limit 0.0227 s < 0.1 s and past the 5 % JND.
	const tight = compareSessions(room, makeSession(positions([0.59, 0.6, 0.61])), makeSession(positions([0.49, 0.5, 0.51])));

	it('says per band whether the change is within the spread, with the limit, and each visit’s grade', () => {
		const [w] = table(comparisonCsv(wide));
		expect([w.T30_against_spread, w.T30_spread_limit_s, w.grade_before, w.grade_after]).toEqual(['within-spread', '0.278', 'survey', 'survey']);
		const [t] = table(comparisonCsv(tight));
		expect([t.T30_against_spread, t.T30_spread_limit_s]).toEqual(['beyond', '0.023']);
		expect(t.C80_against_spread).toBe('unknown');
	});

	it('lists every matched position before and after in the JSON document', () => {
		const json = comparisonJson(wide);
		expect(json.bands[0].judgements.t30S.verdict).toBe('within-spread');
		expect(json.positions.map((p) => p.positionLabel)).toEqual(['P1', 'P2', 'P3']);
		expect([json.positions[2].bands[0].metrics.t30S.before, json.positions[2].bands[0].metrics.t30S.after]).toEqual([0.7, 0.55]);
		expect(json.statistics.treated.grade.counts).toEqual({ sources: 1, microphones: 3, combinations: 3 });
		expect(json.statistics.baseline.midFrequency).toBeNull(); // no 1 kHz band: T_mid needs both (ISO 3382-1 Annex A, from memory)
	});
});
