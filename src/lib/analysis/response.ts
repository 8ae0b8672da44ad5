// Frequency response of an impulse response, fractional-octave smoothing, and a log-spaced
// decimation of the curve for charts.
import { AnalysisInputError } from './errors';
import { realFftPlan } from './fft';

export const SMOOTHING_FRACTIONS = [1, 3, 6, 12, 24] as const;
export type SmoothingFraction = (typeof SMOOTHING_FRACTIONS)[number];

/** Level given to bins with zero power, instead of −Infinity. */
export const POWER_FLOOR_DB = -300;
export const POWER_FLOOR = 10 ** (POWER_FLOOR_DB / 10);

export interface Spectrum {
	freqHz: Float64Array;
	powerDb: Float64Array;
}

export interface LogSpacedCurve {
	freqHz: number[];
	db: number[];
}

export function isPowerOfTwo(n: number): boolean {
	return Number.isInteger(n) && n >= 1 && (n & (n - 1)) === 0;
}

export function nextPowerOfTwo(n: number): number {
	let size = 4; // the smallest size PowerSpectrumPlan takes
	while (size < n) size *= 2;
	return size;
}

/**
 * Power spectra of real signals zero-padded to fftSize, by the engine's cached real FFT plan of
 * that size (sizes below its smallest, 8, by the DFT's definition).
 */
export class PowerSpectrumPlan {
	readonly fftSize: number;
	/** Bins 0…fftSize/2 (DC to Nyquist). */
	readonly binCount: number;
	private readonly spectrum: Float64Array;

	constructor(fftSize: number) {
		if (!isPowerOfTwo(fftSize) || fftSize < 4) {
			throw new RangeError(`FFT size must be a power of two ≥ 4, got ${fftSize}`);
		}
		this.fftSize = fftSize;
		this.binCount = fftSize / 2 + 1;
		this.spectrum = new Float64Array(fftSize + 2);
	}

	frequencies(sampleRate: number, binCount = this.binCount): Float64Array {
		const freqHz = new Float64Array(this.checkBinCount(binCount));
		for (let k = 0; k < freqHz.length; k++) freqHz[k] = (k * sampleRate) / this.fftSize;
		return freqHz;
	}

	/** 10·lg|X(k)|² of the first binCount bins of x zero-padded to fftSize, floored at POWER_FLOOR_DB. */
	powerDb(x: Float64Array, binCount = this.binCount, out = new Float64Array(binCount)): Float64Array {
		if (x.length > this.fftSize) throw new RangeError(`signal of ${x.length} samples exceeds FFT size ${this.fftSize}`);
		this.checkBinCount(binCount);
		if (out.length < binCount) throw new RangeError('output array is shorter than binCount');
		const spectrum = this.spectrum;
		if (this.fftSize >= 8) {
			realFftPlan(this.fftSize).forward(x, spectrum); // bins 0…N/2
		} else {
			for (let k = 0; k < this.binCount; k++) {
				let re = 0;
				let im = 0;
				for (let n = 0; n < x.length; n++) {
					re += x[n] * Math.cos((2 * Math.PI * k * n) / this.fftSize);
					im -= x[n] * Math.sin((2 * Math.PI * k * n) / this.fftSize);
				}
				spectrum[2 * k] = re;
				spectrum[2 * k + 1] = im;
			}
		}
		for (let k = 0; k < binCount; k++) {
			const re = spectrum[2 * k];
			const im = spectrum[2 * k + 1];
			out[k] = 10 * Math.log10(Math.max(re * re + im * im, POWER_FLOOR));
		}
		return out;
	}

	private checkBinCount(binCount: number): number {
		if (!Number.isInteger(binCount) || binCount < 1 || binCount > this.binCount) {
			throw new RangeError(`binCount must be an integer in 1…${this.binCount}, got ${binCount}`);
		}
		return binCount;
	}
}

// Half-Hann tapers (the rising or falling half of a Hann window), length points strictly
// between 0 and 1 so neither end sample is wasted.
export function applyHalfHannFadeIn(x: Float64Array, length: number): void {
	const n = Math.min(length, x.length);
	for (let k = 0; k < n; k++) x[k] *= 0.5 * (1 - Math.cos((Math.PI * (k + 1)) / (n + 1)));
}


