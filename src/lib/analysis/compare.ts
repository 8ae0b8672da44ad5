// Spatial averaging over positions and the comparison of two conditions (before/after).
import { AnalysisInputError } from './errors';
import { sameBand } from './targets';

export interface BandValue {
	centerHz: number;
	valueS: number | null;
}

/**
 * One band of one position. Any object with a centre will do (the engine's per-band results
 * included); metrics are read by name and only finite numbers count, null meaning not measurable.
 */
export interface BandRow {
	centerHz: number;
}

/** A band row written out by hand: its centre and any number of metrics. */
export type MetricRow = { centerHz: number; [metric: string]: number | null };

export interface MetricAverage {
	mean: number | null;
	/** Positions with a finite value behind the mean. */
	count: number;
	/** Sample standard deviation (n − 1); null below two values. */
	std: number | null;
}

export interface AveragedBand {
	centerHz: number;
	values: Record<string, MetricAverage>;
}

export interface MetricDifference {
	before: number | null;
	after: number | null;
	/** after − before. */
	difference: number | null;
	/** (after − before) / before, for time metrics only. */
	relativeChange: number | null;
	beforeCount: number;
	afterCount: number;
}

export interface BandDifference {
	centerHz: number;
	metrics: Record<string, MetricDifference>;
}

export interface OutlierFlag {
	positionIndex: number;
	centerHz: number;
	value: number;
	/** Mean of the other positions in the band. */
	referenceMean: number;
	/** (value − referenceMean) / referenceMean. */
	deviation: number;
}

