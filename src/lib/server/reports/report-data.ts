// The numbers the report shows, taken out of a comparison: per band the reverberation time
// (T30, or T20 where T30 could not be evaluated), its change, the target and verdict, and C80.
import type { BandDifference, MetricDifference } from '../../analysis/compare';
import type { BandVerdict, TargetBand } from '../../analysis/targets';
import { sameBand } from '../../analysis/targets';
import { reverberationFrom } from '../../results/reverberation';
import type { ComparisonModel, ReverberationValue, SessionSummary } from '../../results/types';

export type { ReverberationValue };

export interface ReportBandRow {
	centerHz: number;
	before: ReverberationValue;
	after: ReverberationValue;
	/** after − before, s. */
	differenceS: number | null;
	/** (after − before) / before. */
	relativeChange: number | null;
	target: TargetBand | null;
	verdictAfter: BandVerdict['verdict'] | null;
	c80BeforeDb: number | null;
	c80AfterDb: number | null;
}


export interface ResponseCurve {
	freqHz: number[];
	db: number[];
}

function finiteOrNull(value: number | null | undefined): number | null {
	return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

function metricOf(band: BandDifference, name: string): MetricDifference | undefined {
	return band.metrics[name];
}

/** One row per compared band, low to high, with the target and the after-verdict when set. */
export function reportBandRows(comparison: ComparisonModel): ReportBandRow[] {
	return [...comparison.differences]
		.sort((a, b) => a.centerHz - b.centerHz)
		.map((band) => {
			const t30 = metricOf(band, 't30S');
			const t20 = metricOf(band, 't20S');
			const c80 = metricOf(band, 'c80Db');
			const before = reverberationFrom(t30?.before, t20?.before);
			const after = reverberationFrom(t30?.after, t20?.after);
			const differenceS = before.valueS !== null && after.valueS !== null ? after.valueS - before.valueS : null;
			const relativeChange = differenceS !== null && before.valueS !== 0 ? differenceS / (before.valueS as number) : null;
			const target = comparison.target.find((t) => sameBand(t.centerHz, band.centerHz)) ?? null;
			const verdict = comparison.verdicts.after.find((v) => sameBand(v.centerHz, band.centerHz));
			return {
				centerHz: band.centerHz,
				before,
				after,
				differenceS,
				relativeChange,
				target,
				verdictAfter: verdict?.verdict ?? null,
				c80BeforeDb: finiteOrNull(c80?.before),
				c80AfterDb: finiteOrNull(c80?.after)
			};
		});
}

/** The visit's averaged response with 1/6-octave smoothing; null when there is none to draw. */
export function smoothedResponse(session: SessionSummary): ResponseCurve | null {
	const response = session.averageResponse;
	if (response === null) return null;
	const db = response.smoothed['6'];
	if (!Array.isArray(db) || db.length !== response.freqHz.length || db.length === 0) return null;
	return { freqHz: response.freqHz, db };
}

/** Whether any row uses T20 in place of T30 (the table then says so). */
export function usesT20Fallback(rows: readonly ReportBandRow[]): boolean {
	return rows.some((row) => row.before.metric === 't20S' || row.after.metric === 't20S');
}
