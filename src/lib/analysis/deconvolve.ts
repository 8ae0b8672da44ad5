import { AnalysisInputError } from './errors';
import { RealFftPlan, fftSizeFor } from './fft';

/** The sweep's law, needed for the regularisation band and the harmonics' positions. */
export interface SweepLaw {
	f1Hz: number;
	f2Hz: number;
	/** L = T / ln(f₂/f₁): the sweep's instantaneous frequency is f₁·e^(t/L) (Farina 2000). */
	rateConstantS: number;
}

export interface DeconvolutionOptions {
	/** The played sweep's parameters when known; otherwise they are estimated from the reference. */
	f1Hz?: number;
	f2Hz?: number;
	durationS?: number;
	/** Kept before the linear peak (default 5 ms, never more than half the 2nd harmonic's lead). */
	preRollS?: number;
	/** Longest impulse response returned (default 10 s). */
	maxLengthS?: number;
	/** Regularisation inside [f₁, f₂], dB re the reference's peak power (default −60). */
	inBandRegularisationDb?: number;
}

export interface HarmonicProduct {
	order: number;
	/** How long before the linear response this harmonic's response arrives. */
	leadS: number;
	/** Energy near the harmonic's position re the energy near the linear peak (same window), dB; null if outside the buffer. */
	levelDb: number | null;
}

export interface DeconvolutionResult {
	/**
	 * From a little before the linear peak to where the recording stops holding the response at
	 * the sweep's lowest frequency. The low frequencies are swept first, so their response is
	 * recorded for longer than the high ones': the first `fullBandLength` samples hold the
	 * response at every frequency, later ones only below a falling limit (completeLengthAt).
	 */
	impulseResponse: Float64Array;
	/** Samples of impulseResponse that hold the response at every frequency up to f₂. */
	fullBandLength: number;
	/** Index in the recording where the played sweep's start arrives with no delay (the reference's first audible sample). */
	sweepStartIndex: number;
	/** Samples in the recording. */
	recordedLength: number;
	sampleRate: number;
	/** Lag of impulseResponse[0], in samples, re the start of the recording (negative = before it). */
	startLag: number;
	/** Lag of the linear response's peak (the system's delay), in samples and seconds. */
	peakLag: number;
	peakLagS: number;
	sweep: SweepLaw;
	harmonics: HarmonicProduct[];
}

export interface FullDeconvolution {
	/** Circular result: lag ℓ ≥ 0 at index ℓ, negative lags wrap to the end (index N + ℓ). */
	response: Float64Array;
	sweep: SweepLaw;
	/** Index of the reference's first audible sample (the sweep's start). */
	referenceStart: number;
	/** Index just past the reference's last audible sample (the sweep's end). */
	referenceEnd: number;
}

const DEFAULT_PRE_ROLL_S = 0.005;
const DEFAULT_MAX_LENGTH_S = 10;
const DEFAULT_IN_BAND_REGULARISATION_DB = -60;
/** Out of band the regularisation dominates: response there is suppressed by ~40 dB or more. */
const OUT_OF_BAND_REGULARISATION = 100;
/**
 * The regularisation rises over this much of an octave just inside [f₁, f₂], where the sweep still
 * has its energy: rising outside would leave a zone where the reference is gone but the inverse is
 * not yet held down, and harmonics there (which reach 2·f₂) would be amplified into long ringing.
 */
const TRANSITION_OCTAVES = 1 / 24;
const HARMONIC_ORDERS = [2, 3, 4, 5];
/** Shortest impulse response worth returning. */
const MIN_LENGTH_S = 0.05;

function checkSignal(name: string, x: Float64Array): void {
	if (x.length === 0) throw new AnalysisInputError('no_samples', `the ${name} has no samples`);
	let peak = 0;
	for (let i = 0; i < x.length; i++) {
		if (!Number.isFinite(x[i])) throw new AnalysisInputError('non_finite_samples', `sample ${i} of the ${name} is not finite`);
		peak = Math.max(peak, Math.abs(x[i]));
	}
	if (peak === 0) throw new AnalysisInputError('silent_signal', `the ${name} is silent`);
}

