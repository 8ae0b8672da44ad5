// Data for the reverberation-time-per-band chart: metrics and target on the band centres.
import { alignSeries } from './align';
import type { CsvCell } from './csv';
import { formatBand } from '../format';

export interface BandTimes {
	centerHz: number;
	label?: string;
	values: Record<string, number | null>;
}

export interface BandMetricSpec {
	key: string;
	label: string;
	tone: string;
}

export interface BandTarget {
	centerHz: number;
	targetS: number;
	lowerS: number;
	upperS: number;
}

export interface BandTimesPlotData {
	x: number[];
	metrics: (number | null)[][];
	target: { value: (number | null)[]; lower: (number | null)[]; upper: (number | null)[] } | null;
}

function checkCentres(centres: readonly number[], what: string): void {
	centres.forEach((f, i) => {
		if (!(f > 0) || !Number.isFinite(f)) throw new RangeError(`${what} ${i} centre must be a frequency > 0 Hz, got ${f}`);
	});
}

function finiteOrNull(value: number | null | undefined): number | null {
	return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

export function bandTimesPlotData(bands: readonly BandTimes[], metrics: readonly BandMetricSpec[], target?: readonly BandTarget[] | null): BandTimesPlotData {
	checkCentres(bands.map((b) => b.centerHz), 'band');
	const bandX = bands.map((b) => b.centerHz);
	const columns = metrics.map((m) => ({ x: bandX, y: bands.map((b) => finiteOrNull(b.values[m.key])) }));
	if (target && target.length > 0) {
		checkCentres(target.map((t) => t.centerHz), 'target');
		const targetX = target.map((t) => t.centerHz);
		const aligned = alignSeries([
			...columns,
			{ x: targetX, y: target.map((t) => t.targetS) },
			{ x: targetX, y: target.map((t) => t.lowerS) },
			{ x: targetX, y: target.map((t) => t.upperS) }
		]);
		const [value, lower, upper] = aligned.ys.slice(metrics.length);
		return { x: aligned.x, metrics: aligned.ys.slice(0, metrics.length), target: { value, lower, upper } };
	}
	const aligned = alignSeries(columns.length ? columns : [{ x: bandX, y: bandX.map(() => null) }]);
	return { x: aligned.x, metrics: aligned.ys.slice(0, metrics.length), target: null };
}

/** Frequency axis reaching half an octave beyond the outer band centres. */
export function bandAxisRange(centresHz: readonly number[]): [number, number] {
	if (centresHz.length === 0) return [20, 20000];
	checkCentres(centresHz, 'band');
	return [Math.min(...centresHz) / Math.SQRT2, Math.max(...centresHz) * Math.SQRT2];
}

/** Upper end of the time axis: the largest value or target limit plus 15 % headroom (at least 0.1 s). */
export function bandTimesCeiling(data: BandTimesPlotData): number {
	const values = [...data.metrics.flat(), ...(data.target ? data.target.upper : [])].filter((v): v is number => v !== null);
	return Math.max(0.1, ...values) * 1.15;
}

export interface BandTimesTable {
	headers: string[];
	rows: CsvCell[][];
	hasMissing: boolean;
}

/** One row per band: its name, each metric in seconds (null when missing), and the target with its limits. */
export function bandTimesTable(bands: readonly BandTimes[], metrics: readonly BandMetricSpec[], target?: readonly BandTarget[] | null): BandTimesTable {
	const withTarget = Boolean(target && target.length);
	const targetAt = new Map((target ?? []).map((t) => [t.centerHz, t]));
	const headers = ['Band', 'Centre (Hz)', ...metrics.map((m) => `${m.label} (s)`), ...(withTarget ? ['Target (s)', 'Lower (s)', 'Upper (s)'] : [])];
	let hasMissing = false;
	const rows = bands.map((b) => {
		const values = metrics.map((m) => {
			const v = finiteOrNull(b.values[m.key]);
			if (v === null) hasMissing = true;
			return v;
		});
		const t = targetAt.get(b.centerHz);
		const targetCells = withTarget ? [t?.targetS ?? null, t?.lowerS ?? null, t?.upperS ?? null] : [];
		return [b.label ?? formatBand(b.centerHz), b.centerHz, ...values, ...targetCells];
	});
	return { headers, rows, hasMissing };
}
