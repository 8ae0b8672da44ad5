import { describe, expect, it } from 'vitest';
import {
	bandSpreads,
	differenceHalfWidth,
	INTEGRATED_IMPULSE_EQUIVALENT_DECAYS,
	iso3382BandwidthHz,
	judgeDifference,
	reverberationTimeUncertainty,
	spreadOf,
	studentTQuantile,
	studentTTwoSidedProbability,
	verdictPhrase
} from '../../../src/lib/results/spread';
import { runReference } from '../analysis/helpers/python-reference';

// Means and deviations of a handful of numbers: round-off only.
const ROUND_OFF = 1e-12;

describe('Student t quantiles', () => {
	// Upper critical values t(0.975, ν) and t(0.95, ν) as printed in t-tables to three decimals
	// (NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.2, critical values of Student's t).
	it.each([
		{ p: 0.975, df: 1, t: 12.706 },
		{ p: 0.975, df: 2, t: 4.303 },
		{ p: 0.975, df: 3, t: 3.182 },
		{ p: 0.975, df: 4, t: 2.776 },
		{ p: 0.975, df: 5, t: 2.571 },
		{ p: 0.975, df: 10, t: 2.228 },
		{ p: 0.975, df: 20, t: 2.086 },
		{ p: 0.975, df: 30, t: 2.042 },
		{ p: 0.975, df: 100, t: 1.984 },
		{ p: 0.95, df: 1, t: 6.314 },
		{ p: 0.95, df: 5, t: 2.015 },
		{ p: 0.95, df: 10, t: 1.812 }
	])('t($p, $df) = $t (table, ±0.0005 for the printed rounding)', ({ p, df, t }) => {
		expect(Math.abs(studentTQuantile(p, df) - t)).toBeLessThanOrEqual(0.0005 + 1e-12);
	});

	// Tolerance 2e-8 relative: Debian's scipy 1.10 t.ppf is good to about 1e-8 (its inversion's
	// own tolerance); scipy 1.17 agrees with the closed form to 1e-14.
	it('agrees with scipy.stats.t.ppf over ν = 1…60 and four probabilities', () => {
		const queries = [0.9, 0.95, 0.975, 0.995].flatMap((p) => Array.from({ length: 60 }, (_, i) => ({ p, df: i + 1 })));
		const { t } = runReference<{ t: number[] }>('student_t.py', { queries });
		queries.forEach((q, i) => expect(Math.abs(studentTQuantile(q.p, q.df) - t[i])).toBeLessThan(2e-8 * Math.max(1, t[i])));
	});

	it('the closed forms: ν = 1 is Cauchy, P(|T| ≤ 1) = 1/2; ν = 2 gives P(|T| ≤ t) = t/√(2 + t²)', () => {
		// Abramowitz & Stegun 26.7.3 and 26.7.4 at their first terms.
		expect(Math.abs(studentTTwoSidedProbability(1, 1) - 0.5)).toBeLessThan(ROUND_OFF);
		expect(Math.abs(studentTTwoSidedProbability(3, 2) - 3 / Math.sqrt(11))).toBeLessThan(ROUND_OFF);
	});

	it('is symmetric, zero at one half, and refuses bad arguments', () => {
		expect(studentTQuantile(0.025, 5)).toBeCloseTo(-studentTQuantile(0.975, 5), 12);
		expect(studentTQuantile(0.5, 3)).toBe(0);
		expect(() => studentTQuantile(1, 3)).toThrow(RangeError);
		expect(() => studentTQuantile(0.975, 0)).toThrow(RangeError);
		expect(() => studentTQuantile(0.975, 2.5)).toThrow(RangeError);
	});
});

