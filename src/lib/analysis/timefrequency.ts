// Cumulative spectral decay: how the spectrum of the remaining impulse response falls with
// time, one slice per start time, for a waterfall chart of the low-frequency decay.
import { AnalysisInputError } from './errors';
import { realFftPlan } from './fft';
import {
	applyHalfHannFadeIn,
	applyHalfHannFadeOut,
	logSpacedCurve,
	nextPowerOfTwo,
	POWER_FLOOR_DB,
	smoothedLogSpacedCurves
} from './response';

export interface SpectralDecayOptions {
	/** Start time of the last slice after startIndex (default 300 ms). */
	durationMs?: number;
	/** Number of slices, evenly spaced from 0 to durationMs (default 31: every 10 ms). */
	slices?: number;
	fMinHz?: number;
	fMaxHz?: number;
	pointsPerOctave?: number;
	/** Half-Hann rise at the start of each slice (default 2 ms). */
	fadeInMs?: number;
	/** Fixed end of every slice after startIndex (default durationMs + 500 ms, capped at the IR end). */
	analysisEndMs?: number;
}

export interface SpectralDecay {
	timesMs: number[];
	freqHz: number[];
	/** [slice][frequency], dB re the maximum of slice 0, floored at SPECTRAL_DECAY_FLOOR_DB. */
	levelsDb: number[][];
}

export const SPECTRAL_DECAY_FLOOR_DB = -80;
/** Smoothing applied so the waterfall stays readable. */
const SLICE_SMOOTHING = 6;

const POWER_FLOOR = 10 ** (POWER_FLOOR_DB / 10);

/**
 * 10·lg|X(k)|² (floored at POWER_FLOOR_DB) of the first binCount bins of each slice — window[offset…]
 * with a half-Hann rise over its first fadeIn samples, zero-padded to fftSize — for non-decreasing
 * offsets. The last slice takes one FFT; each earlier one is the next one plus the DFT, at those
 * bins only, of what differs between the two (its rise and the samples up to the end of the next
 * one's rise): by linearity the same spectrum, for about half an FFT's work. Phases are taken re
 * the window's start, which leaves every power unchanged; the twiddles come from an exact start
 * phase and a rotation over at most a few thousand samples, so round-off stays near 1e-13.
 */
function slicePowersDb(window: Float64Array, offsets: number[], fadeIn: number, fftSize: number, binCount: number): Float64Array[] {
	const rise = new Float64Array(fadeIn).fill(1);
	applyHalfHannFadeIn(rise, fadeIn);
	const sliceValue = (offset: number, n: number) => (n < offset ? 0 : n < offset + fadeIn ? window[n] * rise[n - offset] : window[n]);
	const re = new Float64Array(binCount);
	const im = new Float64Array(binCount);
	const powers: Float64Array[] = new Array(offsets.length);
	const toDb = () => {
		const power = new Float64Array(binCount);
		for (let k = 0; k < binCount; k++) power[k] = 10 * Math.log10(Math.max(re[k] * re[k] + im[k] * im[k], POWER_FLOOR));
		return power;
	};
	const phase = (k: number, n: number) => (2 * Math.PI * ((k * n) % fftSize)) / fftSize;

	const last = offsets.length - 1;
	const tail = window.slice(offsets[last]);
	applyHalfHannFadeIn(tail, fadeIn);
	const spectrum = new Float64Array(fftSize + 2);
	realFftPlan(fftSize).forward(tail, spectrum);
	for (let k = 0; k < binCount; k++) {
		// × e^(−j2πk·offset/N): from the slice's own start to the window's.
		const angle = phase(k, offsets[last]);
		const c = Math.cos(angle);
		const s = Math.sin(angle);
		re[k] = spectrum[2 * k] * c + spectrum[2 * k + 1] * s;
		im[k] = spectrum[2 * k + 1] * c - spectrum[2 * k] * s;
	}
	powers[last] = toDb();

	const difference = new Float64Array(Math.max(0, offsets[last] - offsets[0]) + fadeIn);
	for (let slice = last - 1; slice >= 0; slice--) {
		const from = offsets[slice];
		const to = offsets[slice + 1] + fadeIn;
		for (let n = from; n < to; n++) difference[n - from] = sliceValue(from, n) - sliceValue(offsets[slice + 1], n);
		addDft(difference, to - from, from, fftSize, re, im);
		powers[slice] = toDb();
	}
	return powers;
}

/** Adds Σ d[i]·e^(−j2πk(start + i)/N), i < length, to (re, im)[k] for every k < re.length. */
function addDft(d: Float64Array, length: number, start: number, fftSize: number, re: Float64Array, im: Float64Array): void {
	for (let k = 0; k < re.length; k++) {
		const step = (2 * Math.PI * k) / fftSize;
		const wr = Math.cos(step);
		const wi = -Math.sin(step);
		const first = (2 * Math.PI * ((k * start) % fftSize)) / fftSize;
		let pr = Math.cos(first);
		let pi = -Math.sin(first);
		let sumRe = 0;
		let sumIm = 0;
		for (let i = 0; i < length; i++) {
			const value = d[i];
			sumRe += value * pr;
			sumIm += value * pi;
			const next = pr * wr - pi * wi;
			pi = pr * wi + pi * wr;
			pr = next;
		}
		re[k] += sumRe;
		im[k] += sumIm;
	}
}

