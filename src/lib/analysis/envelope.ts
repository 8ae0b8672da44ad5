// Analytic signal and energy–time curve: the smooth envelope of an impulse response.
import { AnalysisInputError } from './errors';
import { fftSizeFor, realFftPlan } from './fft';

/** Level given to samples whose energy is zero, instead of −Infinity. */
export const ENERGY_FLOOR_DB = -200;

export interface AnalyticSignal {
	re: Float64Array;
	im: Float64Array;
}

/**
 * Analytic signals of inputs up to maxLength samples, zero-padded to the next power of two (at
 * least 8), so the result equals scipy.signal.hilbert(x, N=fftSize)[:x.length]. The real part is
 * x itself; the imaginary part, the discrete Hilbert transform, is a real signal whose spectrum is
 * −j·X(k) at the positive frequencies, +j·X(k) at the negative ones and 0 at DC and Nyquist —
 * the same as keeping DC and Nyquist, doubling the positive frequencies and zeroing the negative
 * ones (Marple, IEEE Trans. Signal Process. 47(9):2600, 1999) — so the engine's real FFT plan does
 * both transforms.
 */
export class AnalyticSignalPlan {
	readonly maxLength: number;
	readonly fftSize: number;
	private readonly spectrum: Float64Array;
	private readonly hilbert: Float64Array;

	constructor(maxLength: number) {
		if (!Number.isInteger(maxLength) || maxLength < 1) {
			throw new RangeError(`analytic signal length must be a positive integer, got ${maxLength}`);
		}
		this.maxLength = maxLength;
		this.fftSize = fftSizeFor(maxLength);
		this.spectrum = new Float64Array(this.fftSize + 2);
		this.hilbert = new Float64Array(this.fftSize);
	}

	/** Fills re/im (length ≥ x.length) with the analytic signal x + j·H{x}. */
	transform(x: Float64Array, re: Float64Array, im: Float64Array): void {
		const n = x.length;
		if (n < 1 || n > this.maxLength) {
			throw new RangeError(`input length ${n} outside 1…${this.maxLength} of this plan`);
		}
		if (re.length < n || im.length < n) throw new RangeError('output arrays are shorter than the input');
		for (let i = 0; i < n; i++) {
			if (!Number.isFinite(x[i])) throw new AnalysisInputError('non_finite_samples', `sample ${i} is not a finite number (${x[i]})`);
		}
		const size = this.fftSize;
		const half = size / 2;
		const plan = realFftPlan(size);
		const spectrum = this.spectrum;
		plan.forward(x, spectrum);
		// −j·(a + jb) = b − ja at the positive frequencies; DC and Nyquist have no Hilbert part.
		spectrum[0] = spectrum[1] = 0;
		for (let k = 1; k < half; k++) {
			const a = spectrum[2 * k];
			spectrum[2 * k] = spectrum[2 * k + 1];
			spectrum[2 * k + 1] = -a;
		}
		spectrum[2 * half] = spectrum[2 * half + 1] = 0;
		plan.inverse(spectrum, this.hilbert);
		for (let i = 0; i < n; i++) {
			re[i] = x[i];
			im[i] = this.hilbert[i];
		}
	}
}

export function analyticSignal(x: Float64Array): AnalyticSignal {
	if (x.length === 0) throw new AnalysisInputError('no_samples', 'cannot take the analytic signal of an empty signal');
	const plan = new AnalyticSignalPlan(x.length);
	const re = new Float64Array(x.length);
	const im = new Float64Array(x.length);
	plan.transform(x, re, im);
	return { re, im };
}

/** |x + j·H{x}|, same length as x. */
export function analyticEnvelope(x: Float64Array): Float64Array {
	const { re, im } = analyticSignal(x);
	const envelope = new Float64Array(x.length);
	for (let i = 0; i < x.length; i++) envelope[i] = Math.hypot(re[i], im[i]);
	return envelope;
}

/** 10·lg of the squared envelope, 0 dB at its maximum, floored at ENERGY_FLOOR_DB. */
export function energyTimeCurveDb(x: Float64Array): Float64Array {
	const envelope = analyticEnvelope(x);
	let peak = 0;
	for (let i = 0; i < envelope.length; i++) if (envelope[i] > peak) peak = envelope[i];
	const curve = new Float64Array(envelope.length).fill(ENERGY_FLOOR_DB);
	if (peak === 0) return curve; // silence: every sample at the floor
	for (let i = 0; i < envelope.length; i++) {
		const ratio = envelope[i] / peak;
		if (ratio > 0) curve[i] = Math.max(ENERGY_FLOOR_DB, 20 * Math.log10(ratio)); // 10·lg(e²/e²max)
	}
	return curve;
}
