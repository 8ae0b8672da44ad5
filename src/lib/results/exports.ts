// Downloads of results: CSV tables (RFC 4180, units in the column names, no comment lines) and
// JSON documents tagged with a schema name and version, units in the field names.
import type { BandDifference, MetricAverage } from '../analysis/compare';
import { sameBand, type BandVerdict } from '../analysis/targets';
import type { BandMetrics } from '../analysis/types';
import { toCsv, type CsvCell } from '../charts/csv';
import { reverberationOf, type Side } from './reverberation';
import type { GradeAssessment } from './grade';
import type { DifferenceJudgement, Spread } from './spread';
import type { BandStatistics, VisitStatistics } from './statistics';
import { AVERAGED_METRICS, type AveragedMetric, type ComparisonModel, type SessionSummary } from './types';

export const CAPTURE_BANDS_SCHEMA = 'ringdown.capture-bands/1';
export const SESSION_AVERAGE_SCHEMA = 'ringdown.session-average/1';
export const COMPARISON_SCHEMA = 'ringdown.comparison/1';

interface MetricColumn {
	name: string;
	unit: string;
	/** Decimals kept in CSV: 1 ms for times, 0.01 dB, 0.001 for D50. */
	decimals: number;
}

const METRIC_COLUMNS: Record<AveragedMetric, MetricColumn> = {
	edtS: { name: 'EDT', unit: 's', decimals: 3 },
	t20S: { name: 'T20', unit: 's', decimals: 3 },
	t30S: { name: 'T30', unit: 's', decimals: 3 },
	c50Db: { name: 'C50', unit: 'dB', decimals: 2 },
	c80Db: { name: 'C80', unit: 'dB', decimals: 2 },
	d50: { name: 'D50', unit: '', decimals: 3 },
	tsMs: { name: 'Ts', unit: 'ms', decimals: 1 }
};

const BROADBAND_LABEL = 'broadband';

function rounded(value: number | null | undefined, decimals: number): number | null {
	if (typeof value !== 'number' || !Number.isFinite(value)) return null;
	const result = Number(value.toFixed(decimals));
	return result === 0 ? 0 : result; // no "-0"
}

/** Column name with its unit: "T30_s", "C80_dB", "D50"; `part` goes between ("T30_before_s"). */
function column(metric: AveragedMetric, part?: string): string {
	const { name, unit } = METRIC_COLUMNS[metric];
	return [name, part, unit].filter((piece) => piece !== undefined && piece !== '').join('_');
}

function metricCells(band: BandMetrics): CsvCell[] {
	return AVERAGED_METRICS.map((metric) => rounded(band[metric], METRIC_COLUMNS[metric].decimals));
}

const BAND_HEADER = ['centre_Hz', ...AVERAGED_METRICS.map((m) => column(m)), 'peak_to_noise_dB', 'biased'];

function bandRow(band: BandMetrics, centre: CsvCell): CsvCell[] {
	return [centre, ...metricCells(band), rounded(band.peakToNoiseDb, 1), band.biased ? 'true' : 'false'];
}

/** One row per band, then a "broadband" row. */
export function captureBandsCsv(result: { bands: BandMetrics[]; broadband: BandMetrics }): string {
	const rows = [...result.bands].sort((a, b) => a.centerHz - b.centerHz).map((band) => bandRow(band, band.centerHz));
	rows.push(bandRow(result.broadband, BROADBAND_LABEL));
	return toCsv(BAND_HEADER, rows);
}

/** Every position's bands of a visit, one row per position and band, each position closed by its broadband row. */
export function sessionPositionsCsv(summary: SessionSummary): string {
	const rows: CsvCell[][] = [];
	for (const position of summary.positions) {
		const lead = [position.positionLabel, position.captureId];
		for (const band of [...position.bands].sort((a, b) => a.centerHz - b.centerHz)) rows.push([...lead, ...bandRow(band, band.centerHz)]);
		rows.push([...lead, ...bandRow(position.broadband, BROADBAND_LABEL)]);
	}
	return toCsv(['position', 'capture_id', ...BAND_HEADER], rows);
}

