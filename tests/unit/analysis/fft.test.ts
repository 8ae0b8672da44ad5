import { describe, expect, it } from 'vitest';
import { ChirpDftPlan, RealFftPlan, fftSizeFor, isPowerOfTwo } from '../../../src/lib/analysis/fft';
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

describe('ChirpDftPlan: the first bins of a long DFT of a short piece', () => {
	// Against the DFT's definition at the piece's own place in the signal, Y[k] = Σ x[j]·W^((start + j)·k),
	// with the phase of each term reduced exactly (its index product modulo N) so the reference
	// itself keeps full accuracy at large starts. Tolerance 1e-12 of the piece's energy scale.
	function definition(x: Float64Array, start: number, size: number, bins: number) {
		return Array.from({ length: bins }, (_, k) => {
			let re = 0;
			let im = 0;
			for (let j = 0; j < x.length; j++) {
				const angle = (2 * Math.PI * (((start + j) * k) % size)) / size;
				re += x[j] * Math.cos(angle);
				im -= x[j] * Math.sin(angle);
			}
			return [re, im];
		});
	}

	it.each([
		{ size: 65536, bins: 726, length: 480, start: 37_000 },
		{ size: 131072, bins: 726, length: 960, start: 400_000 },
		{ size: 1024, bins: 513, length: 100, start: 3 },
		{ size: 64, bins: 10, length: 1, start: 0 }
	])('N = $size, $bins bins, $length samples from $start', ({ size, bins, length, start }) => {
		const gaussian = createSeededGaussian(size + length);
		const x = Float64Array.from({ length }, () => gaussian());
		const plan = new ChirpDftPlan(size, bins, length);
		const sum = new Float64Array(2 * bins).fill(0.25); // added to what is there
		plan.addTo(x, start, sum);
		const scale = Math.sqrt(length);
		definition(x, start, size, bins).forEach(([re, im], k) => {
			expect(Math.abs(sum[2 * k] - 0.25 - re)).toBeLessThan(1e-12 * scale);
			expect(Math.abs(sum[2 * k + 1] - 0.25 - im)).toBeLessThan(1e-12 * scale);
		});
	});

	it('pieces of a signal add up to its DFT (the real plan’s bins)', () => {
		const size = 4096;
		const gaussian = createSeededGaussian(3);
		const x = Float64Array.from({ length: 3000 }, () => gaussian());
		const whole = new Float64Array(size + 2);
		new RealFftPlan(size).forward(x, whole);
		const plan = new ChirpDftPlan(size, 200, 700);
		const sum = new Float64Array(400);
		for (let start = 0; start < x.length; start += 700) plan.addTo(x.subarray(start, start + 700), start, sum);
		for (let k = 0; k < 200; k++) {
			expect(Math.abs(sum[2 * k] - whole[2 * k])).toBeLessThan(1e-10);
			expect(Math.abs(sum[2 * k + 1] - whole[2 * k + 1])).toBeLessThan(1e-10);
		}
	});

	it('refuses a piece longer than the plan', () => {
		expect(() => new ChirpDftPlan(1024, 10, 50).addTo(new Float64Array(51), 0, new Float64Array(20))).toThrow(/exceed/);
		expect(() => new ChirpDftPlan(1024, 2000, 50)).toThrow(RangeError);
	});
});

describe('the real plan’s twiddle factors', () => {
	// Half of them are read from fft.js's half-size table: they must be the very values of
	// Math.cos/Math.sin at 2πk/N, or results would move by round-off with the table's origin.
	it.each([8, 1024, 65536])('N = %i: cos and sin of 2πk/N, bit for bit', (size) => {
		const twiddle = (new RealFftPlan(size) as unknown as { twiddle: Float64Array }).twiddle;
		let mismatches = 0;
		for (let k = 0; k < size / 2; k++) {
			const angle = (2 * Math.PI * k) / size;
			if (twiddle[2 * k] !== Math.cos(angle) || twiddle[2 * k + 1] !== Math.sin(angle)) mismatches++;
		}
		expect(mismatches).toBe(0);
	});
});
