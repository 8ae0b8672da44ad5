import { describe, expect, it } from 'vitest';
import { compareSessions } from '../../../src/lib/results/comparison';
import { comparePositions, judgeBands, reverberationJudgement, visitStatistics } from '../../../src/lib/results/statistics';
import { strongReflectionCount, strongReflectionsPerPosition } from '../../../src/lib/results/summary';
import { makePosition, makeRoom, makeSession, type BandInput, type PositionInput } from './factories';

const otherRoom = makeRoom({ roomUse: 'other' });

/** Positions P1… with one T30 each at 500 Hz and 1 kHz, labelled with a source and a microphone. */
function positions(t30s: number[], labels: Partial<PositionInput>[] = []): PositionInput[] {
	return t30s.map((t30S, i) => ({
		label: `P${i + 1}`,
		sourceLabel: 'left',
		micLabel: `seat ${i + 1}`,
		bands: [
			{ centerHz: 500, t30S, t20S: t30S },
			{ centerHz: 1000, t30S, t20S: t30S }
		],
		broadband: { t30S },
		...labels[i]
	}));
}

describe('visitStatistics: spread, confidence interval and ISO 3382-2 uncertainty per band', () => {
	const stats = visitStatistics(positions([0.5, 0.6, 0.7]).map(makePosition));
	const band500 = stats.bands.find((b) => b.centerHz === 500)!;

	it('gives the mean, sample standard deviation and Student-t 95 % interval over positions (worked by hand)', () => {
		// mean 0.6 s, s = √(((−0.1)² + 0² + 0.1²)/2) = 0.1 s; t(0.975, 2) = 4.303 (NIST/SEMATECH
		// e-Handbook of Statistical Methods, 1.3.6.7.2, table of the t distribution): ±4.303·0.1/√3 = ±0.2484 s.
		expect(band500.metrics.t30S.count).toBe(3);
		expect(band500.metrics.t30S.mean).toBeCloseTo(0.6, 12);
		expect(band500.metrics.t30S.std).toBeCloseTo(0.1, 12);
		expect(band500.metrics.t30S.halfWidth).toBeCloseTo(0.2484, 4);
		expect(band500.metrics.t30S.low).toBeCloseTo(0.6 - 0.2484, 4);
		expect(stats.broadband.t30S.std).toBeCloseTo(0.1, 12);
	});

	it("puts ISO 3382-2:2008's σ(T) beside T20 and T30 (octave B = 0.71·f, n = 10 decays for an impulse response, N = 3)", () => {
		// σ(T30) = 0.55·0.6·√((1 + 1.52/10)/(3·355·0.6)) = 0.0140 s; σ(T20) = 0.88·0.6·√((1 + 1.90/10)/(3·355·0.6)) = 0.0228 s
		// (ISO 3382-2:2008 uncertainty formulas, constants from memory; worked by hand).
		expect(band500.uncertainty.t30S).toBeCloseTo(0.0140, 4);
		expect(band500.uncertainty.t20S).toBeCloseTo(0.0228, 4);
	});

	it('uses the one-third-octave bandwidth B = 0.23·f for thirds', () => {
		const thirds = visitStatistics(
			positions([0.5, 0.6, 0.7]).map((p) => makePosition({ ...p, thirdBands: [{ centerHz: 500, t30S: p.bands[0].t30S }] })),
			'third'
		);
		// σ(T30) = 0.55·0.6·√(1.152/(3·0.23·500·0.6)) = 0.0246 s, worked by hand.
		expect(thirds.bandKind).toBe('third');
		expect(thirds.bands.map((b) => b.centerHz)).toEqual([500]);
		expect(thirds.bands[0].uncertainty.t30S).toBeCloseTo(0.0246, 4);
		expect(thirds.midFrequency).toBeNull();
	});

	it('gives T_mid as the mean of the 500 Hz and 1 kHz means (ISO 3382-1:2009 Annex A, from memory)', () => {
		const mixed = visitStatistics(
			[
				{ label: 'P1', bands: [{ centerHz: 500, t30S: 0.4 }, { centerHz: 1000, t30S: null, t20S: 0.8 }] },
				{ label: 'P2', bands: [{ centerHz: 500, t30S: 0.6 }, { centerHz: 1000, t30S: null, t20S: 0.6 }] }
			].map(makePosition)
		);
		// 500 Hz: T30 mean 0.5 s; 1 kHz: no T30, T20 mean 0.7 s → T_mid 0.6 s.
		expect(mixed.midFrequency?.valueS).toBeCloseTo(0.6, 12);
		expect(mixed.midFrequency?.metrics).toEqual(['t30S', 't20S']);
	});

	it('grades the visit from its labelled positions (ISO 3382-2:2008 Table 1, from memory)', () => {
		// One source, three microphone positions, three pairs: survey (1/2/2), not engineering (2/2/6).
		expect(stats.grade.grade).toBe('survey');
		expect(stats.grade.next?.grade).toBe('engineering');
		expect(stats.grade.next?.shortfalls).toEqual([
			'engineering needs 2 source positions; this visit has 1',
			'engineering needs 6 source–microphone combinations; this visit has 3'
		]);
		const unlabelled = visitStatistics([makePosition({ label: 'P1', bands: [] })]);
		expect(unlabelled.grade.grade).toBeNull();
		expect(unlabelled.grade.assumptions.length).toBe(2);
	});
});

