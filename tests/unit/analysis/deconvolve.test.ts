import { describe, expect, it } from 'vitest';
import { deconvolveFull, deconvolveSweep, estimateSweepLaw } from '../../../src/lib/analysis/deconvolve';
import { AnalysisInputError } from '../../../src/lib/analysis/errors';
import { generateExponentialSweep, harmonicLeadS } from '../../../src/lib/analysis/sweep';
import { exponentialNoiseDecay } from '../../../src/lib/analysis/synthetic';
import { runReference } from './helpers/python-reference';

const SAMPLE_RATE = 48000;

/** Pearson correlation of two equally long signals. */
function correlation(a: ArrayLike<number>, b: ArrayLike<number>): number {
	let ab = 0;
	let aa = 0;
	let bb = 0;
	for (let i = 0; i < a.length; i++) {
		ab += a[i] * b[i];
		aa += a[i] * a[i];
		bb += b[i] * b[i];
	}
	return ab / Math.sqrt(aa * bb);
}

/** Recording of a sweep through an IR given as taps (lag in samples, gain): the sum of shifted copies. */
function throughTaps(sweep: Float64Array, taps: { lag: number; gain: number }[], tailS: number): Float64Array {
	const out = new Float64Array(sweep.length + Math.round(tailS * SAMPLE_RATE));
	for (const { lag, gain } of taps) for (let i = 0; i < sweep.length && i + lag < out.length; i++) out[i + lag] += gain * sweep[i];
	return out;
}

// Nearly the whole band up to Nyquist, so the recovered IR is close to the full-band original.
const wideSweep = generateExponentialSweep({
	f1Hz: 10,
	f2Hz: 24000,
	durationS: 2,
	sampleRate: SAMPLE_RATE,
	fadeInS: 0.05,
	fadeOutS: 0.005,
	amplitude: 0.9,
	silenceS: 0
});
const wideLaw = { f1Hz: 10, f2Hz: 24000, durationS: 2 };

