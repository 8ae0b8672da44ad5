// Data for the time–frequency heat map: cell edges around each sample and the table of levels
// at octave frequencies every 50 ms.
import { interpolateLogFrequency, nearestIndex } from './align';
import type { CsvCell } from './csv';
import { formatBand } from '../format';
import { octaveTicks } from './ticks';

export interface Waterfall {
	timesMs: number[];
	freqHz: number[];
	/** [slice][frequency], dB re slice 0's maximum. */
	levelsDb: number[][];
}

export function checkWaterfall(w: Waterfall): void {
	if (w.timesMs.length === 0 || w.freqHz.length === 0) throw new RangeError('time–frequency data needs at least one slice and one frequency');
	if (w.levelsDb.length !== w.timesMs.length) throw new RangeError(`${w.timesMs.length} slice times but ${w.levelsDb.length} slices of levels`);
	w.levelsDb.forEach((slice, s) => {
		if (slice.length !== w.freqHz.length) throw new RangeError(`slice ${s} has ${slice.length} levels for ${w.freqHz.length} frequencies`);
	});
	w.freqHz.forEach((f, i) => {
		if (!(f > 0) || (i > 0 && !(f > w.freqHz[i - 1]))) throw new RangeError(`frequencies must be > 0 Hz and increasing; frequency ${i} is not`);
	});
	w.timesMs.forEach((t, i) => {
		if (!Number.isFinite(t) || (i > 0 && !(t > w.timesMs[i - 1]))) throw new RangeError(`slice times must increase; time ${i} does not`);
	});
}

/**
 * Edges of the cells around ascending centres: midway between neighbours (geometric mean on a
 * log axis), the outer edges half a spacing beyond the outer centres. A single centre gets ±unit.
 */
export function cellEdges(centres: readonly number[], log: boolean, unit = log ? Math.SQRT2 : 1): number[] {
	const n = centres.length;
	if (n === 0) return [];
	if (n === 1) return log ? [centres[0] / unit, centres[0] * unit] : [centres[0] - unit, centres[0] + unit];
	const mid = (a: number, b: number) => (log ? Math.sqrt(a * b) : (a + b) / 2);
	const edges = [log ? centres[0] ** 2 / mid(centres[0], centres[1]) : 2 * centres[0] - mid(centres[0], centres[1])];
	for (let i = 0; i < n - 1; i++) edges.push(mid(centres[i], centres[i + 1]));
	edges.push(log ? centres[n - 1] ** 2 / mid(centres[n - 2], centres[n - 1]) : 2 * centres[n - 1] - mid(centres[n - 2], centres[n - 1]));
	return edges;
}

export interface WaterfallTable {
	headers: string[];
	rows: CsvCell[][];
}

/**
 * Levels at the octave frequencies inside the data (read along each slice in log frequency) for
 * the slices nearest to 0, stepMs, 2·stepMs, …: a slice counts if within stepMs/2 of such a time,
 * appears once, and is listed at its own time.
 */
export function waterfallTable(w: Waterfall, stepMs = 50): WaterfallTable {
	checkWaterfall(w);
	if (!(stepMs > 0)) throw new RangeError(`stepMs must be > 0, got ${stepMs}`);
	const freqs = w.freqHz.length > 1 ? octaveTicks(w.freqHz[0], w.freqHz[w.freqHz.length - 1]) : [];
	const first = Math.ceil((w.timesMs[0] - stepMs / 2) / stepMs);
	const last = Math.floor((w.timesMs[w.timesMs.length - 1] + stepMs / 2) / stepMs);
	const slices: number[] = [];
	for (let k = first; k <= last; k++) {
		const s = nearestIndex(w.timesMs, k * stepMs);
		if (Math.abs(w.timesMs[s] - k * stepMs) <= stepMs / 2 && !slices.includes(s)) slices.push(s);
	}
	const rows: CsvCell[][] = slices.map((s) => [
		w.timesMs[s],
		...freqs.map((f) => {
			const v = interpolateLogFrequency(w.freqHz, w.levelsDb[s], f);
			return v === null ? null : Math.round(v * 10) / 10;
		})
	]);
	return { headers: ['Time (ms)', ...freqs.map((f) => `${formatBand(f)} (dB)`)], rows };
}

/** Every sample, one row per slice and frequency, for the download. */
export function waterfallCsvRows(w: Waterfall): WaterfallTable {
	checkWaterfall(w);
	const rows: CsvCell[][] = [];
	w.timesMs.forEach((t, s) => w.freqHz.forEach((f, j) => rows.push([t, f, w.levelsDb[s][j]])));
	return { headers: ['Time (ms)', 'Frequency (Hz)', 'Level (dB)'], rows };
}
