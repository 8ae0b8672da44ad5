// Putting series on one x grid (uPlot draws every series against a single x array), and reading
// a curve between its points on a log-frequency axis.

export interface XYSeries {
	x: readonly number[];
	y: readonly (number | null)[];
}

export interface AlignedSeries {
	x: number[];
	/** One array per input series, null where that series has no point at x. */
	ys: (number | null)[][];
}

function checkSeries(series: XYSeries, index: number): void {
	if (series.x.length !== series.y.length) {
		throw new RangeError(`series ${index} has ${series.x.length} x values and ${series.y.length} y values`);
	}
	series.x.forEach((x, i) => {
		if (!Number.isFinite(x)) throw new RangeError(`series ${index} x[${i}] is not a finite number`);
	});
}

const finiteOrNull = (y: number | null) => (y !== null && Number.isFinite(y) ? y : null);

/** Whether every series has the same strictly ascending x values (the union is then that grid). */
function onOneAscendingGrid(series: readonly XYSeries[]): boolean {
	const grid = series[0].x;
	for (let i = 1; i < grid.length; i++) if (!(grid[i] > grid[i - 1])) return false;
	return series.every((s) => s.x === grid || (s.x.length === grid.length && s.x.every((v, i) => v === grid[i])));
}

/** Union of all x values in ascending order; each series keeps its values at its own x. */
export function alignSeries(series: readonly XYSeries[]): AlignedSeries {
	series.forEach(checkSeries);
	// Responses of one analysis engine share their grid: no union to work out.
	if (series.length > 0 && onOneAscendingGrid(series)) return { x: [...series[0].x], ys: series.map((s) => s.y.map(finiteOrNull)) };
	const x = [...new Set(series.flatMap((s) => s.x))].sort((a, b) => a - b);
	const position = new Map(x.map((value, i) => [value, i]));
	const ys = series.map((s) => {
		const column: (number | null)[] = new Array(x.length).fill(null);
		s.x.forEach((value, i) => {
			const y = s.y[i];
			column[position.get(value)!] = y !== null && Number.isFinite(y) ? y : null;
		});
		return column;
	});
	return { x, ys };
}

/**
 * Value at atHz by straight lines between points on a log-frequency axis (how the curve is
 * drawn); null outside the curve or next to a missing point. freqHz must be ascending and > 0.
 */
export function interpolateLogFrequency(freqHz: readonly number[], values: readonly (number | null)[], atHz: number): number | null {
	if (freqHz.length !== values.length) throw new RangeError('frequencies and values differ in length');
	if (!(atHz > 0) || freqHz.length === 0) return null;
	if (atHz < freqHz[0] || atHz > freqHz[freqHz.length - 1]) return null;
	let hi = 0;
	while (freqHz[hi] < atHz) hi++;
	if (freqHz[hi] === atHz) return values[hi];
	const lo = hi - 1;
	const a = values[lo];
	const b = values[hi];
	if (a === null || b === null) return null;
	const t = Math.log(atHz / freqHz[lo]) / Math.log(freqHz[hi] / freqHz[lo]);
	return a + (b - a) * t;
}

/** Index of the entry of an ascending array nearest to value (in ratio when log is true). */
export function nearestIndex(sorted: readonly number[], value: number, log = false): number {
	if (sorted.length === 0) throw new RangeError('cannot search an empty array');
	const distance = (v: number) => (log ? Math.abs(Math.log(v / value)) : Math.abs(v - value));
	let best = 0;
	for (let i = 1; i < sorted.length; i++) if (distance(sorted[i]) < distance(sorted[best])) best = i;
	return best;
}
