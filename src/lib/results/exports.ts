// Downloads of results: CSV tables (RFC 4180, units in the column names, no comment lines) and
// JSON documents tagged with a schema name and version, units in the field names.
import type { BandDifference, MetricAverage } from '../analysis/compare';
import { sameBand, type BandVerdict } from '../analysis/targets';
import type { BandMetrics } from '../analysis/types';
import { toCsv, type CsvCell } from '../charts/csv';
import { reverberationOf, type Side } from './reverberation';
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

/** Per band, the mean, sample standard deviation and count over positions of each metric; then broadband. */
export function sessionAverageCsv(summary: SessionSummary): string {
	const header = ['centre_Hz', ...AVERAGED_METRICS.flatMap((m) => [column(m, 'mean'), column(m, 'std'), `${METRIC_COLUMNS[m].name}_count`])];
	const rows = summary.average.map((band) => [band.centerHz, ...averageCells(band.values)]);
	rows.push([BROADBAND_LABEL, ...averageCells(summary.broadbandAverage)]);
	return toCsv(header, rows);
}

const COMPARED_TIMES: AveragedMetric[] = ['t30S', 't20S', 'edtS'];
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
 * visit's verdict and the metric it rests on (T30, or T20 where T30 could not be measured).
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
		'verdict_after_metric'
	];
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
			verdictMetric(band, 'after', after)
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
	bands: BandJson[];
	broadband: BandJson;
}

export function captureBandsJson(result: { bands: BandMetrics[]; broadband: BandMetrics }): CaptureBandsJson {
	return {
		schema: CAPTURE_BANDS_SCHEMA,
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
		averageResponse: summary.averageResponse ? { freqHz: [...summary.averageResponse.freqHz], db: [...summary.averageResponse.db] } : null
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
	}[];
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
				verdictAfter: target ? verdictJson(band, 'after', verdictFor(model.verdicts.after, band.centerHz)) : null
			};
		}),
		summary: [...model.summary]
	};
}