describe('spreadOf: mean, sample standard deviation and the 95 % interval', () => {
	it('0.50, 0.55, 0.60 s: mean 0.55, s = 0.05, half-width t(0.975, 2)·s/√3 = 4.3027·0.028868 = 0.12421 s', () => {
		// Worked by hand: deviations ±0.05 and 0, s² = (0.0025 + 0.0025)/2.
		const spread = spreadOf([0.5, 0.55, 0.6]);
		expect(spread.count).toBe(3);
		expect(Math.abs((spread.mean ?? NaN) - 0.55)).toBeLessThan(ROUND_OFF);
		expect(Math.abs((spread.std ?? NaN) - 0.05)).toBeLessThan(ROUND_OFF);
		expect(Math.abs((spread.standardError ?? NaN) - 0.05 / Math.sqrt(3))).toBeLessThan(ROUND_OFF);
		expect(Math.abs((spread.halfWidth ?? NaN) - 0.12421)).toBeLessThan(5e-6);
		expect(Math.abs((spread.low ?? NaN) - (0.55 - (spread.halfWidth ?? NaN)))).toBeLessThan(ROUND_OFF);
		expect(spread.confidence).toBe(0.95);
	});

	it('six values, 90 % interval: t(0.95, 5) = 2.015 from the table', () => {
		// 1…6: mean 3.5, s² = 17.5/5 = 3.5.
		const spread = spreadOf([1, 2, 3, 4, 5, 6], 0.9);
		expect(Math.abs((spread.std ?? NaN) - Math.sqrt(3.5))).toBeLessThan(ROUND_OFF);
		expect(Math.abs((spread.halfWidth ?? NaN) - (2.015 * Math.sqrt(3.5)) / Math.sqrt(6))).toBeLessThan(0.0005);
	});

	it('skips values that could not be measured; one value has a mean but no spread', () => {
		expect(spreadOf([null, 0.4, Number.NaN])).toMatchObject({ count: 1, mean: 0.4, std: null, halfWidth: null });
		expect(spreadOf([])).toMatchObject({ count: 0, mean: null, std: null });
	});

	it('per band over positions, matching nominal and exact centres', () => {
		const spreads = bandSpreads(
			[
				[{ centerHz: 125, t30S: 0.5 }, { centerHz: 250, t30S: 0.4 }],
				[{ centerHz: 125.89, t30S: 0.55 }, { centerHz: 250, t30S: null }],
				[{ centerHz: 125, t30S: 0.6 }]
			],
			['t30S']
		);
		expect(spreads.map((b) => b.centerHz)).toEqual([125, 250]);
		expect(spreads[0].values.t30S).toMatchObject({ count: 3, mean: expect.closeTo(0.55, 12), std: expect.closeTo(0.05, 12) });
		expect(spreads[1].values.t30S).toMatchObject({ count: 1, mean: 0.4, std: null });
	});
});

describe('ISO 3382-2 uncertainty of T20 and T30 (the standard’s formula; constants from memory)', () => {
	it('bandwidth: 0.71·f for octaves, 0.23·f for thirds', () => {
		expect(iso3382BandwidthHz(1000, 'octave')).toBeCloseTo(710, 9);
		expect(iso3382BandwidthHz(250, 'third')).toBeCloseTo(57.5, 9);
	});

	it('T30 = 1.0 s, 1 kHz octave, n = 10 decays, N = 6 positions: 0.55·√(1.152/4260) = 0.0090445 s', () => {
		// By hand: 1 + 1.52/10 = 1.152; N·B·T = 6·710·1.0 = 4260; √(1.152/4260) = 0.016445; × 0.55·1.0.
		const sigma = reverberationTimeUncertainty({ metric: 't30', reverberationTimeS: 1, centerHz: 1000, bandKind: 'octave', decaysPerPosition: 10, positions: 6 });
		expect(Math.abs(sigma - 0.0090445)).toBeLessThan(5e-7);
	});

	it('T20 = 0.5 s, 250 Hz third, one decay, one position: 0.88·0.5·√(2.9/28.75) = 0.13974 s', () => {
		// By hand: B = 0.23·250 = 57.5 Hz; 1 + 1.90/1 = 2.9; N·B·T = 28.75; √0.100870 = 0.317601; × 0.44.
		const sigma = reverberationTimeUncertainty({ metric: 't20', reverberationTimeS: 0.5, centerHz: 250, bandKind: 'third', decaysPerPosition: 1, positions: 1 });
		expect(Math.abs(sigma - 0.13974)).toBeLessThan(5e-6);
	});

	it('four times the positions halve it; an impulse response counts as 10 decays', () => {
		const input = { metric: 't30' as const, reverberationTimeS: 0.6, centerHz: 500, bandKind: 'octave' as const, decaysPerPosition: INTEGRATED_IMPULSE_EQUIVALENT_DECAYS };
		const one = reverberationTimeUncertainty({ ...input, positions: 3 });
		const four = reverberationTimeUncertainty({ ...input, positions: 12 });
		expect(four / one).toBeCloseTo(0.5, 12);
		expect(INTEGRATED_IMPULSE_EQUIVALENT_DECAYS).toBe(10);
	});

	it('refuses impossible inputs', () => {
		const good = { metric: 't30' as const, reverberationTimeS: 1, centerHz: 1000, bandKind: 'octave' as const, decaysPerPosition: 1, positions: 1 };
		expect(() => reverberationTimeUncertainty({ ...good, reverberationTimeS: 0 })).toThrow(RangeError);
		expect(() => reverberationTimeUncertainty({ ...good, positions: 1.5 })).toThrow(RangeError);
		expect(() => reverberationTimeUncertainty({ ...good, decaysPerPosition: 0 })).toThrow(RangeError);
	});
});

