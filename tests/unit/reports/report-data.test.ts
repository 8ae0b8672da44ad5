import { describe, expect, it } from 'vitest';
import type { MetricDifference } from '../../../src/lib/analysis/compare';
import type { TargetBand } from '../../../src/lib/analysis/targets';
import type { ComparisonModel } from '../../../src/lib/results/types';
import { reportBandRows, smoothedResponse, usesT20Fallback } from '../../../src/lib/server/reports/report-data';
import { typicalComparison } from './helpers/comparison-factory';

// Values come out of the comparison unchanged, or from one subtraction and one division:
// 1e-12 covers the double rounding of those.
const TOLERANCE = 1e-12;

function metric(before: number | null, after: number | null): MetricDifference {
	return { before, after, difference: null, relativeChange: null, beforeCount: 3, afterCount: 3 };
}

function comparisonWith(bands: { centerHz: number; t30: [number | null, number | null]; t20: [number | null, number | null]; c80?: [number | null, number | null] }[], target: TargetBand[]): ComparisonModel {
	const base = typicalComparison();
	return {
		...base,
		differences: bands.map((band) => ({
			centerHz: band.centerHz,
			metrics: { t30S: metric(...band.t30), t20S: metric(...band.t20), c80Db: metric(...(band.c80 ?? [null, null])) }
		})),
		target,
		verdicts: {
			before: [],
			after: target.map((t) => ({ centerHz: t.centerHz, measuredS: 0.3, target: t, verdict: 'above' as const }))
		}
	};
}

describe('reportBandRows', () => {
	const target: TargetBand[] = [{ centerHz: 125.893, targetS: 0.2, lowerS: 0.15, upperS: 0.45 }];
	const rows = reportBandRows(
		comparisonWith(
			[
				{ centerHz: 250, t30: [0.56, 0.24], t20: [0.55, 0.25], c80: [8.1, 20.3] },
				{ centerHz: 125, t30: [null, 0.33], t20: [0.7, 0.32] },
				{ centerHz: 63, t30: [null, null], t20: [null, null] },
				{ centerHz: 500, t30: [0, 0.2], t20: [0, 0.2] }
			],
			target
		)
	);

	it('orders the bands from low to high', () => {
		expect(rows.map((r) => r.centerHz)).toEqual([63, 125, 250, 500]);
	});

	it('takes T30, falls back to T20 per side, and leaves a band with neither empty', () => {
		const table: [number, [number | null, string | null], [number | null, string | null]][] = [
			[63, [null, null], [null, null]],
			[125, [0.7, 't20S'], [0.33, 't30S']], // ISO 3382-2:2008: T20 where the decay range does not reach −35 dB
			[250, [0.56, 't30S'], [0.24, 't30S']]
		];
		for (const [centerHz, before, after] of table) {
			const row = rows.find((r) => r.centerHz === centerHz);
			expect(row?.before).toEqual({ valueS: before[0], metric: before[1] });
			expect(row?.after).toEqual({ valueS: after[0], metric: after[1] });
		}
		expect(usesT20Fallback(rows)).toBe(true);
		expect(usesT20Fallback(rows.filter((r) => r.centerHz === 250))).toBe(false);
	});

	it('computes the change as after − before and the relative change as (after − before)/before', () => {
		const row125 = rows[1];
		expect(Math.abs((row125.differenceS as number) - (0.33 - 0.7))).toBeLessThan(TOLERANCE);
		expect(Math.abs((row125.relativeChange as number) - (0.33 - 0.7) / 0.7)).toBeLessThan(TOLERANCE);
		expect(rows[0].differenceS).toBeNull();
		// A zero time before has no relative change (division by zero).
		expect(Math.abs((rows[3].differenceS as number) - 0.2)).toBeLessThan(TOLERANCE);
		expect(rows[3].relativeChange).toBeNull();
	});

	it('matches the target and verdict by band, nominal 125 Hz against exact 125.893 Hz (IEC 61260-1)', () => {
		expect(rows[1].target).toEqual(target[0]);
		expect(rows[1].verdictAfter).toBe('above');
		expect(rows[2].target).toBeNull();
		expect(rows[2].verdictAfter).toBeNull();
	});

	it('passes C80 through and keeps missing values null', () => {
		expect(rows[2].c80BeforeDb).toBe(8.1);
		expect(rows[2].c80AfterDb).toBe(20.3);
		expect(rows[1].c80BeforeDb).toBeNull();
	});
});

describe('smoothedResponse', () => {
	it('returns the 1/6-octave curve on the response grid', () => {
		const session = typicalComparison().baseline;
		const curve = smoothedResponse(session);
		expect(curve?.freqHz).toBe(session.averageResponse?.freqHz);
		expect(curve?.db).toBe(session.averageResponse?.smoothed['6']);
	});

	it('is null without a response or with a curve that does not fit the grid', () => {
		const session = typicalComparison().baseline;
		expect(smoothedResponse({ ...session, averageResponse: null })).toBeNull();
		const response = session.averageResponse;
		if (response === null) throw new Error('fixture has a response');
		expect(smoothedResponse({ ...session, averageResponse: { ...response, smoothed: { ...response.smoothed, '6': [1, 2, 3] } } })).toBeNull();
	});
});
