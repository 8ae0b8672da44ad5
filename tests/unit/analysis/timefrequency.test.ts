import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { logSpacedCurve, smoothFractionalOctave } from '../../../src/lib/analysis/response';
import { exponentialNoiseDecay } from '../../../src/lib/analysis/synthetic';
import { SPECTRAL_DECAY_FLOOR_DB, cumulativeSpectralDecay } from '../../../src/lib/analysis/timefrequency';

const SAMPLE_RATE = 48000;

/** e^(−δt)·sin(2πf0·t) after `delay` zeros, δ = 3·ln10/T so the level falls 60 dB in T (definition of T). */
function decayingResonance(f0Hz: number, t60S: number, lengthS: number, delay = 0): Float64Array {
	const delta = (3 * Math.LN10) / t60S;
	const ir = new Float64Array(delay + Math.round(lengthS * SAMPLE_RATE));
	for (let i = delay; i < ir.length; i++) {
		const t = (i - delay) / SAMPLE_RATE;
		ir[i] = Math.exp(-delta * t) * Math.sin(2 * Math.PI * f0Hz * t);
	}
	return ir;
}

describe('cumulativeSpectralDecay of a single decaying resonance', () => {
	// Analytic: the IR truncated at t is e^(−δt) times the same resonance (phase-shifted), so
	// its spectrum near f0 is 20·lg(e^(−δt)) = −60·t/T dB below slice 0. The phase shift moves
	// the negative-frequency image by up to ±20·lg(1 + δ/(2ω0)) dB in each slice, so twice that
	// between two slices (0.30 dB at 40 Hz, T = 0.8 s), plus 0.05 dB for the 0.01 dB rounding and
	// the 2 ms rise. Checked while the fall is ≤ 50 dB, clear of the −80 dB floor.
	const cases = [
		{ f0Hz: 100, t60S: 0.5 },
		{ f0Hz: 63, t60S: 1.0 },
		{ f0Hz: 250, t60S: 0.3 },
		{ f0Hz: 40, t60S: 0.8 }
	];
	it.each(cases)('f0 = $f0Hz Hz, T = $t60S s: peak at f0, fall of 60·t/T dB', ({ f0Hz, t60S }) => {
		const delay = 480; // 10 ms of silence before the onset
		const delta = (3 * Math.LN10) / t60S;
		const toleranceDb = 2 * 20 * Math.log10(1 + delta / (4 * Math.PI * f0Hz)) + 0.05;
		const decay = cumulativeSpectralDecay(decayingResonance(f0Hz, t60S, 2, delay), SAMPLE_RATE, delay);
		const nearest = decay.freqHz.reduce(
			(best, f, k) => (Math.abs(Math.log2(f / f0Hz)) < Math.abs(Math.log2(decay.freqHz[best] / f0Hz)) ? k : best),
			0
		);
		decay.levelsDb.forEach((slice, s) => {
			const t = decay.timesMs[s] / 1000;
			const expectedFall = (-60 * t) / t60S;
			if (expectedFall < -50) return;
			// Peak within one grid step (1/24 octave) of f0; 1e-4 octave for the 0.001 Hz rounding.
			const peak = slice.indexOf(Math.max(...slice));
			expect(Math.abs(Math.log2(decay.freqHz[peak] / f0Hz))).toBeLessThanOrEqual(1 / 24 + 1e-4);
			expect(Math.abs(slice[nearest] - decay.levelsDb[0][nearest] - expectedFall)).toBeLessThan(toleranceDb);
		});
	});

	it('negative case: a resonance twice as long falls half as fast', () => {
		const long = cumulativeSpectralDecay(decayingResonance(100, 1.0, 2), SAMPLE_RATE, 0);
		const k = long.freqHz.reduce((best, f, i) => (Math.abs(f - 100) < Math.abs(long.freqHz[best] - 100) ? i : best), 0);
		const s = long.timesMs.indexOf(200);
		// −12 dB at 200 ms for T = 1 s, not the −24 dB of T = 0.5 s.
		expect(Math.abs(long.levelsDb[s][k] - long.levelsDb[0][k] + 12)).toBeLessThan(0.3);
	});
});