describe('judgeDifference: within the spread, within the JND, or beyond both', () => {
	// Spread rule: |Δ| ≤ t(0.975, ν_Welch)·√(s₁²/n₁ + s₂²/n₂) (NIST/SEMATECH e-Handbook 1.3.5.3);
	// JND of T: 5 % (ISO 3382-1:2009 Annex A, from memory).
	const before = spreadOf([0.5, 0.55, 0.6]);

	it('Welch half-width: equal s = 0.05, n = 3 each → ν = 4, t(0.975, 4)·√(2·0.05²/3) = 0.11335 s', () => {
		// By hand: s²/n = 8.333e-4 each; ν = (2v)²/(2v²/2) = 4; 2.7764·0.040825.
		expect(Math.abs((differenceHalfWidth(before, spreadOf([0.4, 0.45, 0.5])) ?? NaN) - 0.11335)).toBeLessThan(5e-6);
	});

	it('−0.10 s against a 0.113 s spread limit: within the spread', () => {
		const judgement = judgeDifference('t30S', before, spreadOf([0.4, 0.45, 0.5]));
		expect(judgement.difference).toBeCloseTo(-0.1, 12);
		expect(judgement.relativeChange).toBeCloseTo(-0.1 / 0.55, 12);
		expect(judgement).toMatchObject({ withinSpread: true, verdict: 'within-spread' });
		expect(verdictPhrase(judgement)).toBe('no larger than the spread between positions');
	});

	it('−0.20 s: beyond the spread and the 5 % JND (0.0275 s)', () => {
		const judgement = judgeDifference('t30S', before, spreadOf([0.3, 0.35, 0.4]));
		expect(judgement.jndLimit).toBeCloseTo(0.0275, 12);
		expect(judgement).toMatchObject({ withinSpread: false, withinJnd: false, verdict: 'beyond' });
	});

	it('+0.02 s with tight positions: beyond the spread but under the JND (0.05 s of 1.0 s)', () => {
		const judgement = judgeDifference('t30S', spreadOf([1.0, 1.001, 0.999]), spreadOf([1.02, 1.021, 1.019]));
		expect(judgement).toMatchObject({ withinSpread: false, withinJnd: true, verdict: 'within-jnd' });
	});

	it('C80 in dB uses an absolute JND of 1 dB', () => {
		const judgement = judgeDifference('c80Db', spreadOf([2, 2.1, 1.9]), spreadOf([2.8, 2.9, 2.7]));
		expect(judgement.jndLimit).toBe(1);
		expect(judgement.relativeChange).toBeNull();
		expect(judgement.verdict).toBe('within-jnd');
	});

	it('one position a side: judged by the JND alone, and the phrase says so', () => {
		const judgement = judgeDifference('t30S', spreadOf([1.0]), spreadOf([1.2]));
		expect(judgement.spreadLimit).toBeNull();
		expect(judgement.verdict).toBe('beyond');
		expect(verdictPhrase(judgement)).toMatch(/too few positions/);
	});

	it('nothing to judge by: unknown', () => {
		expect(judgeDifference('t30S', spreadOf([]), spreadOf([1])).verdict).toBe('unknown');
		expect(judgeDifference('custom', spreadOf([1]), spreadOf([2])).verdict).toBe('unknown');
	});
});
