// Cumulative spectral decay: how the spectrum of the remaining impulse response falls with
// time, one slice per start time, for a waterfall chart of the low-frequency decay.
import { AnalysisInputError } from './errors';
import { RealFftPlan } from './fft';
import { applyHalfHannFadeOut, halfHannFadeIn, logSpacedCurve, nextPowerOfTwo, POWER_FLOOR_DB, smoothFractionalOctave } from './response';

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
 * Power spectra, in dB and floored at POWER_FLOOR_DB, of the first binCount bins of each slice
 * window[offset…] (zero-padded to fftSize) with a half-Hann rise over its first fadeIn samples.
 * The same numbers as one FFT per slice, for a fraction of the work: a slice's spectrum is the
 * spectrum of the rest of the window after its rise (the next slice's rest plus the samples
 * between them, summed as a DFT at the few bins needed) plus its own rise. Only the last slice's
 * rest takes an FFT. Phases are all taken re the window's start, which leaves the power unchanged.
 * Offsets must not decrease.
 */
function sliceSpectra(window: Float64Array, offsets: number[], fadeIn: number, fftSize: number, binCount: number): Float64Array[] {
	const mask = fftSize - 1;
	// cos and sin of 2π·i/N: e^(−j2πkn/N) is read at (k·n) mod N.
	const cos = new Float64Array(fftSize);
	const sin = new Float64Array(fftSize);
	for (let i = 0; i < fftSize; i++) {
		const angle = (2 * Math.PI * i) / fftSize;
		cos[i] = Math.cos(angle);
		sin[i] = Math.sin(angle);
	}
	const restRe = new Float64Array(binCount);
	const restIm = new Float64Array(binCount);
	const last = offsets.length - 1;
	let restStart = offsets[last] + fadeIn;
	const plan = new RealFftPlan(fftSize);
	const spectrum = new Float64Array(fftSize + 2);
	plan.forward(window.subarray(restStart), spectrum);
	for (let k = 0; k < binCount; k++) {
		const index = (k * restStart) % fftSize;
		const re = spectrum[2 * k];
		const im = spectrum[2 * k + 1];
		restRe[k] = re * cos[index] + im * sin[index];
		restIm[k] = im * cos[index] - re * sin[index];
	}
	// Adds window[from…to) to the rest.
	const addToRest = (from: number, to: number) => {
		for (let k = 0; k < binCount; k++) {
			let re = 0;
			let im = 0;
			let index = (k * from) % fftSize;
			for (let n = from; n < to; n++) {
				re += window[n] * cos[index];
				im -= window[n] * sin[index];
				index = (index + k) & mask;
			}
			restRe[k] += re;
			restIm[k] += im;
		}
	};
	const rise = halfHannFadeIn(fadeIn);
	const powers: Float64Array[] = new Array(offsets.length);
	for (let s = last; s >= 0; s--) {
		const start = offsets[s];
		const riseEnd = start + fadeIn;
		if (riseEnd < restStart) {
			addToRest(riseEnd, restStart);
			restStart = riseEnd;
		}
		const power = new Float64Array(binCount);
		for (let k = 0; k < binCount; k++) {
			let re = restRe[k];
			let im = restIm[k];
			let index = (k * start) % fftSize;
			for (let i = 0; i < fadeIn; i++) {
				const value = window[start + i] * rise[i];
				re += value * cos[index];
				im -= value * sin[index];
				index = (index + k) & mask;
			}
			power[k] = 10 * Math.log10(Math.max(re * re + im * im, POWER_FLOOR));
		}
		powers[s] = power;
	}
	return powers;
}

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
	const freqHz = new Float64Array(binCount);
	for (let k = 0; k < binCount; k++) freqHz[k] = (k * sampleRate) / fftSize;
	const offsets = Array.from({ length: slices }, (_, s) => Math.round((s * (lastSliceStart - startIndex)) / (slices - 1)));
	const powers = sliceSpectra(window, offsets, fadeIn, fftSize, binCount);

	const timesMs: number[] = [];
	const curves: number[][] = [];
	let grid: number[] = [];
	for (let s = 0; s < slices; s++) {
		const smoothed = smoothFractionalOctave(freqHz, powers[s], SLICE_SMOOTHING);
		const curve = logSpacedCurve(freqHz, smoothed, { fMinHz, fMaxHz, pointsPerOctave });
		grid = curve.freqHz;
		timesMs.push(Math.round((1e6 * offsets[s]) / sampleRate) / 1000);
		curves.push(curve.db);
	}
	const reference = Math.max(...curves[0]);
	const levelsDb = curves.map((curve) =>
		curve.map((db) => Math.round(Math.max(SPECTRAL_DECAY_FLOOR_DB, db - reference) * 100) / 100)
	);
	return { timesMs, freqHz: grid, levelsDb };
}
