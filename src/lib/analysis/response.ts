// Frequency response of an impulse response, fractional-octave smoothing, and a log-spaced
// decimation of the curve for charts.
import FFT from 'fft.js';
import { AnalysisInputError } from './errors';

export const SMOOTHING_FRACTIONS = [1, 3, 6, 12, 24] as const;
export type SmoothingFraction = (typeof SMOOTHING_FRACTIONS)[number];

/** Level given to bins with zero power, instead of −Infinity. */
export const POWER_FLOOR_DB = -300;
const POWER_FLOOR = 10 ** (POWER_FLOOR_DB / 10);

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
	let size = 4; // fft.js needs a power of two; 4 keeps it on its radix-4 path
	while (size < n) size *= 2;
	return size;
}

/** Precomputed FFT tables for power spectra of real signals zero-padded to fftSize. */
export class PowerSpectrumPlan {
	readonly fftSize: number;
	/** Bins 0…fftSize/2 (DC to Nyquist). */
	readonly binCount: number;
	private readonly fft: FFT;
	private readonly padded: Float64Array;
	private readonly spectrum: Float64Array;

	constructor(fftSize: number) {
		if (!isPowerOfTwo(fftSize) || fftSize < 4) {
			throw new RangeError(`FFT size must be a power of two ≥ 4, got ${fftSize}`);
		}
		this.fftSize = fftSize;
		this.binCount = fftSize / 2 + 1;
		this.fft = new FFT(fftSize);
		this.padded = new Float64Array(fftSize);
		this.spectrum = new Float64Array(2 * fftSize);
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
		this.padded.fill(0);
		this.padded.set(x);
		this.fft.realTransform(this.spectrum, this.padded); // fills bins 0…N/2
		for (let k = 0; k < binCount; k++) {
			const re = this.spectrum[2 * k];
			const im = this.spectrum[2 * k + 1];
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

/** The gains applyHalfHannFadeIn applies over `length` samples. */
export function halfHannFadeIn(length: number): Float64Array {
	const gains = new Float64Array(length);
	for (let k = 0; k < length; k++) gains[k] = 0.5 * (1 - Math.cos((Math.PI * (k + 1)) / (length + 1)));
	return gains;
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
	if (!(SMOOTHING_FRACTIONS as readonly number[]).includes(fraction)) {
		throw new AnalysisInputError('invalid_option', `fraction must be one of ${SMOOTHING_FRACTIONS.join(', ')}, got ${fraction}`);
	}
	checkCurve(freqHz, powerDb, 'smoothFractionalOctave');
	const n = freqHz.length;
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
		const sum = prefixHi[high] - prefixHi[low] + (prefixLo[high] - prefixLo[low]);
		const mean = Math.max(sum / (high - low), POWER_FLOOR);
		smoothed[k] = 10 * Math.log10(mean);
	}
	return smoothed;
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
	const pointsPerOctave = options.pointsPerOctave ?? 48;
	if (!Number.isInteger(pointsPerOctave) || pointsPerOctave < 1 || pointsPerOctave > 1000) {
		throw new AnalysisInputError('invalid_option', `pointsPerOctave must be an integer in 1…1000, got ${pointsPerOctave}`);
	}
	const fMinHz = options.fMinHz ?? 20;
	const fMaxHz = options.fMaxHz ?? 20000;
	if (!(Number.isFinite(fMinHz) && fMinHz > 0 && Number.isFinite(fMaxHz) && fMaxHz > fMinHz)) {
		throw new AnalysisInputError('invalid_option', `need 0 < fMinHz < fMaxHz, got ${fMinHz} and ${fMaxHz}`);
	}
	for (let k = 0; k < powerDb.length; k++) {
		if (!Number.isFinite(powerDb[k])) throw new AnalysisInputError('invalid_option', `logSpacedCurve: value at index ${k} is not finite`);
	}
	const firstPositive = freqHz[0] > 0 ? 0 : 1;
	if (firstPositive >= freqHz.length) throw new AnalysisInputError('invalid_option', 'logSpacedCurve: no positive frequency in the input');
	const bottom = Math.max(fMinHz, freqHz[firstPositive]);
	const top = Math.min(fMaxHz, freqHz[freqHz.length - 1]);
	if (bottom > top) throw new AnalysisInputError('invalid_option', `logSpacedCurve: ${fMinHz}…${fMaxHz} Hz lies outside the input's range`);

	const count = Math.floor(pointsPerOctave * Math.log2(top / bottom) + 1e-9) + 1;
	const out: LogSpacedCurve = { freqHz: new Array(count), db: new Array(count) };
	let j = firstPositive; // freqHz[j] ≤ f < freqHz[j + 1]
	for (let i = 0; i < count; i++) {
		const f = Math.min(bottom * 2 ** (i / pointsPerOctave), top);
		while (j + 1 < freqHz.length && freqHz[j + 1] <= f) j++;
		let value = powerDb[j];
		if (j + 1 < freqHz.length && f > freqHz[j]) {
			const t = Math.log(f / freqHz[j]) / Math.log(freqHz[j + 1] / freqHz[j]);
			value = powerDb[j] + t * (powerDb[j + 1] - powerDb[j]);
		}
		out.freqHz[i] = Math.round(f * 1000) / 1000;
		out.db[i] = Math.round(value * 100) / 100;
	}
	return out;
}