function requirePositive(name: string, value: number): void {
	if (!Number.isFinite(value) || value <= 0) throw new AnalysisInputError('invalid_option', `${name} must be a finite number > 0, got ${value}`);
}

/**
 * Cumulative spectral decay (Bunton & Small, "Cumulative spectral decay in loudspeaker
 * measurements", JAES 30(1), 1982; from memory): slice s is the power spectrum of the IR from
 * startIndex + t_s to a common fixed end, i.e. the response truncated on the left, with a short
 * half-Hann rise at its start and a half-Hann fade over the last 10 % before the common end.
 * Every slice uses the same FFT size (spectra computed by slicePowersDb), is smoothed to 1/6
 * octave and sampled log-spaced.
 */
export function cumulativeSpectralDecay(
	ir: Float64Array,
	sampleRate: number,
	startIndex: number,
	options: SpectralDecayOptions = {}
): SpectralDecay {
	if (ir.length === 0) throw new AnalysisInputError('no_samples', 'impulse response is empty');
	requirePositive('sampleRate', sampleRate);
	if (!Number.isInteger(startIndex) || startIndex < 0 || startIndex >= ir.length) {
		throw new AnalysisInputError('invalid_option', `startIndex must be an integer in 0…${ir.length - 1}, got ${startIndex}`);
	}
	const durationMs = options.durationMs ?? 300;
	const slices = options.slices ?? 31;
	const fMinHz = options.fMinHz ?? 20;
	const fMaxHz = Math.min(options.fMaxHz ?? 500, sampleRate / 2);
	const pointsPerOctave = options.pointsPerOctave ?? 24;
	const fadeInMs = options.fadeInMs ?? 2;
	const analysisEndMs = options.analysisEndMs ?? durationMs + 500;
	requirePositive('durationMs', durationMs);
	requirePositive('fadeInMs', fadeInMs);
	if (!Number.isInteger(slices) || slices < 2 || slices > 500) {
		throw new AnalysisInputError('invalid_option', `slices must be an integer in 2…500, got ${slices}`);
	}
	if (!(Number.isFinite(fMinHz) && fMinHz > 0 && fMaxHz > fMinHz)) {
		throw new AnalysisInputError('invalid_option', `need 0 < fMinHz < fMaxHz ≤ Nyquist, got ${fMinHz} and ${options.fMaxHz ?? 500}`);
	}
	if (!(Number.isFinite(analysisEndMs) && analysisEndMs > durationMs + fadeInMs)) {
		throw new AnalysisInputError('invalid_option', `analysisEndMs must exceed durationMs + fadeInMs, got ${analysisEndMs}`);
	}
	for (let i = 0; i < ir.length; i++) {
		if (!Number.isFinite(ir[i])) throw new AnalysisInputError('non_finite_samples', `sample ${i} is not a finite number (${ir[i]})`);
	}
	const samples = (ms: number) => Math.round((ms * sampleRate) / 1000);
	const end = Math.min(ir.length, startIndex + samples(analysisEndMs));
	const windowLength = end - startIndex;
	const lastSliceStart = startIndex + samples(durationMs);
	const fadeIn = Math.max(1, samples(fadeInMs));
	if (lastSliceStart + fadeIn >= end) {
		const availableMs = ((1000 * windowLength) / sampleRate).toFixed(1);
		throw new AnalysisInputError(
			'too_short',
			`the impulse response ends ${availableMs} ms after startIndex; too short for durationMs ${durationMs}`
		);
	}

	// Common fixed end, tapered once; every slice is a left-truncated view of this window.
	const window = ir.slice(startIndex, end);
	applyHalfHannFadeOut(window, Math.floor(0.1 * windowLength));
	// At least 1 Hz bins, so 1/6-octave smoothing still averages several bins at 20 Hz.
	const fftSize = nextPowerOfTwo(Math.max(windowLength, sampleRate));
	// Bins needed: up to fMax plus the upper half of its smoothing window.
	const binCount = Math.min(fftSize / 2 + 1, Math.ceil((fMaxHz * 2 ** (1 / (2 * SLICE_SMOOTHING)) * fftSize) / sampleRate) + 2);
	const freqHz = new Float64Array(binCount);
	for (let k = 0; k < binCount; k++) freqHz[k] = (k * sampleRate) / fftSize;
	const offsets = Array.from({ length: slices }, (_, s) => Math.round((s * (lastSliceStart - startIndex)) / (slices - 1)));
	const powers = slicePowersDb(window, offsets, fadeIn, fftSize, binCount);

	const timesMs: number[] = [];
	const curves: number[][] = [];
	for (let s = 0; s < slices; s++) {
		// Smoothed only where the log-spaced points read it: the same numbers as smoothing every bin.
		const [curve] = smoothedLogSpacedCurves(freqHz, powers[s], [SLICE_SMOOTHING], { fMinHz, fMaxHz, pointsPerOctave });
		timesMs.push(Math.round((1e6 * offsets[s]) / sampleRate) / 1000);
		curves.push(curve);
	}
	const grid = logSpacedCurve(freqHz, powers[0], { fMinHz, fMaxHz, pointsPerOctave }).freqHz;
	const reference = Math.max(...curves[0]);
	const levelsDb = curves.map((curve) =>
		curve.map((db) => Math.round(Math.max(SPECTRAL_DECAY_FLOOR_DB, db - reference) * 100) / 100)
	);
	return { timesMs, freqHz: grid, levelsDb };
}