describe('sweep deconvolution (regularised spectral division)', () => {
	it.each([{ law: wideLaw, label: 'given sweep parameters' }, { law: {}, label: 'parameters estimated from the reference' }])(
		'recovers a delayed two-tap response with the delay exact ($label)',
		({ law }) => {
			const taps = [
				{ lag: 480, gain: 1 },
				{ lag: 720, gain: -0.5 }
			];
			const recorded = throughTaps(wideSweep.samples, taps, 0.5);
			const result = deconvolveSweep(recorded, wideSweep.samples, SAMPLE_RATE, law);
			expect(result.peakLag).toBe(480);
			const expected = new Float64Array(result.impulseResponse.length);
			for (const { lag, gain } of taps) expected[lag - result.startLag] = gain;
			// Correlation > 0.99: only the band outside 10 Hz–24 kHz and the fades are missing.
			expect(correlation(result.impulseResponse, expected)).toBeGreaterThan(0.99);
			// Unit gain: the taps come back at their level, less the ~2 % of the 24 kHz band outside the
			// sweep and its 1/24-octave regularisation edges (3 % allowed).
			expect(Math.abs(result.impulseResponse[480 - result.startLag] - 1)).toBeLessThan(0.03);
		}
	);

	it('recovers a decaying-noise room response (convolution by scipy.signal.fftconvolve)', () => {
		const room = exponentialNoiseDecay({ t60S: 0.3, durationS: 0.4, sampleRate: SAMPLE_RATE, onsetS: 100 / SAMPLE_RATE, seed: 21 });
		const recorded = runReference<{ convolved: number[] }>('deconvolve.py', {
			signal: Array.from(wideSweep.samples),
			impulseResponse: Array.from(room)
		}).convolved;
		const result = deconvolveSweep(Float64Array.from(recorded), wideSweep.samples, SAMPLE_RATE, wideLaw);
		const aligned = result.impulseResponse.subarray(-result.startLag, -result.startLag + room.length);
		expect(correlation(aligned, room)).toBeGreaterThan(0.99);
	});

	it('puts the 2nd harmonic of x + 0.3x² at −Δt₂, reports its level and keeps it out of the impulse response', () => {
		const f1Hz = 50;
		const f2Hz = 5000;
		const durationS = 2;
		const sweep = generateExponentialSweep({ f1Hz, f2Hz, durationS, sampleRate: SAMPLE_RATE, fadeInS: 0.02, fadeOutS: 0.02, amplitude: 1, silenceS: 0 });
		const linear = throughTaps(sweep.samples, [{ lag: 240, gain: 1 }], 0.5);
		const distorted = linear.map((x) => x + 0.3 * x * x);
		const law = { f1Hz, f2Hz, durationS };

		// Farina 2000: Δt_N = T·ln N / ln(f2/f1) = 0.30103 s here.
		const lead = harmonicLeadS(2, f1Hz, f2Hz, durationS);
		const { response } = deconvolveFull(distorted, sweep.samples, SAMPLE_RATE, law);
		const n = response.length;
		let harmonicPeak = 0;
		for (let i = linear.length; i < n; i++) if (Math.abs(response[i]) > Math.abs(response[harmonicPeak])) harmonicPeak = i;
		const harmonicLag = harmonicPeak - n;
		// Within 1 ms: the harmonic pulse has a phase rotation, so its largest sample may sit a little off centre.
		expect(Math.abs(harmonicLag - (240 - lead * SAMPLE_RATE))).toBeLessThan(0.001 * SAMPLE_RATE);

		const result = deconvolveSweep(distorted, sweep.samples, SAMPLE_RATE, law);
		const second = result.harmonics.find((h) => h.order === 2)!;
		expect(second.leadS).toBeCloseTo(lead, 9);
		// sin² = (1 − cos 2φ)/2: the 2nd harmonic sweep has amplitude 0.15 and the linear one's spectrum
		// shape, over 2f1…f2, so its energy re the linear response is 0.15²·(f2 − 2f1)/(f2 − f1) = −16.5 dB.
		const expectedDb = 10 * Math.log10((0.15 ** 2 * (f2Hz - 2 * f1Hz)) / (f2Hz - f1Hz));
		expect(Math.abs(second.levelDb! - expectedDb)).toBeLessThan(1);
		// x² makes no 3rd harmonic.
		expect(result.harmonics.find((h) => h.order === 3)!.levelDb!).toBeLessThan(-40);

		const clean = deconvolveSweep(linear, sweep.samples, SAMPLE_RATE, law);
		expect(result.startLag).toBe(clean.startLag);
		expect(result.startLag).toBe(240 - 240); // peak at 240, 5 ms (240 samples) of pre-roll
		expect(correlation(result.impulseResponse, clean.impulseResponse)).toBeGreaterThan(0.999);
	});

	it('estimates the sweep law from the reference (zero-crossing rate, least squares)', () => {
		const law = estimateSweepLaw(wideSweep.samples, SAMPLE_RATE);
		// L = T / ln(f2/f1) = 2 / ln 2400; the fades blur only the ends, which the fit leaves out.
		expect(Math.abs(law.rateConstantS / (2 / Math.log(2400)) - 1)).toBeLessThan(0.02);
		expect(law.f1Hz).toBeGreaterThan(5);
		expect(law.f1Hz).toBeLessThan(20);
	});

	it.each([
		{
			label: 'a recording that stops with the sweep',
			recorded: wideSweep.samples.slice(0, wideSweep.samples.length - 100),
			code: 'sweep_not_recorded'
		},
		{ label: 'a silent recording', recorded: new Float64Array(120000), code: 'silent_signal' },
		{ label: 'an empty recording', recorded: new Float64Array(0), code: 'no_samples' }
	])('rejects $label with code $code', ({ recorded, code }) => {
		try {
			deconvolveSweep(recorded, wideSweep.samples, SAMPLE_RATE, wideLaw);
			expect.unreachable('should have thrown');
		} catch (error) {
			expect(error).toBeInstanceOf(AnalysisInputError);
			expect((error as AnalysisInputError).code).toBe(code);
		}
	});

	it('rejects partial sweep parameters', () => {
		const recorded = throughTaps(wideSweep.samples, [{ lag: 10, gain: 1 }], 0.5);
		expect(() => deconvolveSweep(recorded, wideSweep.samples, SAMPLE_RATE, { f1Hz: 10 })).toThrow(/f1Hz, f2Hz and durationS/);
	});
});
