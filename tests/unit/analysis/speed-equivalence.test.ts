// The faster forms of issue 13 give the very numbers of the plain forms they replace: each check
// compares against the plain computation itself (fft.js's own constructor, smoothing every bin,
// two separate analyses), so these are equalities, not tolerances.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { analyseRecording, analyseRecordingInOctavesAndThirds } from '../../../src/lib/analysis/analyse';
import { fftOfSize, RealFftPlan, realFftPlan } from '../../../src/lib/analysis/fft';
import { logSpacedCurve, smoothedLogSpacedCurves, smoothFractionalOctave, SMOOTHING_FRACTIONS } from '../../../src/lib/analysis/response';
import { createSeededGaussian } from '../../../src/lib/analysis/synthetic';
import { decodeWav } from '../../../src/lib/analysis/wav';

const fixture = (name: string) => readFileSync(fileURLToPath(new URL(`../../../fixtures/${name}`, import.meta.url)));

describe('cached FFT instances', () => {
	it.each([2, 4, 8, 64, 1024, 16384])('size %i: the same tables as fft.js builds, and the same transform', (size) => {
		const plain = new FFT(size) as unknown as Record<string, ArrayLike<number> | number>;
		const typed = fftOfSize(size) as unknown as Record<string, ArrayLike<number> | number>;
		for (const field of ['size', '_csize', '_width']) expect(typed[field]).toBe(plain[field]);
		expect(Array.from(typed.table as ArrayLike<number>)).toEqual(plain.table);
		expect(Array.from(typed._bitrev as ArrayLike<number>)).toEqual(plain._bitrev);
		const gaussian = createSeededGaussian(size);
		const input = Float64Array.from({ length: 2 * size }, () => gaussian());
		const a = new Float64Array(2 * size);
		const b = new Float64Array(2 * size);
		(plain as unknown as FFT).transform(a, input);
		(typed as unknown as FFT).transform(b, input);
		expect(Array.from(b)).toEqual(Array.from(a));
	});

	it('is one instance per size, holding no array after a transform', () => {
		expect(fftOfSize(256)).toBe(fftOfSize(256));
		expect(realFftPlan(512)).toBe(realFftPlan(512));
		const plan = realFftPlan(512);
		plan.forward(new Float64Array(300).fill(1), new Float64Array(514));
		expect((fftOfSize(256) as unknown as { _out: unknown; _data: unknown })._out).toBeNull();
		expect((fftOfSize(256) as unknown as { _out: unknown; _data: unknown })._data).toBeNull();
	});

	it('the real plan equals the packing done with a fresh fft.js half-size transform', () => {
		const size = 4096;
		const gaussian = createSeededGaussian(11);
		const x = Float64Array.from({ length: 3000 }, () => gaussian());
		// Reference: the half-size complex FFT of the zero-padded samples, unpacked bin by bin (Numerical Recipes' packing).
		const padded = new Float64Array(size);
		padded.set(x);
		const z = new Float64Array(size);
		new FFT(size / 2).transform(z, padded);
		const m = size / 2;
		const spectrum = new Float64Array(size + 2);
		new RealFftPlan(size).forward(x, spectrum);
		for (const k of [0, 1, 7, m / 2, m - 1, m]) {
			const a = k % m;
			const b = (m - k) % m;
			const er = (z[2 * a] + z[2 * b]) / 2;
			const ei = (z[2 * a + 1] - z[2 * b + 1]) / 2;
			const or = (z[2 * a + 1] + z[2 * b + 1]) / 2;
			const oi = -(z[2 * a] - z[2 * b]) / 2;
			const c = k === m ? -1 : Math.cos((2 * Math.PI * k) / size);
			const s = k === m ? 0 : Math.sin((2 * Math.PI * k) / size);
			expect(spectrum[2 * k]).toBe(er + (c * or + s * oi));
			expect(spectrum[2 * k + 1]).toBe(ei + (c * oi - s * or));
		}
	});
});

describe('smoothing only at the chart points', () => {
	it('equals smoothing every bin, then sampling, for every fraction', () => {
		const gaussian = createSeededGaussian(5);
		const n = 3000;
		const freqHz = Float64Array.from({ length: n }, (_, k) => k * 7.3);
		// A spectrum with deep notches and a zero-power bin (−∞ is floored like a zero).
		const powerDb = Float64Array.from({ length: n }, (_, k) => (k === 40 ? -Infinity : 20 * gaussian() - (k % 97 === 0 ? 120 : 0)));
		const grid = { pointsPerOctave: 48, fMinHz: 20, fMaxHz: 20000 };
		const fast = smoothedLogSpacedCurves(freqHz, powerDb, SMOOTHING_FRACTIONS, grid);
		SMOOTHING_FRACTIONS.forEach((fraction, i) => {
			expect(fast[i]).toEqual(logSpacedCurve(freqHz, smoothFractionalOctave(freqHz, powerDb, fraction), grid).db);
		});
	});

	it('refuses what the plain form refuses', () => {
		const freqHz = Float64Array.from([0, 10, 20, 30]);
		expect(() => smoothedLogSpacedCurves(freqHz, Float64Array.from([0, Infinity, 0, 0]), [3])).toThrow(/not finite/);
		expect(() => smoothedLogSpacedCurves(freqHz, Float64Array.from([0, NaN, 0, 0]), [3])).toThrow(/not a number/);
		expect(() => smoothedLogSpacedCurves(freqHz, new Float64Array(4), [5 as 3])).toThrow(/fraction must be one of/);
	});
});

describe('stored results in octaves and thirds', () => {
	it('one preparation gives what two separate analyses give (recorded sweep, deconvolved once)', () => {
		const played = decodeWav(fixture('sweep-1s-48k.wav'));
		const options = { reference: played.samples, referenceSampleRate: played.sampleRate };
		const bytes = fixture('sweep-recorded-48k.wav');
		const { octaves, thirds } = analyseRecordingInOctavesAndThirds(bytes, options, { extraOctaves: true });
		expect(octaves).toEqual(analyseRecording(bytes, { ...options, bands: 'octave', extraOctaves: true }));
		const separate = analyseRecording(bytes, { ...options, bands: 'third' });
		expect(thirds.bands).toEqual(separate.bands);
		expect(thirds.bands).toHaveLength(24);
		expect(thirds.curves.decay).toEqual([]); // the thirds pass skips the curves it would drop
	});
});