export function applyHalfHannFadeOut(x: Float64Array, length: number): void {
	const n = Math.min(length, x.length);
	const start = x.length - n;
	for (let k = 0; k < n; k++) x[start + k] *= 0.5 * (1 + Math.cos((Math.PI * (k + 1)) / (n + 1)));
}

function checkSignal(ir: Float64Array, sampleRate: number): void {
	if (ir.length === 0) throw new AnalysisInputError('no_samples', 'impulse response is empty');
	if (!Number.isFinite(sampleRate) || sampleRate <= 0) throw new AnalysisInputError('invalid_option', `sampleRate must be > 0, got ${sampleRate}`);
	for (let i = 0; i < ir.length; i++) {
		if (!Number.isFinite(ir[i])) throw new AnalysisInputError('non_finite_samples', `sample ${i} is not a finite number (${ir[i]})`);
	}
}

export interface FrequencyResponseOptions {
	/** First sample analysed (default 0; pass the direct-sound onset). */
	startIndex?: number;
	/** Analysed length (default: the rest of the IR, at most 1 s). */
	windowS?: number;
	/** FFT size, a power of two ≥ the window (default: the next power of two). */
	fftSize?: number;
}

/**
 * Power response 10·lg|H(f)|² of ir[startIndex…] over windowS, with a half-Hann fade-out over
 * the last 10 % of the window so the cut does not ring, zero-padded to a power of two.
 */
export function frequencyResponse(
	ir: Float64Array,
	sampleRate: number,
	options: FrequencyResponseOptions = {}
): Spectrum {
	checkSignal(ir, sampleRate);
	const startIndex = options.startIndex ?? 0;
	if (!Number.isInteger(startIndex) || startIndex < 0 || startIndex >= ir.length) {
		throw new AnalysisInputError('invalid_option', `startIndex must be an integer in 0…${ir.length - 1}, got ${startIndex}`);
	}
	if (options.windowS !== undefined && !(Number.isFinite(options.windowS) && options.windowS > 0)) {
		throw new AnalysisInputError('invalid_option', `windowS must be a finite number of seconds > 0, got ${options.windowS}`);
	}
	const wanted = Math.max(1, Math.round((options.windowS ?? 1) * sampleRate));
	const length = Math.min(ir.length - startIndex, wanted);
	const segment = ir.slice(startIndex, startIndex + length);
	applyHalfHannFadeOut(segment, Math.floor(0.1 * length));
	const fftSize = options.fftSize ?? nextPowerOfTwo(length);
	if (fftSize < length) throw new AnalysisInputError('invalid_option', `fftSize ${fftSize} is shorter than the ${length}-sample window`);
	const plan = new PowerSpectrumPlan(fftSize);
	return { freqHz: plan.frequencies(sampleRate), powerDb: plan.powerDb(segment) };
}

function checkCurve(freqHz: ArrayLike<number>, values: ArrayLike<number>, what: string): void {
	if (freqHz.length !== values.length) {
		throw new AnalysisInputError('invalid_option', `${what}: ${freqHz.length} frequencies but ${values.length} values`);
	}
	if (freqHz.length === 0) throw new AnalysisInputError('invalid_option', `${what}: the curve is empty`);
	for (let k = 0; k < freqHz.length; k++) {
		if (!Number.isFinite(freqHz[k]) || freqHz[k] < 0 || (k > 0 && freqHz[k] <= freqHz[k - 1])) {
			throw new AnalysisInputError('invalid_option', `${what}: frequencies must be finite, ≥ 0 and increasing (index ${k})`);
		}
		if (Number.isNaN(values[k])) throw new AnalysisInputError('invalid_option', `${what}: value at index ${k} is not a number`);
	}
}

