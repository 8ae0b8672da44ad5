// Cumulative spectral decay: how the spectrum of the remaining impulse response falls with
// time, one slice per start time, for a waterfall chart of the low-frequency decay.
import { AnalysisInputError } from './errors';
import { ChirpDftPlan, realFftPlan } from './fft';
import { applyHalfHannFadeIn, applyHalfHannFadeOut, LogSpacedSmoother, nextPowerOfTwo, powerPrefixSumsOf } from './response';

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

function requirePositive(name: string, value: number): void {
	if (!Number.isFinite(value) || value <= 0) throw new AnalysisInputError('invalid_option', `${name} must be a finite number > 0, got ${value}`);
}

/**
 * Cumulative spectral decay (Bunton & Small, "Cumulative spectral decay in loudspeaker
 * measurements", JAES 30(1), 1982; from memory): slice s is the power spectrum of the IR from
 * startIndex + t_s to a common fixed end, i.e. the response truncated on the left, with a short
 * half-Hann rise at its start and a half-Hann fade over the last 10 % before the common end.
 * Every slice uses the same FFT size, is smoothed to 1/6 octave and sampled log-spaced.
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
	const freqHz = Float64Array.from({ length: binCount }, (_, k) => (k * sampleRate) / fftSize);
	const offsets = Array.from({ length: slices }, (_, s) => Math.round((s * (lastSliceStart - startIndex)) / (slices - 1)));
	const powers = slicePowers(window, offsets, fadeIn, fftSize, binCount);

	const timesMs = offsets.map((offset) => Math.round((1e6 * offset) / sampleRate) / 1000);
	// Smoothed only where the log-spaced points read it (the same numbers as smoothing every bin),
	// the points and windows found once for all the slices.
	const smoother = new LogSpacedSmoother(freqHz, [SLICE_SMOOTHING], { fMinHz, fMaxHz, pointsPerOctave });
	const curves = powers.map((power) => smoother.curves(powerPrefixSumsOf(power))[0]);
	const grid = smoother.freqHz;
	const reference = Math.max(...curves[0]);
	const levelsDb = curves.map((curve) =>
		curve.map((db) => Math.round(Math.max(SPECTRAL_DECAY_FLOOR_DB, db - reference) * 100) / 100)
	);
	return { timesMs, freqHz: grid, levelsDb };
}

/**
 * |X_s(k)|² for k < binCount of each slice s: window[offsets[s]…] with a half-Hann rise over
 * its first `fadeIn` samples, zero-padded to fftSize.
 *
 * Slices only lose samples at their start, so the transform of the unfaded part of slice s is that
 * of slice s + 1 plus the DFT of the samples between their starts: one FFT for the last slice, then
 * for each earlier one the short DFTs of those samples and of its rise, at the bins needed only
 * (ChirpDftPlan). All in one time origin (the window's start), so the pieces add up; |X| does not
 * depend on the origin, so these are the magnitudes of one FFT per slice, to round-off.
 */
function slicePowers(window: Float64Array, offsets: number[], fadeIn: number, fftSize: number, binCount: number): Float64Array[] {
	const last = offsets.length - 1;
	const rise = new Float64Array(fadeIn);
	// The weights applyHalfHannFadeIn gives the first fadeIn samples.
	for (let k = 0; k < fadeIn; k++) rise[k] = 0.5 * (1 - Math.cos((Math.PI * (k + 1)) / (fadeIn + 1)));
	let longestGap = 1;
	for (let s = 0; s < last; s++) longestGap = Math.max(longestGap, offsets[s + 1] - offsets[s]);
	const pieces = new ChirpDftPlan(fftSize, binCount, Math.max(longestGap, fadeIn));
	// Four FFTs of the convolution's size per slice against one of fftSize: not worth it for wide
	// ranges or widely spaced slices (options the charts do not use), which take one FFT per slice.
	if (4 * pieces.convolutionSize > fftSize) return slicePowersByFft(window, offsets, fadeIn, fftSize, binCount);

	// tail: the DFT of window[offsets[s] + fadeIn…], the unfaded part of slice s.
	const tail = new Float64Array(2 * binCount);
	const tailStart = offsets[last] + fadeIn;
	const plan = realFftPlan(fftSize);
	const spectrum = new Float64Array(fftSize + 2);
	plan.forward(window.subarray(tailStart), spectrum);
	for (let k = 0; k < binCount; k++) {
		// Its FFT starts at tailStart: shifted to the window's origin by W^(tailStart·k).
		const angle = (2 * Math.PI * ((tailStart * k) % fftSize)) / fftSize;
		const c = Math.cos(angle);
		const s = -Math.sin(angle);
		tail[2 * k] = spectrum[2 * k] * c - spectrum[2 * k + 1] * s;
		tail[2 * k + 1] = spectrum[2 * k] * s + spectrum[2 * k + 1] * c;
	}
	const faded = new Float64Array(fadeIn);
	const slice = new Float64Array(2 * binCount);
	const powers: Float64Array[] = new Array(offsets.length);
	for (let s = last; s >= 0; s--) {
		const start = offsets[s];
		if (s < last) pieces.addTo(window.subarray(start + fadeIn, offsets[s + 1] + fadeIn), start + fadeIn, tail);
		slice.set(tail);
		for (let k = 0; k < fadeIn; k++) faded[k] = window[start + k] * rise[k];
		pieces.addTo(faded, start, slice);
		powers[s] = powerOf(slice, binCount);
	}
	return powers;
}

/** |X(k)|² of the first `binCount` bins of an interleaved spectrum. */
function powerOf(spectrum: Float64Array, binCount: number): Float64Array {
	const power = new Float64Array(binCount);
	for (let k = 0; k < binCount; k++) power[k] = spectrum[2 * k] * spectrum[2 * k] + spectrum[2 * k + 1] * spectrum[2 * k + 1];
	return power;
}

/** The same by one FFT per slice. */
function slicePowersByFft(window: Float64Array, offsets: number[], fadeIn: number, fftSize: number, binCount: number): Float64Array[] {
	const plan = realFftPlan(fftSize);
	const buffer = new Float64Array(window.length);
	const spectrum = new Float64Array(fftSize + 2);
	return offsets.map((offset) => {
		const slice = buffer.subarray(0, window.length - offset);
		slice.set(window.subarray(offset));
		applyHalfHannFadeIn(slice, fadeIn);
		plan.forward(slice, spectrum);
		return powerOf(spectrum, binCount);
	});
}
