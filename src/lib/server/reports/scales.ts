// Mapping of data values onto a chart's plot area: log-frequency and linear axes.

export interface PlotArea {
	x: number;
	y: number;
	width: number;
	height: number;
}

export type Scale = (value: number) => number;

function checkDomain(name: string, lo: number, hi: number): void {
	if (!Number.isFinite(lo) || !Number.isFinite(hi) || !(hi > lo)) throw new RangeError(`${name} domain needs finite lo < hi, got ${lo}…${hi}`);
}

/** Position on a logarithmic axis: equal frequency ratios get equal lengths. */
export function logScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
	const [lo, hi] = domain;
	checkDomain('log', lo, hi);
	if (!(lo > 0)) throw new RangeError(`log domain must be > 0, got ${lo}`);
	const span = Math.log(hi / lo);
	return (value) => range[0] + ((range[1] - range[0]) * Math.log(value / lo)) / span;
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
	const [lo, hi] = domain;
	checkDomain('linear', lo, hi);
	return (value) => range[0] + ((range[1] - range[0]) * (value - lo)) / (hi - lo);
}

/** Finite minimum and maximum of several series; null when none has a finite value. */
export function extent(series: readonly (readonly (number | null)[])[]): [number, number] | null {
	let min = Infinity;
	let max = -Infinity;
	for (const values of series) {
		for (const value of values) {
			if (value === null || !Number.isFinite(value)) continue;
			if (value < min) min = value;
			if (value > max) max = value;
		}
	}
	return min <= max ? [min, max] : null;
}

/**
 * dB axis range on a fixed grid: the data's extent widened to whole grid steps, grown a step at
 * the top, then the bottom, in turn until `minSpan` tall, and cut to `maxSpan` keeping the top
 * (deep notches are cut, peaks never are).
 */
export function gridRange(dataExtent: [number, number], step: number, minSpan: number, maxSpan: number): [number, number] {
	if (!(step > 0) || !(minSpan >= step) || !(maxSpan >= minSpan)) throw new RangeError(`need 0 < step ≤ minSpan ≤ maxSpan, got ${step}, ${minSpan}, ${maxSpan}`);
	let hi = Math.ceil(dataExtent[1] / step) * step;
	let lo = Math.floor(dataExtent[0] / step) * step;
	while (hi - lo < minSpan) {
		hi += step;
		if (hi - lo < minSpan) lo -= step;
	}
	if (hi - lo > maxSpan) lo = hi - Math.floor(maxSpan / step) * step;
	return [lo, hi];
}