describe('judgeBands: a before/after difference against the spread of the positions', () => {
	const stats = (t30s: number[]) => visitStatistics(positions(t30s).map(makePosition)).bands;

	it('calls a 0.1 s change within the spread when positions scatter by 0.1 s (Welch, worked by hand)', () => {
		// before s = 0.1, after s = 0.05, n = 3 each: SE = √(0.01/3 + 0.0025/3) = 0.0645 s, Welch ν = 2.94 → 2,
		// t(0.975, 2) = 4.303 (NIST table): limit 0.278 s ≥ |−0.1 s|.
		const [j500] = judgeBands(stats([0.5, 0.6, 0.7]), stats([0.45, 0.5, 0.55]));
		expect(j500.metrics.t30S.difference).toBeCloseTo(-0.1, 12);
		expect(j500.metrics.t30S.spreadLimit).toBeCloseTo(0.278, 3);
		expect(j500.metrics.t30S.verdict).toBe('within-spread');
	});

	it('calls the same change real when positions agree to 0.01 s', () => {
		// SE = √(2·0.0001/3) = 0.00816 s, ν = 4, t(0.975, 4) = 2.776: limit 0.0227 s < 0.1 s; JND 5 % of 0.6 s = 0.03 s (ISO 3382-1 Annex A, from memory).
		const [j500] = judgeBands(stats([0.59, 0.6, 0.61]), stats([0.49, 0.5, 0.51]));
		expect(j500.metrics.t30S.spreadLimit).toBeCloseTo(0.0227, 4);
		expect(j500.metrics.t30S.verdict).toBe('beyond');
	});

	it('falls back to T20 where T30 has no difference', () => {
		const bands = (t20S: number, t30S: number | null): BandInput[] => [{ centerHz: 500, t20S, t30S }];
		const before = visitStatistics([makePosition({ label: 'P1', bands: bands(0.6, null) }), makePosition({ label: 'P2', bands: bands(0.62, null) })]).bands;
		const after = visitStatistics([makePosition({ label: 'P1', bands: bands(0.4, 0.41) }), makePosition({ label: 'P2', bands: bands(0.42, 0.43) })]).bands;
		const judgement = reverberationJudgement(judgeBands(before, after)[0]);
		expect(judgement?.metric).toBe('t20S');
		expect(judgement?.difference).toBeCloseTo(-0.2, 12);
		expect(reverberationJudgement(undefined)).toBeNull();
	});
});

describe('compareSessions: judgements, positions one by one, and the summary', () => {
	it('judges over the matched positions only, and lists each matched position before and after', () => {
		const baseline = makeSession([...positions([0.5, 0.6, 0.7]), { label: 'P9', bands: [{ centerHz: 500, t30S: 3 }] }]);
		const treated = makeSession(positions([0.45, 0.5, 0.55]));
		const model = compareSessions(otherRoom, baseline, treated);
		expect(model.matchedStatistics.baseline.positions).toBe(3);
		expect(model.judgements.find((j) => j.centerHz === 500)?.metrics.t30S.verdict).toBe('within-spread');
		expect(model.positionDifferences.map((p) => p.positionLabel)).toEqual(['P1', 'P2', 'P3']);
		const p1 = model.positionDifferences[0].differences.find((d) => d.centerHz === 500)!.metrics.t30S;
		expect([p1.before, p1.after]).toEqual([0.5, 0.45]);
		expect(p1.relativeChange).toBeCloseTo(-0.1, 12);
	});

	it('says which noticeable changes are no larger than the spread', () => {
		const summary = compareSessions(otherRoom, makeSession(positions([0.5, 0.6, 0.7])), makeSession(positions([0.45, 0.5, 0.55]))).summary;
		expect(summary).toContain(
			'At 500 Hz and 1 kHz the change in reverberation is no larger than the spread between positions, so it may come from where the microphone stood rather than from the room.'
		);
		const tight = compareSessions(otherRoom, makeSession(positions([0.59, 0.6, 0.61])), makeSession(positions([0.49, 0.5, 0.51]))).summary;
		expect(tight.some((s) => s.includes('spread between positions'))).toBe(false);
	});

	it('compares one-third-octave bands only when both visits have them', () => {
		const withThirds = (t30s: number[]) => positions(t30s).map((p) => ({ ...p, thirdBands: [{ centerHz: 400, t30S: p.bands[0].t30S }] }));
		const both = compareSessions(otherRoom, makeSession(withThirds([0.5, 0.6, 0.7])), makeSession(withThirds([0.4, 0.5, 0.6])));
		expect(both.thirds?.differences.map((d) => d.centerHz)).toEqual([400]);
		expect(both.thirds?.differences[0].metrics.t30S.difference).toBeCloseTo(-0.1, 12);
		expect(both.baseline.thirds?.statistics.bandKind).toBe('third');
		expect(compareSessions(otherRoom, makeSession(withThirds([0.5])), makeSession(positions([0.4]))).thirds).toBeNull();
	});
});

describe('strong reflections: within 15 ms and less than 10 dB below the direct sound (ITU-R BS.1116-3, from memory)', () => {
	it('counts at the limits as the summary states them', () => {
		const r = (delayMs: number, levelDb: number) => ({ delayMs, levelDb });
		// 15 ms is within, 15.1 ms is not; −9.9 dB is less than 10 dB below, −10 dB is not.
		expect(strongReflectionCount([r(15, -3), r(15.1, -3), r(5, -9.9), r(5, -10)])).toBe(2);
		expect(strongReflectionsPerPosition([{ reflections: [r(1, -1)] }, { reflections: [] }])).toBe(0.5);
		expect(strongReflectionsPerPosition([])).toBeNull();
	});

});

describe('comparePositions', () => {
	it('pairs positions by label only', () => {
		expect(comparePositions([makePosition({ label: 'P1', bands: [] })], [makePosition({ label: 'P2', bands: [] })], ['P1'])).toEqual([]);
	});
});