/** Index range of the reference's audible part (above −60 dB re its peak). */
function audibleRange(x: Float64Array): { first: number; end: number } {
	let peak = 0;
	for (let i = 0; i < x.length; i++) peak = Math.max(peak, Math.abs(x[i]));
	const threshold = peak * 1e-3;
	let first = 0;
	while (first < x.length && Math.abs(x[first]) < threshold) first++;
	let last = x.length - 1;
	while (last > first && Math.abs(x[last]) < threshold) last--;
	return { first, end: last + 1 };
}

/**
 * Estimates the sweep's law from the reference itself: instantaneous frequency from zero-crossing
 * counts in short windows, then a least-squares line of ln f against t (slope 1/L) over the middle
 * of the sweep; f₁ and f₂ are the line's values at the audible start and end.
 */
export function estimateSweepLaw(reference: Float64Array, sampleRate: number): SweepLaw {
	const { first, end } = audibleRange(reference);
	const windowLength = Math.max(64, Math.round(0.02 * sampleRate));
	const times: number[] = [];
	const logFrequencies: number[] = [];
	const margin = Math.round(0.1 * (end - first));
	for (let start = first + margin; start + windowLength <= end - margin; start += windowLength) {
		let crossings = 0;
		for (let i = start + 1; i < start + windowLength; i++) {
			if ((reference[i - 1] < 0) !== (reference[i] < 0)) crossings++;
		}
		// Need enough crossings for the count to resolve the frequency to a few per cent.
		if (crossings < 20) continue;
		const frequency = (crossings * sampleRate) / (2 * (windowLength - 1));
		if (frequency > 0.45 * sampleRate) continue;
		times.push((start + windowLength / 2) / sampleRate);
		logFrequencies.push(Math.log(frequency));
	}
	if (times.length < 4) {
		throw new AnalysisInputError('invalid_option', 'the reference does not look like an exponential sweep: give its f1, f2 and duration');
	}
	const n = times.length;
	const meanT = times.reduce((a, b) => a + b, 0) / n;
	const meanF = logFrequencies.reduce((a, b) => a + b, 0) / n;
	let sxy = 0;
	let sxx = 0;
	for (let i = 0; i < n; i++) {
		sxy += (times[i] - meanT) * (logFrequencies[i] - meanF);
		sxx += (times[i] - meanT) ** 2;
	}
	const slope = sxy / sxx;
	if (!(slope > 0)) throw new AnalysisInputError('invalid_option', 'the reference does not rise in frequency: it is not an exponential sweep');
	const at = (t: number) => Math.exp(meanF + slope * (t - meanT));
	return {
		f1Hz: Math.max(1, at(first / sampleRate)),
		f2Hz: Math.min(sampleRate / 2, at(end / sampleRate)),
		rateConstantS: 1 / slope
	};
}

function sweepLawFrom(options: DeconvolutionOptions, reference: Float64Array, sampleRate: number): SweepLaw {
	const { f1Hz, f2Hz, durationS } = options;
	if (f1Hz === undefined && f2Hz === undefined && durationS === undefined) return estimateSweepLaw(reference, sampleRate);
	if (f1Hz === undefined || f2Hz === undefined || durationS === undefined) {
		throw new AnalysisInputError('invalid_option', 'give all of f1Hz, f2Hz and durationS for the sweep, or none');
	}
	if (!(f1Hz > 0 && f2Hz > f1Hz && durationS > 0)) {
		throw new AnalysisInputError('invalid_option', `sweep parameters out of range: f1 ${f1Hz} Hz, f2 ${f2Hz} Hz, ${durationS} s`);
	}
	return { f1Hz, f2Hz, rateConstantS: durationS / Math.log(f2Hz / f1Hz) };
}