/**
 * 1/b-octave smoothing: each bin becomes the mean power of the bins whose frequency lies in
 * [f·2^(−1/2b), f·2^(1/2b)] — a rectangular window, constant width in log frequency, each bin
 * inside weighted equally (Hatziantoniou & Mourjopoulos, JAES 48(4):259, 2000, from memory).
 * Window sums come from prefix sums kept in double-double precision, so the cost is O(n)
 * and quiet bands beside loud ones keep their level (a plain prefix sum loses ~1e-16 of the
 * total).
 */
export function smoothFractionalOctave(
	freqHz: Float64Array,
	powerDb: Float64Array,
	fraction: SmoothingFraction
): Float64Array {
	checkFraction(fraction);
	checkCurve(freqHz, powerDb, 'smoothFractionalOctave');
	const n = freqHz.length;
	const { prefixHi, prefixLo } = powerPrefixSums(powerDb);
	const halfWidth = 2 ** (1 / (2 * fraction));
	const smoothed = new Float64Array(n);
	let low = 0; // first bin ≥ lower edge
	let high = 0; // first bin > upper edge
	for (let k = 0; k < n; k++) {
		const lowerEdge = freqHz[k] / halfWidth;
		const upperEdge = freqHz[k] * halfWidth;
		while (freqHz[low] < lowerEdge) low++;
		if (high <= k) high = k + 1;
		while (high < n && freqHz[high] <= upperEdge) high++;
		smoothed[k] = windowMeanDb(prefixHi, prefixLo, low, high);
	}
	return smoothed;
}

function checkFraction(fraction: number): void {
	if (!(SMOOTHING_FRACTIONS as readonly number[]).includes(fraction)) {
		throw new AnalysisInputError('invalid_option', `fraction must be one of ${SMOOTHING_FRACTIONS.join(', ')}, got ${fraction}`);
	}
}

/** Prefix sums of the bins' powers in double-double precision (hi + lo). */
function powerPrefixSums(powerDb: Float64Array): { prefixHi: Float64Array; prefixLo: Float64Array } {
	const n = powerDb.length;
	const prefixHi = new Float64Array(n + 1);
	const prefixLo = new Float64Array(n + 1);
	for (let k = 0; k < n; k++) {
		const power = 10 ** (powerDb[k] / 10);
		// Knuth's TwoSum: hi + lo = prefixHi[k] + power exactly.
		const hi = prefixHi[k] + power;
		const virtual = hi - prefixHi[k];
		const error = prefixHi[k] - (hi - virtual) + (power - virtual);
		prefixHi[k + 1] = hi;
		prefixLo[k + 1] = prefixLo[k] + error;
	}
	return { prefixHi, prefixLo };
}

/** Mean power of bins low…high−1 in dB, floored. */
function windowMeanDb(prefixHi: Float64Array, prefixLo: Float64Array, low: number, high: number): number {
	const sum = prefixHi[high] - prefixHi[low] + (prefixLo[high] - prefixLo[low]);
	return 10 * Math.log10(Math.max(sum / (high - low), POWER_FLOOR));
}

/** First index whose frequency is ≥ edge (strict: > edge), from `from` on; n if none. */
function firstBin(freqHz: Float64Array, from: number, edge: number, strict: boolean): number {
	let low = from;
	let high = freqHz.length;
	while (low < high) {
		const middle = (low + high) >>> 1;
		if (strict ? freqHz[middle] > edge : freqHz[middle] >= edge) high = middle;
		else low = middle + 1;
	}
	return low;
}

/**
 * The same curves as logSpacedCurve(freqHz, smoothFractionalOctave(freqHz, powerDb, b), options).db
 * for each b, number for number, with the smoothing computed only at the bins the log-spaced
 * points read (two per point) and one prefix sum for all the fractions.
 */
export function smoothedLogSpacedCurves(
	freqHz: Float64Array,
	powerDb: Float64Array,
	fractions: readonly SmoothingFraction[],
	options: LogSpacedOptions = {}
): number[][] {
	for (const fraction of fractions) checkFraction(fraction);
	checkCurve(freqHz, powerDb, 'smoothFractionalOctave');
	const smoother = new LogSpacedSmoother(freqHz, fractions, options, () => {
		for (let k = 0; k < powerDb.length; k++) {
			// Only +∞ makes a smoothed value infinite (−∞ is floored), which logSpacedCurve refuses.
			if (powerDb[k] === Infinity) throw new AnalysisInputError('invalid_option', `logSpacedCurve: value at index ${k} is not finite`);
		}
	});
	return smoother.curves(powerPrefixSums(powerDb));
}

