/**
 * Signals made from formulas, for fixtures, demos and benchmarks: ideal exponential decays whose
 * parameters are known in closed form (the method of Cabrera, Xun & Guski, Acoustics Australia 44:369, 2016).
 */
import { fftSizeFor, RealFftPlan } from './fft';

/**
 * Linear convolution of a and b through one FFT, `length` samples long (by default the whole
 * a.length + b.length − 1; longer keeps the transform's zero padding).
 */
export function convolve(a: Float64Array, b: Float64Array, length = a.length + b.length - 1): Float64Array {
	const plan = new RealFftPlan(fftSizeFor(Math.max(length, a.length + b.length - 1)));
	const A = new Float64Array(plan.size + 2);
	const B = new Float64Array(plan.size + 2);
	plan.forward(a, A);
	plan.forward(b, B);
	for (let k = 0; k <= plan.size / 2; k++) {
		const re = A[2 * k] * B[2 * k] - A[2 * k + 1] * B[2 * k + 1];
		A[2 * k + 1] = A[2 * k] * B[2 * k + 1] + A[2 * k + 1] * B[2 * k];
		A[2 * k] = re;
	}
	const out = new Float64Array(plan.size);
	plan.inverse(A, out);
	return out.subarray(0, length);
}

/** Mulberry32: a small, fast 32-bit generator; fixed seeds give the same signal everywhere. */
export function createSeededRandom(seed: number): () => number {
	let state = seed >>> 0;
	return () => {
		state = (state + 0x6d2b79f5) >>> 0;
		let t = state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Standard normal deviates by the Box–Muller transform. */
export function createSeededGaussian(seed: number): () => number {
	const uniform = createSeededRandom(seed);
	let spare: number | null = null;
	return () => {
		if (spare !== null) {
			const value = spare;
			spare = null;
			return value;
		}
		const u = 1 - uniform();
		const v = uniform();
		const radius = Math.sqrt(-2 * Math.log(u));
		spare = radius * Math.sin(2 * Math.PI * v);
		return radius * Math.cos(2 * Math.PI * v);
	};
}

/** Energy decay constant k of p² ∝ e^(−k·t) for a reverberation time T: k = 6·ln10 / T. */
export function energyDecayRate(t60S: number): number {
	return (6 * Math.LN10) / t60S;
}

export interface SyntheticDecayOptions {
	t60S: number;
	durationS: number;
	sampleRate: number;
	/** Silence (or background only) before the decay starts. */
	onsetS?: number;
	/** Mean-square of the decay at its onset (default 1). */
	initialPower?: number;
	/** Steady background noise, dB re the peak of the squared signal; omitted = none. */
	noiseDbRePeak?: number;
	seed?: number;
}

function addBackgroundNoise(x: Float64Array, noiseDbRePeak: number | undefined, seed: number): void {
	if (noiseDbRePeak === undefined) return;
	let peak = 0;
	for (let i = 0; i < x.length; i++) peak = Math.max(peak, x[i] * x[i]);
	const sigma = Math.sqrt(peak * 10 ** (noiseDbRePeak / 10));
	const gaussian = createSeededGaussian(seed ^ 0x5bd1e995);
	for (let i = 0; i < x.length; i++) x[i] += sigma * gaussian();
}

/** White Gaussian noise with an exponentially decaying envelope: p² has mean initialPower·e^(−k·t). */
export function exponentialNoiseDecay(options: SyntheticDecayOptions): Float64Array {
	const { t60S, durationS, sampleRate } = options;
	const n = Math.round(durationS * sampleRate);
	const onset = Math.round((options.onsetS ?? 0) * sampleRate);
	const amplitude = Math.sqrt(options.initialPower ?? 1);
	const halfRate = energyDecayRate(t60S) / 2;
	const gaussian = createSeededGaussian(options.seed ?? 1);
	const x = new Float64Array(n);
	for (let i = onset; i < n; i++) x[i] = amplitude * Math.exp((-halfRate * (i - onset)) / sampleRate) * gaussian();
	addBackgroundNoise(x, options.noiseDbRePeak, options.seed ?? 1);
	return x;
}

export interface MultiToneDecayOptions extends SyntheticDecayOptions {
	frequenciesHz: readonly number[];
}

/**
 * A sum of exponentially decaying cosines, one per band centre, all in phase at the onset: each band
 * filter sees one tone of mean square initialPower·e^(−k·t), so band values can be checked against
 * the closed forms.
 */
export function multiToneDecay(options: MultiToneDecayOptions): Float64Array {
	const { t60S, durationS, sampleRate, frequenciesHz } = options;
	const n = Math.round(durationS * sampleRate);
	const onset = Math.round((options.onsetS ?? 0) * sampleRate);
	const amplitude = Math.sqrt(2 * (options.initialPower ?? 1));
	const halfRate = energyDecayRate(t60S) / 2;
	const x = new Float64Array(n);
	for (let i = onset; i < n; i++) {
		const t = (i - onset) / sampleRate;
		let sum = 0;
		for (const f of frequenciesHz) sum += Math.cos(2 * Math.PI * f * t);
		x[i] = amplitude * Math.exp(-halfRate * t) * sum;
	}
	addBackgroundNoise(x, options.noiseDbRePeak, options.seed ?? 1);
	return x;
}