function averageCells(values: Record<string, MetricAverage>): CsvCell[] {
	return AVERAGED_METRICS.flatMap((metric) => {
		const average = values[metric];
		const decimals = METRIC_COLUMNS[metric].decimals;
		return [rounded(average?.mean, decimals), rounded(average?.std, decimals), average?.count ?? 0];
	});
}

/** The 95 % interval of each metric's mean (low, high) and ISO 3382-2's σ of T30 and T20. */
function spreadCells(metrics: Record<AveragedMetric, Spread> | undefined, uncertainty: BandStatistics['uncertainty'] | null): CsvCell[] {
	return [
		...AVERAGED_METRICS.flatMap((metric) => {
			const decimals = METRIC_COLUMNS[metric].decimals;
			return [rounded(metrics?.[metric]?.low, decimals), rounded(metrics?.[metric]?.high, decimals)];
		}),
		rounded(uncertainty?.t30S, 3),
		rounded(uncertainty?.t20S, 3)
	];
}

const SPREAD_HEADER = [...AVERAGED_METRICS.flatMap((m) => [column(m, 'ci95_low'), column(m, 'ci95_high')]), 'T30_iso_sigma_s', 'T20_iso_sigma_s'];
const GRADE_HEADER = ['grade', 'source_positions', 'microphone_positions', 'combinations'];

function gradeCells(grade: GradeAssessment): CsvCell[] {
	return [grade.grade ?? 'below survey', grade.counts.sources, grade.counts.microphones, grade.counts.combinations];
}

/**
 * Per band, the mean, sample standard deviation and count over positions of each metric; then
 * broadband. After them: each mean's 95 % confidence interval, ISO 3382-2's σ of T30 and T20,
 * and the visit's measurement grade with its counts (the same on every row).
 */
export function sessionAverageCsv(summary: SessionSummary): string {
	const header = ['centre_Hz', ...AVERAGED_METRICS.flatMap((m) => [column(m, 'mean'), column(m, 'std'), `${METRIC_COLUMNS[m].name}_count`]), ...SPREAD_HEADER, ...GRADE_HEADER];
	const stats = summary.statistics;
	const grade = gradeCells(stats.grade);
	const rows = summary.average.map((band) => {
		const s = stats.bands.find((b) => sameBand(b.centerHz, band.centerHz));
		return [band.centerHz, ...averageCells(band.values), ...spreadCells(s?.metrics, s?.uncertainty ?? null), ...grade];
	});
	rows.push([BROADBAND_LABEL, ...averageCells(summary.broadbandAverage), ...spreadCells(stats.broadband, null), ...grade]);
	return toCsv(header, rows);
}

const COMPARED_TIMES: AveragedMetric[] = ['t30S', 't20S', 'edtS'];
/** Metrics whose differences are judged against the spread in the comparison table. */
const JUDGED: AveragedMetric[] = ['t30S', 't20S', 'c80Db'];
const COMPARED_LEVELS: AveragedMetric[] = ['c50Db', 'c80Db'];
const METRIC_NAMES: Record<'t30S' | 't20S', string> = { t30S: 'T30', t20S: 'T20' };

function verdictFor(verdicts: BandVerdict[], centerHz: number): BandVerdict | undefined {
	return verdicts.find((v) => sameBand(v.centerHz, centerHz));
}

function verdictMetric(band: BandDifference, side: Side, verdict: BandVerdict | undefined): string | null {
	const metric = reverberationOf(band, side).metric;
	return verdict && verdict.verdict !== 'unknown' && metric ? METRIC_NAMES[metric] : null;
}

