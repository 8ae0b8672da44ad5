// Cumulative spectral decay: how the spectrum of the remaining impulse response falls with
// time, one slice per start time, for a waterfall chart of the low-frequency decay.
import { AnalysisInputError } from './errors';
import {
	applyHalfHannFadeIn,
	applyHalfHannFadeOut,
	logSpacedCurve,
	nextPowerOfTwo,
	PowerSpectrumPlan,
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
	const plan = new PowerSpectrumPlan(nextPowerOfTwo(Math.max(windowLength, sampleRate)));
	// Bins needed: up to fMax plus the upper half of its smoothing window.
	const binCount = Math.min(
		plan.binCount,
		Math.ceil((fMaxHz * 2 ** (1 / (2 * SLICE_SMOOTHING)) * plan.fftSize) / sampleRate) + 2
	);
	const freqHz = plan.frequencies(sampleRate, binCount);
	const powerDb = new Float64Array(binCount);

	const timesMs: number[] = [];
	const curves: number[][] = [];
	const buffer = new Float64Array(windowLength);
	for (let s = 0; s < slices; s++) {
		const offset = Math.round((s * (lastSliceStart - startIndex)) / (slices - 1));
		const slice = buffer.subarray(0, windowLength - offset);
		slice.set(window.subarray(offset));
		applyHalfHannFadeIn(slice, fadeIn);
		plan.powerDb(slice, binCount, powerDb);
		// Smoothed only where the log-spaced points read it: the same numbers as smoothing every bin.
		const [curve] = smoothedLogSpacedCurves(freqHz, powerDb, [SLICE_SMOOTHING], { fMinHz, fMaxHz, pointsPerOctave });
		timesMs.push(Math.round((1e6 * offset) / sampleRate) / 1000);
		curves.push(curve);
	}
	const grid = logSpacedCurve(freqHz, powerDb, { fMinHz, fMaxHz, pointsPerOctave }).freqHz;
	const reference = Math.max(...curves[0]);
	const levelsDb = curves.map((curve) =>
		curve.map((db) => Math.round(Math.max(SPECTRAL_DECAY_FLOOR_DB, db - reference) * 100) / 100)
	);
	return { timesMs, freqHz: grid, levelsDb };
}