/**
 * Regularisation ε(f) of the inverse conj(X) / (|X|² + ε) (Kirkeby & Nelson, "Digital filter design for
 * inversion problems in sound reproduction", JAES 47(7/8), 1999 — from memory): small inside the
 * sweep's band, large outside, with a raised-cosine rise in log frequency at the band's inner edges.
 */
function regularisation(frequencyHz: number, law: SweepLaw, inBand: number, outOfBand: number): number {
	if (frequencyHz <= law.f1Hz || frequencyHz >= law.f2Hz) return outOfBand;
	const octavesInside = Math.min(Math.log2(frequencyHz / law.f1Hz), Math.log2(law.f2Hz / frequencyHz));
	if (octavesInside >= TRANSITION_OCTAVES) return inBand;
	const blend = 0.5 * (1 + Math.cos((Math.PI * octavesInside) / TRANSITION_OCTAVES));
	return Math.exp(Math.log(inBand) + blend * (Math.log(outOfBand) - Math.log(inBand)));
}

/** Linear deconvolution by regularised spectral division, FFT size ≥ len(recorded) + len(reference). */
export function deconvolveFull(
	recorded: Float64Array,
	reference: Float64Array,
	sampleRate: number,
	options: DeconvolutionOptions = {}
): FullDeconvolution {
	if (!(sampleRate > 0)) throw new RangeError(`sample rate must be positive, got ${sampleRate}`);
	checkSignal('recording', recorded);
	checkSignal('reference sweep', reference);
	const law = sweepLawFrom(options, reference, sampleRate);
	const size = fftSizeFor(recorded.length + reference.length);
	const plan = new RealFftPlan(size);
	const referenceSpectrum = new Float64Array(size + 2);
	const spectrum = new Float64Array(size + 2);
	plan.forward(reference, referenceSpectrum);
	plan.forward(recorded, spectrum);

	let peakPower = 0;
	for (let k = 0; k <= size / 2; k++) {
		peakPower = Math.max(peakPower, referenceSpectrum[2 * k] ** 2 + referenceSpectrum[2 * k + 1] ** 2);
	}
	const inBand = peakPower * 10 ** ((options.inBandRegularisationDb ?? DEFAULT_IN_BAND_REGULARISATION_DB) / 10);
	const outOfBand = peakPower * OUT_OF_BAND_REGULARISATION;
	const binHz = sampleRate / size;
	for (let k = 0; k <= size / 2; k++) {
		const xr = referenceSpectrum[2 * k];
		const xi = referenceSpectrum[2 * k + 1];
		const yr = spectrum[2 * k];
		const yi = spectrum[2 * k + 1];
		const denominator = xr * xr + xi * xi + regularisation(k * binHz, law, inBand, outOfBand);
		// Y·X* / (|X|² + ε)
		spectrum[2 * k] = (yr * xr + yi * xi) / denominator;
		spectrum[2 * k + 1] = (yi * xr - yr * xi) / denominator;
	}
	// The reference spectrum is spent: its buffer takes the result (saves N doubles at the peak).
	const response = referenceSpectrum.subarray(0, size);
	plan.inverse(spectrum, response);
	const audible = audibleRange(reference);
	return { response, sweep: law, referenceStart: audible.first, referenceEnd: audible.end };
}

function circularEnergy(x: Float64Array, centreLag: number, halfWidth: number): number {
	const n = x.length;
	let sum = 0;
	for (let lag = centreLag - halfWidth; lag <= centreLag + halfWidth; lag++) {
		const value = x[((lag % n) + n) % n];
		sum += value * value;
	}
	return sum;
}

/**
 * Impulse response from a recorded sweep: the causal part of the deconvolution from a little
 * before the linear peak, as long as the recording allows; the harmonic-distortion products,
 * which land Δt_N = L·ln N before it (Farina 2000), stay outside and are only reported.
 */