/**
 * Per band of the matched positions' averages: before, after, difference and relative change
 * of T30, T20 and EDT; before, after and difference of C50 and C80; the target range; each
 * visit's verdict and the metric it rests on (T30, or T20 where T30 could not be measured); the
 * T30, T20 and C80 differences judged against the spread of the positions (judgeDifference:
 * within-spread, within-jnd, beyond, unknown) with the spread's limit; each visit's grade.
 */
export function comparisonCsv(model: ComparisonModel): string {
	const header = [
		'centre_Hz',
		...COMPARED_TIMES.flatMap((m) => [column(m, 'before'), column(m, 'after'), column(m, 'difference'), `${METRIC_COLUMNS[m].name}_change_pct`]),
		...COMPARED_LEVELS.flatMap((m) => [column(m, 'before'), column(m, 'after'), column(m, 'difference')]),
		'target_s',
		'target_lower_s',
		'target_upper_s',
		'verdict_before',
		'verdict_before_metric',
		'verdict_after',
		'verdict_after_metric',
		...JUDGED.flatMap((m) => [`${METRIC_COLUMNS[m].name}_against_spread`, column(m, 'spread_limit')]),
		'grade_before',
		'grade_after'
	];
	const grades = [model.matchedStatistics.baseline.grade.grade ?? 'below survey', model.matchedStatistics.treated.grade.grade ?? 'below survey'];
	const rows = model.differences.map((band): CsvCell[] => {
		const times = COMPARED_TIMES.flatMap((metric) => {
			const d = band.metrics[metric];
			const decimals = METRIC_COLUMNS[metric].decimals;
			const pct = d?.relativeChange === null || d?.relativeChange === undefined ? null : 100 * d.relativeChange;
			return [rounded(d?.before, decimals), rounded(d?.after, decimals), rounded(d?.difference, decimals), rounded(pct, 1)];
		});
		const levels = COMPARED_LEVELS.flatMap((metric) => {
			const d = band.metrics[metric];
			const decimals = METRIC_COLUMNS[metric].decimals;
			return [rounded(d?.before, decimals), rounded(d?.after, decimals), rounded(d?.difference, decimals)];
		});
		const target = model.target.find((t) => sameBand(t.centerHz, band.centerHz));
		const before = target ? verdictFor(model.verdicts.before, band.centerHz) : undefined;
		const after = target ? verdictFor(model.verdicts.after, band.centerHz) : undefined;
		return [
			band.centerHz,
			...times,
			...levels,
			rounded(target?.targetS, 3),
			rounded(target?.lowerS, 3),
			rounded(target?.upperS, 3),
			before?.verdict ?? null,
			verdictMetric(band, 'before', before),
			after?.verdict ?? null,
			verdictMetric(band, 'after', after),
			...JUDGED.flatMap((metric) => {
				const j = model.judgements.find((x) => sameBand(x.centerHz, band.centerHz))?.metrics[metric];
				return [j?.verdict ?? 'unknown', rounded(j?.spreadLimit, METRIC_COLUMNS[metric].decimals)];
			}),
			...grades
		];
	});
	return toCsv(header, rows);
}

export interface BandJson {
	centerHz: number;
	exactHz: number;
	edtS: number | null;
	t20S: number | null;
	t30S: number | null;
	c50Db: number | null;
	c80Db: number | null;
	d50: number | null;
	tsMs: number | null;
	peakToNoiseDb: number | null;
	curvaturePct: number | null;
	biased: boolean;
}

function bandJson(band: BandMetrics): BandJson {
	return {
		centerHz: band.centerHz,
		exactHz: band.exactHz,
		edtS: band.edtS,
		t20S: band.t20S,
		t30S: band.t30S,
		c50Db: band.c50Db,
		c80Db: band.c80Db,
		d50: band.d50,
		tsMs: band.tsMs,
		peakToNoiseDb: band.peakToNoiseDb,
		curvaturePct: band.curvaturePct,
		biased: band.biased
	};
}