/**
 * Smoothed log-spaced curves of many spectra on one frequency grid (the waterfall's slices): the
 * points, the bins they read and each bin's smoothing window are found once; each spectrum then
 * costs one prefix sum and the windows' means.
 */
export class LogSpacedSmoother {
	readonly freqHz: number[];
	private readonly grid: LogGrid;
	private readonly fractions: readonly SmoothingFraction[];
	/** Per fraction: the distinct bins the points read, and each one's window [low, high). */
	private readonly windows: { bins: Int32Array; low: Int32Array; high: Int32Array; slot: Int32Array }[];

	constructor(freqHz: Float64Array, fractions: readonly SmoothingFraction[], options: LogSpacedOptions = {}, checkValues?: () => void) {
		for (const fraction of fractions) checkFraction(fraction);
		this.grid = logGrid(freqHz, options, checkValues);
		this.freqHz = this.grid.freqHz;
		this.fractions = fractions;
		const n = freqHz.length;
		// The bins read: each point's own, and the next one where it lies between two.
		const read: number[] = [];
		for (let i = 0; i < this.grid.bins.length; i++) {
			const j = this.grid.bins[i];
			if (read[read.length - 1] !== j) read.push(j);
			if (!Number.isNaN(this.grid.weights[i]) && read[read.length - 1] !== j + 1) read.push(j + 1);
		}
		const unique = Int32Array.from(new Set(read)).sort();
		const slot = new Int32Array(n).fill(-1);
		unique.forEach((bin, index) => (slot[bin] = index));
		this.windows = fractions.map((fraction) => {
			const halfWidth = 2 ** (1 / (2 * fraction));
			const low = new Int32Array(unique.length);
			const high = new Int32Array(unique.length);
			unique.forEach((k, index) => {
				low[index] = firstBin(freqHz, 0, freqHz[k] / halfWidth, false);
				high[index] = Math.min(n, Math.max(k + 1, firstBin(freqHz, k + 1, freqHz[k] * halfWidth, true)));
			});
			return { bins: unique, low, high, slot };
		});
	}

	/** The curves of one spectrum given by its power prefix sums (powerPrefixSums or powerPrefixSumsOf). */
	curves(prefix: { prefixHi: Float64Array; prefixLo: Float64Array }): number[][] {
		const { prefixHi, prefixLo } = prefix;
		return this.windows.map(({ bins, low, high, slot }) => {
			const values = new Float64Array(bins.length);
			for (let index = 0; index < bins.length; index++) values[index] = windowMeanDb(prefixHi, prefixLo, low[index], high[index]);
			return applyLogGrid(this.grid, (bin) => values[slot[bin]]);
		});
	}
}

/** Prefix sums in double-double precision of powers given as linear values (floored as dB values are). */
export function powerPrefixSumsOf(power: Float64Array, length = power.length): { prefixHi: Float64Array; prefixLo: Float64Array } {
	const prefixHi = new Float64Array(length + 1);
	const prefixLo = new Float64Array(length + 1);
	for (let k = 0; k < length; k++) {
		const value = Math.max(power[k], POWER_FLOOR);
		const hi = prefixHi[k] + value;
		const virtual = hi - prefixHi[k];
		const error = prefixHi[k] - (hi - virtual) + (value - virtual);
		prefixHi[k + 1] = hi;
		prefixLo[k + 1] = prefixLo[k] + error;
	}
	return { prefixHi, prefixLo };
}

export interface LogSpacedOptions {
	pointsPerOctave?: number;
	fMinHz?: number;
	/** Capped at the highest frequency of the input (at most Nyquist). */
	fMaxHz?: number;
}