export function deconvolveSweep(
	recorded: Float64Array,
	reference: Float64Array,
	sampleRate: number,
	options: DeconvolutionOptions = {}
): DeconvolutionResult {
	const { response, sweep, referenceStart, referenceEnd } = deconvolveFull(recorded, reference, sampleRate, options);
	const size = response.length;
	// Lags past this point were cut off by the end of the recording before the sweep's response finished.
	const lastCompleteLag = recorded.length - referenceEnd;
	if (lastCompleteLag < MIN_LENGTH_S * sampleRate) {
		throw new AnalysisInputError(
			'sweep_not_recorded',
			`the recording (${(recorded.length / sampleRate).toFixed(2)} s) ends too soon after the ${(referenceEnd / sampleRate).toFixed(2)} s sweep: record the sweep and at least the room's decay after it`
		);
	}
	let peakLag = 0;
	let peak = -1;
	for (let lag = 0; lag <= lastCompleteLag; lag++) {
		const magnitude = Math.abs(response[lag]);
		if (magnitude > peak) {
			peak = magnitude;
			peakLag = lag;
		}
	}
	const secondLead = sweep.rateConstantS * Math.LN2;
	const preRoll = Math.round(Math.min(options.preRollS ?? DEFAULT_PRE_ROLL_S, secondLead / 2) * sampleRate);
	const startLag = peakLag - preRoll;
	const maxLength = Math.round((options.maxLengthS ?? DEFAULT_MAX_LENGTH_S) * sampleRate);
	const fullBandLength = Math.min(maxLength, lastCompleteLag - startLag + 1);
	if (fullBandLength < MIN_LENGTH_S * sampleRate) {
		throw new AnalysisInputError('sweep_not_recorded', 'the recording ends before the room response to the sweep: record longer after the sweep');
	}
	// The response at f₁ is recorded until the recording ends, that many samples after the sweep's start.
	const length = Math.max(fullBandLength, Math.min(maxLength, recorded.length - referenceStart - startLag));
	const impulseResponse = new Float64Array(length);
	for (let i = 0; i < length; i++) impulseResponse[i] = response[(startLag + i + size) % size];

	const halfWindow = Math.max(1, Math.round(Math.min(0.01, (secondLead * Math.log(1.5)) / Math.LN2 / 4) * sampleRate));
	const linearEnergy = circularEnergy(response, peakLag, halfWindow);
	const harmonics = HARMONIC_ORDERS.map((order): HarmonicProduct => {
		const leadS = sweep.rateConstantS * Math.log(order);
		const lag = peakLag - Math.round(leadS * sampleRate);
		// The harmonic is visible only where it lands in the wrapped, non-causal part of the buffer.
		const visible = lag - halfWindow > recorded.length - size && lag + halfWindow < 0;
		const energy = visible ? circularEnergy(response, lag, halfWindow) : 0;
		return { order, leadS, levelDb: visible && energy > 0 ? 10 * Math.log10(energy / linearEnergy) : null };
	});
	return {
		impulseResponse,
		fullBandLength,
		sweepStartIndex: referenceStart,
		recordedLength: recorded.length,
		sampleRate,
		startLag,
		peakLag,
		peakLagS: peakLag / sampleRate,
		sweep,
		harmonics
	};
}

/**
 * Samples of the impulse response that hold the whole response at every frequency up to fHz: the
 * sweep passes f at t_f = L·ln(f/f₁) after its start (Farina 2000), and the response to it is
 * recorded until the recording ends. Never fewer than the full-band length, never more than all.
 */
export function completeLengthAt(result: DeconvolutionResult, frequencyHz: number): number {
	const { f1Hz, f2Hz, rateConstantS } = result.sweep;
	const f = Math.min(Math.max(frequencyHz, f1Hz), f2Hz);
	const passesAt = result.sweepStartIndex + Math.ceil(rateConstantS * Math.log(f / f1Hz) * result.sampleRate);
	const complete = result.recordedLength - passesAt - result.startLag;
	return Math.max(result.fullBandLength, Math.min(result.impulseResponse.length, complete));
}