export interface CaptureBandsJson {
	schema: typeof CAPTURE_BANDS_SCHEMA;
	/** The capture's note on its conditions ("door open"), null when it has none; absent when not asked for. */
	note?: string | null;
	bands: BandJson[];
	broadband: BandJson;
}

export function captureBandsJson(result: { bands: BandMetrics[]; broadband: BandMetrics }, note?: string | null): CaptureBandsJson {
	return {
		schema: CAPTURE_BANDS_SCHEMA,
		...(note === undefined ? {} : { note }),
		bands: [...result.bands].sort((a, b) => a.centerHz - b.centerHz).map(bandJson),
		broadband: bandJson(result.broadband)
	};
}

export type MetricAverages = Record<AveragedMetric, MetricAverage>;

export interface SessionAverageJson {
	schema: typeof SESSION_AVERAGE_SCHEMA;
	sessionId: number;
	conditionLabel: string;
	measuredOn: string;
	positions: { positionLabel: string; captureId: number }[];
	bands: { centerHz: number; metrics: MetricAverages }[];
	broadband: MetricAverages;
	outliers: SessionSummary['outliers'];
	/** Power average of the positions' unsmoothed responses. */
	averageResponse: { freqHz: number[]; db: number[] } | null;
	/** Per band the spread of each metric with its 95 % interval, ISO 3382-2's σ of T20/T30; T_mid; the grade. */
	statistics: StatisticsJson;
	/** The same over one-third-octave bands, when the positions have them. */
	thirds: { bands: { centerHz: number; metrics: MetricAverages }[]; statistics: StatisticsJson } | null;
}

export interface StatisticsJson {
	bandKind: VisitStatistics['bandKind'];
	positions: number;
	bands: { centerHz: number; metrics: Record<AveragedMetric, Spread>; uncertainty: BandStatistics['uncertainty'] }[];
	broadband: Record<AveragedMetric, Spread>;
	midFrequency: VisitStatistics['midFrequency'];
	grade: GradeAssessment;
}

export function statisticsJson(stats: VisitStatistics): StatisticsJson {
	return structuredClone({ bandKind: stats.bandKind, positions: stats.positions, bands: stats.bands, broadband: stats.broadband, midFrequency: stats.midFrequency, grade: stats.grade });
}

function averagesJson(values: Record<string, MetricAverage>): MetricAverages {
	const out = {} as MetricAverages;
	for (const metric of AVERAGED_METRICS) {
		const average = values[metric];
		out[metric] = { mean: average?.mean ?? null, count: average?.count ?? 0, std: average?.std ?? null };
	}
	return out;
}

export function sessionAverageJson(summary: SessionSummary): SessionAverageJson {
	return {
		schema: SESSION_AVERAGE_SCHEMA,
		sessionId: summary.sessionId,
		conditionLabel: summary.conditionLabel,
		measuredOn: summary.measuredOn,
		positions: summary.positions.map((p) => ({ positionLabel: p.positionLabel, captureId: p.captureId })),
		bands: summary.average.map((band) => ({ centerHz: band.centerHz, metrics: averagesJson(band.values) })),
		broadband: averagesJson(summary.broadbandAverage),
		outliers: summary.outliers.map((o) => ({ ...o })),
		averageResponse: summary.averageResponse ? { freqHz: [...summary.averageResponse.freqHz], db: [...summary.averageResponse.db] } : null,
		statistics: statisticsJson(summary.statistics),
		thirds: summary.thirds
			? { bands: summary.thirds.average.map((band) => ({ centerHz: band.centerHz, metrics: averagesJson(band.values) })), statistics: statisticsJson(summary.thirds.statistics) }
			: null
	};
}

interface VerdictJson {
	verdict: BandVerdict['verdict'];
	measuredS: number | null;
	/** "T30", or "T20" where T30 could not be measured; null when unknown. */
	metric: string | null;
}

