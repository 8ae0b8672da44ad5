import { describe, expect, it } from 'vitest';
import { RealFftPlan, fftSizeFor, isPowerOfTwo } from '../../../src/lib/analysis/fft';
import { createSeededGaussian } from '../../../src/lib/analysis/synthetic';

/** The DFT by its definition, X[k] = Σ x[n]·e^(−j2πkn/N). */
function naiveDft(x: Float64Array, size: number): { re: number[]; im: number[] } {
	const re: number[] = [];
	const im: number[] = [];
	for (let k = 0; k <= size / 2; k++) {
		let sr = 0;
		let si = 0;
		for (let n = 0; n < x.length; n++) {
			sr += x[n] * Math.cos((2 * Math.PI * k * n) / size);
			si -= x[n] * Math.sin((2 * Math.PI * k * n) / size);
		}
		re.push(sr);
		im.push(si);
	}
	return { re, im };
}

describe('real FFT plan against the DFT definition', () => {
	it.each([
		{ size: 8, length: 8 },
		{ size: 64, length: 64 },
		{ size: 256, length: 200 },
		{ size: 1024, length: 1 }
	])('size $size, $length input samples (zero-padded)', ({ size, length }) => {
		const gaussian = createSeededGaussian(size + length);
		const x = new Float64Array(length).map(() => gaussian());
		const plan = new RealFftPlan(size);
		const spectrum = new Float64Array(size + 2);
		plan.forward(x, spectrum);
		const expected = naiveDft(x, size);
		// Round-off of both sums grows like √N·ε·Σ|x|; 1e-9 is generous and still catches any wrong bin.
		for (let k = 0; k <= size / 2; k++) {
			expect(Math.abs(spectrum[2 * k] - expected.re[k])).toBeLessThan(1e-9);
			expect(Math.abs(spectrum[2 * k + 1] - expected.im[k])).toBeLessThan(1e-9);
		}
	});

	it('inverse(forward(x)) returns x, and Parseval holds', () => {
		const size = 4096;
		const gaussian = createSeededGaussian(3);
		const x = new Float64Array(size).map(() => gaussian());
		const plan = new RealFftPlan(size);
		const spectrum = new Float64Array(size + 2);
		plan.forward(x, spectrum);
		const back = new Float64Array(size);
		plan.inverse(spectrum, back);
		for (let i = 0; i < size; i++) expect(Math.abs(back[i] - x[i])).toBeLessThan(1e-12);
		// Σ|x|² = (1/N)·Σ_k |X_k|² over the full spectrum (bins 1…N/2−1 count twice).
		let timeEnergy = 0;
		for (const v of x) timeEnergy += v * v;
		let spectralEnergy = 0;
		for (let k = 0; k <= size / 2; k++) {
			const power = spectrum[2 * k] ** 2 + spectrum[2 * k + 1] ** 2;
			spectralEnergy += k === 0 || k === size / 2 ? power : 2 * power;
		}
		expect(Math.abs(spectralEnergy / size / timeEnergy - 1)).toBeLessThan(1e-12);
	});

	it.each([0, 6, 12, 100])('rejects size %i', (size) => {
		expect(() => new RealFftPlan(size)).toThrow(RangeError);
	});

	it('rejects an input longer than the plan and a short spectrum buffer', () => {
		const plan = new RealFftPlan(16);
		expect(() => plan.forward(new Float64Array(17), new Float64Array(18))).toThrow(/does not fit/);
		expect(() => plan.forward(new Float64Array(16), new Float64Array(17))).toThrow(/needs 18/);
	});

	it('sizes: next power of two, at least 8', () => {
		expect([0, 1, 8, 9, 1000, 1024, 1025].map(fftSizeFor)).toEqual([8, 8, 8, 16, 1024, 1024, 2048]);
		expect([1, 2, 1024].every(isPowerOfTwo)).toBe(true);
		expect([0, 3, 1000, 0.5].some(isPowerOfTwo)).toBe(false);
	});
});