describe('cumulativeSpectralDecay layout', () => {
	const ir = decayingResonance(80, 0.6, 1.5);

	it('has 31 slices every 10 ms over 300 ms and 24 points per octave from 20 to 500 Hz', () => {
		const decay = cumulativeSpectralDecay(ir, SAMPLE_RATE, 0);
		expect(decay.timesMs).toEqual(Array.from({ length: 31 }, (_, s) => 10 * s));
		expect(decay.freqHz).toHaveLength(Math.floor(24 * Math.log2(500 / 20)) + 1);
		expect(decay.freqHz[0]).toBeCloseTo(20, 3);
		expect(decay.levelsDb).toHaveLength(31);
		for (const slice of decay.levelsDb) {
			expect(slice).toHaveLength(decay.freqHz.length);
			for (const level of slice) expect(level).toBeGreaterThanOrEqual(SPECTRAL_DECAY_FLOOR_DB);
		}
		expect(Math.max(...decay.levelsDb[0])).toBe(0); // re the maximum of slice 0
	});

	it('follows the options', () => {
		const decay = cumulativeSpectralDecay(ir, SAMPLE_RATE, 0, { durationMs: 100, slices: 5, fMinHz: 40, fMaxHz: 320, pointsPerOctave: 12 });
		expect(decay.timesMs).toEqual([0, 25, 50, 75, 100]);
		expect(decay.freqHz).toHaveLength(3 * 12 + 1);
	});

	it.each([
		{ name: 'IR shorter than the duration', call: () => cumulativeSpectralDecay(ir.subarray(0, 4800), SAMPLE_RATE, 0), message: /too short/ },
		{ name: 'start outside the IR', call: () => cumulativeSpectralDecay(ir, SAMPLE_RATE, ir.length), message: /startIndex/ },
		{ name: 'one slice', call: () => cumulativeSpectralDecay(ir, SAMPLE_RATE, 0, { slices: 1 }), message: /slices/ },
		{ name: 'fMin above fMax', call: () => cumulativeSpectralDecay(ir, SAMPLE_RATE, 0, { fMinHz: 600 }), message: /fMinHz/ }
	])('rejects $name', ({ call, message }) => {
		expect(call).toThrow(message);
	});
});

describe('cumulativeSpectralDecay by pieces', () => {
	// The slices are computed from one FFT of the last slice and short DFTs of what each earlier
	// slice adds: the same as one FFT per slice (the definition above), done here with fft.js
	// itself, the plain smoothing of every bin and the plain log-spaced sampling.
	function plainDecay(ir: Float64Array, sampleRate: number, startIndex: number, o: { durationMs: number; slices: number; fMinHz: number; fMaxHz: number }) {
		const rate = (ms: number) => Math.round((ms * sampleRate) / 1000);
		const end = Math.min(ir.length, startIndex + rate(o.durationMs + 500));
		const window = ir.slice(startIndex, end);
		const fadeOut = Math.floor(0.1 * window.length);
		for (let k = 0; k < fadeOut; k++) window[window.length - fadeOut + k] *= 0.5 * (1 + Math.cos((Math.PI * (k + 1)) / (fadeOut + 1)));
		let size = 4;
		while (size < Math.max(window.length, sampleRate)) size *= 2;
		const fft = new FFT(size);
		const fadeIn = rate(2);
		const freqHz = Float64Array.from({ length: size / 2 + 1 }, (_, k) => (k * sampleRate) / size);
		const grid = { fMinHz: o.fMinHz, fMaxHz: o.fMaxHz, pointsPerOctave: 24 };
		const curves = Array.from({ length: o.slices }, (_, s) => {
			const offset = Math.round((s * rate(o.durationMs)) / (o.slices - 1));
			const padded = new Float64Array(size);
			padded.set(window.subarray(offset));
			for (let k = 0; k < fadeIn; k++) padded[k] *= 0.5 * (1 - Math.cos((Math.PI * (k + 1)) / (fadeIn + 1)));
			const spectrum = new Float64Array(2 * size);
			fft.realTransform(spectrum, padded);
			const powerDb = freqHz.map((_, k) => 10 * Math.log10(Math.max(spectrum[2 * k] ** 2 + spectrum[2 * k + 1] ** 2, 1e-30)));
			return logSpacedCurve(freqHz, smoothFractionalOctave(freqHz, powerDb, 6), grid).db;
		});
		const reference = Math.max(...curves[0]);
		return curves.map((curve) => curve.map((db) => Math.round(Math.max(SPECTRAL_DECAY_FLOOR_DB, db - reference) * 100) / 100));
	}

	it.each([
		{ sampleRate: 44100, durationMs: 300, slices: 31, fMinHz: 20, fMaxHz: 500 },
		{ sampleRate: 48000, durationMs: 300, slices: 31, fMinHz: 20, fMaxHz: 500 },
		{ sampleRate: 96000, durationMs: 300, slices: 31, fMinHz: 20, fMaxHz: 500 },
		{ sampleRate: 48000, durationMs: 100, slices: 5, fMinHz: 40, fMaxHz: 320 },
		// Wide enough that the short DFTs would cost more: one FFT per slice.
		{ sampleRate: 48000, durationMs: 300, slices: 31, fMinHz: 20, fMaxHz: 20000 }
	])('$sampleRate Hz, $slices slices over $durationMs ms, $fMinHz–$fMaxHz Hz: every level as one FFT per slice gives', (o) => {
		const ir = exponentialNoiseDecay({ t60S: 0.6, durationS: 1.2, sampleRate: o.sampleRate, onsetS: 0.01, noiseDbRePeak: -70, seed: 21 });
		const start = Math.round(0.01 * o.sampleRate);
		const decay = cumulativeSpectralDecay(ir, o.sampleRate, start, o);
		expect(decay.levelsDb).toEqual(plainDecay(ir, o.sampleRate, start, o));
	});
});