function finiteOrNull(value: unknown): number | null {
	return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

function metricOf(row: BandRow | undefined, metric: string): number | null {
	return row === undefined ? null : finiteOrNull((row as unknown as Record<string, unknown>)[metric]);
}

/** Band centres present in any position, matched across nominal/exact spellings, ascending. */
function unionOfCenters(positions: { centerHz: number }[][]): number[] {
	const centers: number[] = [];
	for (const bands of positions) {
		for (const { centerHz } of bands) {
			if (!Number.isFinite(centerHz) || centerHz <= 0) throw new AnalysisInputError('invalid_option', `band centre must be > 0 Hz, got ${centerHz}`);
			if (!centers.some((c) => sameBand(c, centerHz))) centers.push(centerHz);
		}
	}
	return centers.sort((a, b) => a - b);
}

function meanAndStd(values: number[]): MetricAverage {
	const count = values.length;
	if (count === 0) return { mean: null, count, std: null };
	const mean = values.reduce((sum, v) => sum + v, 0) / count;
	if (count < 2) return { mean, count, std: null };
	const variance = values.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (count - 1);
	return { mean, count, std: Math.sqrt(variance) };
}

/**
 * Per band and metric, the arithmetic mean over positions of the finite values, ignoring
 * nulls, with the count behind it. Reverberation times: arithmetic mean of the individual
 * times (ISO 3382-2:2008, spatial averaging; clause from memory). Level metrics in dB (C50,
 * C80) are averaged arithmetically in dB too — a stated choice, as for the times.
 */
export function averageBands<Row extends BandRow>(
	positions: Row[][],
	metrics: readonly (keyof Row & string)[]
): AveragedBand[] {
	return unionOfCenters(positions).map((centerHz) => {
		const rows = positions.map((bands) => bands.find((band) => sameBand(band.centerHz, centerHz)));
		const values: Record<string, MetricAverage> = {};
		for (const metric of metrics) {
			values[metric] = meanAndStd(rows.map((row) => metricOf(row, metric)).filter((v): v is number => v !== null));
		}
		return { centerHz, values };
	});
}

/** Power average 10·lg(mean 10^(L/10)) of curves that share one frequency grid. */
export function powerAverageCurves(curves: { freqHz: number[]; db: number[] }[]): { freqHz: number[]; db: number[] } {
	if (curves.length === 0) throw new AnalysisInputError('invalid_option', 'no curves to average');
	const grid = curves[0].freqHz;
	curves.forEach((curve, i) => {
		if (curve.db.length !== curve.freqHz.length) {
			throw new AnalysisInputError('invalid_option', `curve ${i} has ${curve.freqHz.length} frequencies but ${curve.db.length} levels`);
		}
		if (curve.freqHz.length !== grid.length) {
			throw new AnalysisInputError('invalid_option', `curve ${i} has ${curve.freqHz.length} points, curve 0 has ${grid.length}; grids differ`);
		}
		curve.freqHz.forEach((f, k) => {
			if (Math.abs(f - grid[k]) > 1e-9 * Math.max(1, Math.abs(grid[k]))) {
				throw new AnalysisInputError('invalid_option', `curve ${i} differs from curve 0 at point ${k} (${f} vs ${grid[k]} Hz); grids differ`);
			}
		});
		curve.db.forEach((level, k) => {
			if (Number.isNaN(level) || level === Infinity) throw new AnalysisInputError('invalid_option', `curve ${i} level at point ${k} is ${level}`);
		});
	});
	const db = grid.map((_, k) => {
		const meanPower = curves.reduce((sum, curve) => sum + 10 ** (curve.db[k] / 10), 0) / curves.length;
		return 10 * Math.log10(meanPower);
	});
	return { freqHz: [...grid], db };
}

/**
 * Reverberation-type metrics, for which a relative change means something: EDT, T20, T30,
 * T60, Tmid, Ts, also with a unit suffix as the engine names them (edtS, t30S, tsMs).
 */
export function isTimeMetric(metric: string): boolean {
	return /^(edt|t\d{2}|tmid|ts)(s|ms)?$/i.test(metric);
}

/**
 * Per band (union of both sides) and metric: before, after, after − before, the relative
 * change for time metrics (see isTimeMetric, or options.timeMetrics), and the counts.
 */
export function bandDifferences(
	baseline: AveragedBand[],
	treated: AveragedBand[],
	metrics: readonly string[],
	options: { timeMetrics?: readonly string[] } = {}
): BandDifference[] {
	const isTime = (metric: string) => options.timeMetrics?.includes(metric) ?? isTimeMetric(metric);
	return unionOfCenters([baseline, treated]).map((centerHz) => {
		const before = baseline.find((band) => sameBand(band.centerHz, centerHz));
		const after = treated.find((band) => sameBand(band.centerHz, centerHz));
		const result: Record<string, MetricDifference> = {};
		for (const metric of metrics) {
			const b = before?.values[metric];
			const a = after?.values[metric];
			const beforeValue = finiteOrNull(b?.mean);
			const afterValue = finiteOrNull(a?.mean);
			const difference = beforeValue !== null && afterValue !== null ? afterValue - beforeValue : null;
			const relativeChange =
				difference !== null && isTime(metric) && beforeValue !== 0 ? difference / (beforeValue as number) : null;
			result[metric] = {
				before: beforeValue,
				after: afterValue,
				difference,
				relativeChange,
				beforeCount: b?.count ?? 0,
				afterCount: a?.count ?? 0
			};
		}
		return { centerHz, metrics: result };
	});
}

/**
 * Positions whose metric (default t30S, the engine's T30) differs from the mean of the other positions in the
 * same band by more than `fraction` of that mean (default 0.2: common practice, no source).
 * The position itself is left out of its reference so one bad capture cannot mask itself.
 */
export function outlierPositions(
	positions: BandRow[][],
	options: { metric?: string; fraction?: number } = {}
): OutlierFlag[] {
	const metric = options.metric ?? 't30S';
	const fraction = options.fraction ?? 0.2;
	if (!Number.isFinite(fraction) || fraction <= 0) throw new AnalysisInputError('invalid_option', `fraction must be a finite number > 0, got ${fraction}`);
	const flags: OutlierFlag[] = [];
	for (const centerHz of unionOfCenters(positions)) {
		const values = positions.map((bands) => metricOf(bands.find((b) => sameBand(b.centerHz, centerHz)), metric));
		values.forEach((value, positionIndex) => {
			if (value === null) return;
			const others = values.filter((v, i): v is number => i !== positionIndex && v !== null);
			if (others.length === 0) return;
			const referenceMean = others.reduce((sum, v) => sum + v, 0) / others.length;
			if (referenceMean === 0) return;
			const deviation = (value - referenceMean) / referenceMean;
			if (Math.abs(deviation) > fraction) flags.push({ positionIndex, centerHz, value, referenceMean, deviation });
		});
	}
	return flags;
}
