// Data for the frequency-response chart: series on one grid, the table at one-third-octave
// centres, the CSV of every point, and the modes worth marking.
import { alignSeries, interpolateLogFrequency, type AlignedSeries } from './align';
import type { CsvCell } from './csv';
import { roundSignificant } from '../format';
import type { SeriesTone } from './palette';

export interface ResponseSeries {
	label: string;
	tone: SeriesTone;
	freqHz: number[];
	db: number[];
}

export type ModeKindName = 'axial' | 'tangential' | 'oblique';

export interface ModeMarker {
	freqHz: number;
	kind: ModeKindName;
	label: string;
}

export type SmoothingChoice = '1' | '3' | '6' | '12' | '24';

export const SMOOTHING_CHOICES: readonly { key: SmoothingChoice; label: string }[] = [
	{ key: '1', label: '1/1' },
	{ key: '3', label: '1/3' },
	{ key: '6', label: '1/6' },
	{ key: '12', label: '1/12' },
	{ key: '24', label: '1/24' }
];

export function responsePlotData(series: readonly ResponseSeries[]): AlignedSeries {
	series.forEach((s, i) => {
		s.freqHz.forEach((f, j) => {
			if (!(f > 0)) throw new RangeError(`series ${i} ("${s.label}") frequency ${j} must be > 0 Hz for a log axis, got ${f}`);
		});
	});
	return alignSeries(series.map((s) => ({ x: s.freqHz, y: s.db })));
}

/**
 * Exact one-third-octave mid-band frequencies inside [minHz, maxHz], base ten: 1000·10^(x/10) Hz
 * (IEC 61260-1:2014, 5.2, G = 10^(3/10), b = 3), from the 20 Hz band (19.95 Hz) to the 20 kHz band.
 */
export function thirdOctaveCentres(minHz: number, maxHz: number): number[] {
	const centres: number[] = [];
	for (let x = -17; x <= 13; x++) {
		const f = 1000 * 10 ** (x / 10);
		if (f >= minHz && f <= maxHz) centres.push(f);
	}
	return centres;
}

/** Nominal (ISO 266) label value of an exact one-third-octave centre: three significant figures, 31.6 → 31.5, 63.1 → 63. */
export function nominalThirdOctave(exactHz: number): number {
	const NOMINAL_MANTISSAS = [1, 1.25, 1.6, 2, 2.5, 3.15, 4, 5, 6.3, 8];
	const decade = 10 ** Math.floor(Math.log10(exactHz) + 1e-9);
	const mantissa = exactHz / decade;
	let best = NOMINAL_MANTISSAS[0];
	for (const m of [...NOMINAL_MANTISSAS, 10]) if (Math.abs(Math.log(m / mantissa)) < Math.abs(Math.log(best / mantissa))) best = m;
	return roundSignificant(best * decade, 3);
}

export interface ResponseTable {
	headers: string[];
	rows: CsvCell[][];
}

// Tables already read off curves, by the curves' own arrays: a results page draws the same cached
// curves for every request, and a chart switched back to a smoothing draws its curves again.
const madeTables = new WeakMap<readonly number[], { series: ResponseSeries[]; table: ResponseTable }[]>();
const sameCurves = (a: readonly ResponseSeries[], b: readonly ResponseSeries[]) =>
	a.length === b.length && a.every((s, i) => s.label === b[i].label && s.freqHz === b[i].freqHz && s.db === b[i].db);

/** Levels at the one-third-octave centres the series span, read off the drawn curves (the curves' arrays must not change afterwards). */
export function responseTable(series: readonly ResponseSeries[]): ResponseTable {
	const key = series[0]?.db;
	if (!key) return readTable(series);
	const made = madeTables.get(key) ?? [];
	const hit = made.find((m) => sameCurves(m.series, series));
	if (hit) return hit.table;
	const table = readTable(series);
	madeTables.set(key, [...made.slice(-7), { series: series.map((s) => ({ ...s })), table }]);
	return table;
}

function readTable(series: readonly ResponseSeries[]): ResponseTable {
	const headers = ['Frequency (Hz)', ...series.map((s) => `${s.label} (dB)`)];
	const all = series.flatMap((s) => s.freqHz);
	if (all.length === 0) return { headers, rows: [] };
	const centres = thirdOctaveCentres(Math.min(...all), Math.max(...all));
	const rows = centres.map((f) => [
		nominalThirdOctave(f),
		...series.map((s) => {
			const value = interpolateLogFrequency(s.freqHz, s.db, f);
			return value === null ? null : Math.round(value * 10) / 10;
		})
	]);
	return { headers, rows };
}

/** Every drawn point, one row per frequency, for the download. */
export function responseCsvRows(series: readonly ResponseSeries[]): ResponseTable {
	const { x, ys } = responsePlotData(series);
	return {
		headers: ['Frequency (Hz)', ...series.map((s) => `${s.label} (dB)`)],
		rows: x.map((f, i) => [roundSignificant(f, 6), ...ys.map((y) => (y[i] === null ? null : Math.round(y[i]! * 100) / 100))])
	};
}

/** Modes to mark: those at or below the Schroeder frequency when it is known, all otherwise. */
export function modesToMark(modes: readonly ModeMarker[], schroederHz?: number | null): ModeMarker[] {
	const limit = schroederHz ?? Infinity;
	return modes.filter((m) => m.freqHz > 0 && m.freqHz <= limit).sort((a, b) => a.freqHz - b.freqHz);
}

/** Height of a mode tick in CSS px: axial modes carry the most energy, so they stand tallest (common practice, no source). */
export const MODE_TICK_PX: Record<ModeKindName, number> = { axial: 14, tangential: 9, oblique: 5 };