export interface ComparisonJson {
	schema: typeof COMPARISON_SCHEMA;
	room: ComparisonModel['room'];
	baseline: { sessionId: number; conditionLabel: string; measuredOn: string };
	treated: { sessionId: number; conditionLabel: string; measuredOn: string };
	matchedPositions: string[];
	baselineOnly: string[];
	treatedOnly: string[];
	bands: {
		centerHz: number;
		/** Per metric (unit in its name): before, after, difference = after − before, relativeChange = difference / before. */
		metrics: BandDifference['metrics'];
		target: { targetS: number; lowerS: number; upperS: number } | null;
		verdictBefore: VerdictJson | null;
		verdictAfter: VerdictJson | null;
		/** Each metric's difference judged against the spread of the matched positions. */
		judgements: Record<string, DifferenceJudgement>;
	}[];
	/** Each matched position before and after, band by band (same shape as `bands[].metrics`). */
	positions: { positionLabel: string; bands: { centerHz: number; metrics: BandDifference['metrics'] }[]; broadband: BandDifference['metrics'] }[];
	/** Both visits over the matched positions: spread, T_mid and grade. */
	statistics: { baseline: StatisticsJson; treated: StatisticsJson };
	/** One-third-octave bands compared, when both visits have them. */
	thirds: { bands: { centerHz: number; metrics: BandDifference['metrics']; judgements: Record<string, DifferenceJudgement> }[] } | null;
	summary: string[];
}

function verdictJson(band: BandDifference, side: Side, verdict: BandVerdict | undefined): VerdictJson | null {
	if (!verdict) return null;
	return { verdict: verdict.verdict, measuredS: verdict.measuredS, metric: verdictMetric(band, side, verdict) };
}

const visitJson = (s: SessionSummary) => ({ sessionId: s.sessionId, conditionLabel: s.conditionLabel, measuredOn: s.measuredOn });

export function comparisonJson(model: ComparisonModel): ComparisonJson {
	return {
		schema: COMPARISON_SCHEMA,
		room: { ...model.room },
		baseline: visitJson(model.baseline),
		treated: visitJson(model.treated),
		matchedPositions: [...model.matchedPositions],
		baselineOnly: [...model.baselineOnly],
		treatedOnly: [...model.treatedOnly],
		bands: model.differences.map((band) => {
			const target = model.target.find((t) => sameBand(t.centerHz, band.centerHz));
			return {
				centerHz: band.centerHz,
				metrics: Object.fromEntries(Object.entries(band.metrics).map(([metric, d]) => [metric, { ...d }])),
				target: target ? { targetS: target.targetS, lowerS: target.lowerS, upperS: target.upperS } : null,
				verdictBefore: target ? verdictJson(band, 'before', verdictFor(model.verdicts.before, band.centerHz)) : null,
				verdictAfter: target ? verdictJson(band, 'after', verdictFor(model.verdicts.after, band.centerHz)) : null,
				judgements: structuredClone(model.judgements.find((j) => sameBand(j.centerHz, band.centerHz))?.metrics ?? {})
			};
		}),
		positions: model.positionDifferences.map((p) => ({
			positionLabel: p.positionLabel,
			bands: p.differences.map((d) => ({ centerHz: d.centerHz, metrics: structuredClone(d.metrics) })),
			broadband: structuredClone(p.broadband)
		})),
		statistics: { baseline: statisticsJson(model.matchedStatistics.baseline), treated: statisticsJson(model.matchedStatistics.treated) },
		thirds: model.thirds
			? {
					bands: model.thirds.differences.map((d) => ({
						centerHz: d.centerHz,
						metrics: structuredClone(d.metrics),
						judgements: structuredClone(model.thirds?.judgements.find((j) => sameBand(j.centerHz, d.centerHz))?.metrics ?? {})
					}))
				}
			: null,
		summary: [...model.summary]
	};
}