/**
 * Resamples a curve at f_k = fMin·2^(k/pointsPerOctave), linear in dB against log frequency.
 * fMin is raised to the lowest positive input frequency if below it. dB rounded to 0.01,
 * frequencies to 0.001 Hz, for compact chart data.
 */
export function logSpacedCurve(
	freqHz: Float64Array,
	powerDb: Float64Array,
	options: LogSpacedOptions = {}
): LogSpacedCurve {
	checkCurve(freqHz, powerDb, 'logSpacedCurve');
	const grid = logGrid(freqHz, options, () => {
		for (let k = 0; k < powerDb.length; k++) {
			if (!Number.isFinite(powerDb[k])) throw new AnalysisInputError('invalid_option', `logSpacedCurve: value at index ${k} is not finite`);
		}
	});
	return { freqHz: grid.freqHz, db: applyLogGrid(grid, (k) => powerDb[k]) };
}

/** The log-spaced points of a curve: each one's frequency, the bin at or below it and its weight toward the next bin (NaN: the bin's own value). */
interface LogGrid {
	freqHz: number[];
	bins: Int32Array;
	weights: Float64Array;
}

/** `checkValues` runs after the options are checked and before the range is. */
function logGrid(freqHz: Float64Array, options: LogSpacedOptions, checkValues: () => void = () => {}): LogGrid {
	const pointsPerOctave = options.pointsPerOctave ?? 48;
	if (!Number.isInteger(pointsPerOctave) || pointsPerOctave < 1 || pointsPerOctave > 1000) {
		throw new AnalysisInputError('invalid_option', `pointsPerOctave must be an integer in 1…1000, got ${pointsPerOctave}`);
	}
	const fMinHz = options.fMinHz ?? 20;
	const fMaxHz = options.fMaxHz ?? 20000;
	if (!(Number.isFinite(fMinHz) && fMinHz > 0 && Number.isFinite(fMaxHz) && fMaxHz > fMinHz)) {
		throw new AnalysisInputError('invalid_option', `need 0 < fMinHz < fMaxHz, got ${fMinHz} and ${fMaxHz}`);
	}
	checkValues();
	const firstPositive = freqHz[0] > 0 ? 0 : 1;
	if (firstPositive >= freqHz.length) throw new AnalysisInputError('invalid_option', 'logSpacedCurve: no positive frequency in the input');
	const bottom = Math.max(fMinHz, freqHz[firstPositive]);
	const top = Math.min(fMaxHz, freqHz[freqHz.length - 1]);
	if (bottom > top) throw new AnalysisInputError('invalid_option', `logSpacedCurve: ${fMinHz}…${fMaxHz} Hz lies outside the input's range`);

	const count = Math.floor(pointsPerOctave * Math.log2(top / bottom) + 1e-9) + 1;
	const grid: LogGrid = { freqHz: new Array(count), bins: new Int32Array(count), weights: new Float64Array(count) };
	let j = firstPositive; // freqHz[j] ≤ f < freqHz[j + 1]
	for (let i = 0; i < count; i++) {
		const f = Math.min(bottom * 2 ** (i / pointsPerOctave), top);
		while (j + 1 < freqHz.length && freqHz[j + 1] <= f) j++;
		grid.bins[i] = j;
		grid.weights[i] = j + 1 < freqHz.length && f > freqHz[j] ? Math.log(f / freqHz[j]) / Math.log(freqHz[j + 1] / freqHz[j]) : NaN;
		grid.freqHz[i] = Math.round(f * 1000) / 1000;
	}
	return grid;
}

/** Values at the grid's points, linear in dB between bins, rounded to 0.01 dB. */
function applyLogGrid(grid: LogGrid, at: (bin: number) => number): number[] {
	const db: number[] = new Array(grid.bins.length);
	for (let i = 0; i < db.length; i++) {
		const j = grid.bins[i];
		const t = grid.weights[i];
		let value: number;
		if (Number.isNaN(t)) {
			value = at(j);
		} else {
			const here = at(j);
			value = here + t * (at(j + 1) - here);
		}
		db[i] = Math.round(value * 100) / 100;
	}
	return db;
}
