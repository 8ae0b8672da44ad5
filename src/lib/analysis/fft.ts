/**
 * The engine's one FFT module: fft.js instances cached by size with typed-array tables, the real
 * FFT plan built on them, and cached real plans. Every transform of the engine goes through here.
 */
import FFT from 'fft.js';

export function isPowerOfTwo(n: number): boolean {
	return Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;
}

/** Smallest power of two ≥ n (and ≥ 8, the smallest size the real plan supports). */
export function fftSizeFor(n: number): number {
	if (!Number.isFinite(n) || n < 0) throw new RangeError(`fft size needs a non-negative length, got ${n}`);
	let size = 8;
	while (size < n) size *= 2;
	return size;
}

/**
 * A cached fft.js instance of this size (fft.js 4: radix-4, complex `transform`/`inverseTransform`
 * on interleaved arrays, `realTransform` filling bins 0…N/2). Its tables are built once per size
 * and kept as typed arrays — the same values, so the same results, with faster reads. Calls are
 * synchronous and the instance is left holding no array, so every caller can share it.
 */
export function fftOfSize(size: number): FFT {
	let fft = kept.get(size);
	if (!fft) {
		fft = typedFft(size);
		// The largest are let go first, so big tables do not pile up in a long-lived worker.
		if (kept.size >= MAX_KEPT_SIZES) kept.delete(Math.max(...kept.keys()));
		kept.set(size, fft);
	}
	return fft;
}

/**
 * An fft.js instance whose tables are typed arrays from the start (its constructor fills plain
 * arrays first): the same fields, filled by the same expressions as fft.js 4.0.4's constructor.
 */
function typedFft(size: number): FFT {
	if (!(size > 1 && isPowerOfTwo(size))) throw new RangeError(`FFT size must be a power of two and bigger than 1, got ${size}`);
	const table = new Float64Array(size * 2);
	for (let i = 0; i < table.length; i += 2) {
		const angle = (Math.PI * i) / size;
		table[i] = Math.cos(angle);
		table[i + 1] = -Math.sin(angle);
	}
	let power = 0;
	for (let t = 1; size > t; t <<= 1) power++;
	// Radix-4 from an initial length of 8 when the power is even, else of 4 (fft.js's own rule).
	const width = power % 2 === 0 ? power - 1 : power;
	const bitrev = new Int32Array(1 << width);
	for (let j = 0; j < bitrev.length; j++) {
		for (let shift = 0; shift < width; shift += 2) bitrev[j] |= ((j >>> shift) & 3) << (width - shift - 2);
	}
	const fft = Object.create(FFT.prototype) as FFT;
	Object.assign(fft, { size, _csize: size << 1, table, _width: width, _bitrev: bitrev, _out: null, _data: null, _inv: 0 });
	return fft;
}

/** Lets go of the arrays fft.js keeps a reference to after a transform. */
export function releaseFft(fft: FFT): void {
	const internals = fft as unknown as { _out: unknown; _data: unknown };
	internals._out = null;
	internals._data = null;
}

const kept = new Map<number, FFT>();
const MAX_KEPT_SIZES = 8;

/**
 * Real-input FFT of a power-of-two size N, computed with one complex FFT of size N/2 (the samples
 * taken as interleaved complex pairs) and a twiddle pass — the standard packing (Press et al.,
 * Numerical Recipes, "FFT of real functions"; from memory).
 * Spectra are half spectra: bins 0…N/2, interleaved (re, im), length N + 2. The inverse is scaled by 1/N.
 * The plan owns its tables and scratch buffers: reuse it, but not from two callers at once.
 */
export class RealFftPlan {
	readonly size: number;
	private readonly half: FFT;
	/** cos, sin of 2πk/N for k < N/2 (read by ChirpDftPlan too). */
	readonly twiddle: Float64Array;
	private readonly packed: Float64Array;
	/** Only for an inverse into an output longer than N. */
	private transformed: Float64Array | undefined;

	constructor(size: number) {
		if (!isPowerOfTwo(size) || size < 8) throw new RangeError(`real FFT size must be a power of two ≥ 8, got ${size}`);
		this.size = size;
		this.half = fftOfSize(size / 2);
		this.twiddle = twiddles(size);
		this.packed = new Float64Array(size);
	}

	/** Writes the half spectrum of `input` (zero-padded to N; longer input is an error) into `spectrum`, which must not overlap it. */
	forward(input: Float64Array, spectrum: Float64Array): void {
		const n = this.size;
		if (input.length > n) throw new RangeError(`input of ${input.length} samples does not fit a ${n}-point FFT`);
		if (spectrum.length < n + 2) throw new RangeError(`spectrum buffer needs ${n + 2} values, got ${spectrum.length}`);
		let source = input;
		if (input.length < n) {
			this.packed.set(input);
			this.packed.fill(0, input.length);
			source = this.packed;
		}
		// Even samples as real parts, odd samples as imaginary parts: the input already is that array.
		// The complex transform lands in the spectrum buffer itself; bins k and m − k are then made
		// from the same two values of it, so each pair is read before either is written.
		const z = spectrum;
		this.half.transform(z, source);
		releaseFft(this.half);
		const m = n / 2;
		const z0r = z[0];
		const z0i = z[1];
		writeBin(spectrum, this.twiddle, m, m, z0r, z0i, z0r, -z0i);
		writeBin(spectrum, this.twiddle, m, 0, z0r, z0i, z0r, -z0i);
		for (let k = 1; 2 * k <= m; k++) {
			const b = m - k;
			const zr = z[2 * k];
			const zi = z[2 * k + 1];
			const cr = z[2 * b];
			const ci = z[2 * b + 1];
			writeBin(spectrum, this.twiddle, m, k, zr, zi, cr, -ci);
			if (b !== k) writeBin(spectrum, this.twiddle, m, b, cr, ci, zr, -zi);
		}
	}

	/** Writes the real signal of a half spectrum into `output` (length ≥ N). */
	inverse(spectrum: Float64Array, output: Float64Array): void {
		const n = this.size;
		if (spectrum.length < n + 2) throw new RangeError(`spectrum needs ${n + 2} values, got ${spectrum.length}`);
		if (output.length < n) throw new RangeError(`output buffer needs ${n} samples, got ${output.length}`);
		const m = n / 2;
		const tw = this.twiddle;
		const z = this.packed;
		for (let k = 0; k < m; k++) {
			const xr = spectrum[2 * k];
			const xi = spectrum[2 * k + 1];
			const yr = spectrum[2 * (m - k)];
			const yi = -spectrum[2 * (m - k) + 1];
			// E = (X[k] + conj X[m−k]) / 2,  O = (X[k] − conj X[m−k])·W^−k / 2, Z = E + j·O
			const er = (xr + yr) / 2;
			const ei = (xi + yi) / 2;
			const dr = (xr - yr) / 2;
			const di = (xi - yi) / 2;
			const c = tw[2 * k];
			const s = tw[2 * k + 1];
			const or = dr * c - di * s;
			const oi = dr * s + di * c;
			z[2 * k] = er - oi;
			z[2 * k + 1] = ei + or;
		}
		const result = n === output.length ? output : (this.transformed ??= new Float64Array(n));
		this.half.inverseTransform(result, z);
		releaseFft(this.half);
		if (result !== output) output.set(result);
	}
}

/**
 * cos, sin of 2πk/N for k < N/2, interleaved. The even k are read from the
 * half-size fft.js table, which holds cos and −sin of 2π(2j)/N computed from the very same
 * double (π·2j/(N/2) and 2π·2j/N differ only by exact powers of two), so every value is the one
 * Math.cos/Math.sin give directly; only the odd k are computed, half the trigonometric calls
 * (most of a new plan's cost before its code is optimised).
 */
function twiddles(size: number): Float64Array {
	const table = new Float64Array(size);
	const halfTable = (fftOfSize(size / 2) as unknown as { table: Float64Array }).table;
	for (let k = 0; k < size / 2; k += 2) {
		table[2 * k] = halfTable[k];
		table[2 * k + 1] = -halfTable[k + 1];
	}
	for (let k = 1; k < size / 2; k += 2) {
		const angle = (2 * Math.PI * k) / size;
		table[2 * k] = Math.cos(angle);
		table[2 * k + 1] = Math.sin(angle);
	}
	return table;
}

/** Bin k of a real FFT from Z[k] = (zr, zi) and conj Z[m−k] = (cr, ci) of the half-size transform. */
function writeBin(spectrum: Float64Array, tw: Float64Array, m: number, k: number, zr: number, zi: number, cr: number, ci: number): void {
	// E = (Z[k] + conj Z[m−k]) / 2,  O = (Z[k] − conj Z[m−k]) / 2j
	const er = (zr + cr) / 2;
	const ei = (zi + ci) / 2;
	const or = (zi - ci) / 2;
	const oi = -(zr - cr) / 2;
	// X[k] = E + W^k·O with W^k = cos − j·sin
	const c = k === m ? -1 : tw[2 * k];
	const s = k === m ? 0 : tw[2 * k + 1];
	spectrum[2 * k] = er + (c * or + s * oi);
	spectrum[2 * k + 1] = ei + (c * oi - s * or);
}

const realPlans = new Map<number, RealFftPlan>();

/** The cached real plan of this size (see RealFftPlan: one caller at a time, as everything here is synchronous). */
export function realFftPlan(size: number): RealFftPlan {
	let plan = realPlans.get(size);
	if (!plan) {
		plan = new RealFftPlan(size);
		if (realPlans.size >= MAX_KEPT_SIZES) realPlans.delete(Math.max(...realPlans.keys()));
		realPlans.set(size, plan);
	}
	return plan;
}

/**
 * The first `bins` bins of an N-point DFT of a short real sequence that starts at sample `start`
 * of a longer signal: Y[k] = Σ_j x[j]·W^((start + j)·k), W = e^(−2πi/N), k < bins — so the pieces
 * of one signal add up to its DFT. Computed as a convolution with a chirp, by FFTs of a size M ≥
 * bins + length − 1 much smaller than N (Bluestein, "A linear filtering approach to the
 * computation of the discrete Fourier transform", IEEE Trans. Audio Electroacoust. 18(4), 1970;
 * from memory): with jk = (j² + k² − (k − j)²)/2,
 *   Y[k] = W^(start·k)·W^(k²/2)·Σ_j (x[j]·W^(j²/2))·W^(−(k−j)²/2).
 * Every phase comes from an exact integer product reduced modulo N or 2N (W^(start·k) read from the
 * real plan's table), so long signals lose no accuracy to large angles. One caller at a time
 * (scratch buffers).
 */
export class ChirpDftPlan {
	readonly size: number;
	readonly bins: number;
	readonly maxLength: number;
	/** FFT size of the convolution. */
	readonly convolutionSize: number;
	private readonly fft: FFT;
	/** cos, sin of 2πm/N for m < N/2 (the real plan's table). */
	private readonly roots: Float64Array;
	/** W^(m²/2) for m < max(bins, maxLength), interleaved (re, im). */
	private readonly chirp: Float64Array;
	/** FFT of the conjugate chirp laid out for the circular convolution. */
	private readonly filter: Float64Array;
	private readonly work: Float64Array;
	private readonly transformed: Float64Array;

	constructor(size: number, bins: number, maxLength: number) {
		if (!(isPowerOfTwo(size) && size >= 8)) throw new RangeError(`DFT size must be a power of two ≥ 8, got ${size}`);
		if (!(Number.isInteger(bins) && bins >= 1 && bins <= size)) throw new RangeError(`bins must be an integer in 1…${size}, got ${bins}`);
		if (!(Number.isInteger(maxLength) && maxLength >= 1)) throw new RangeError(`maxLength must be a positive integer, got ${maxLength}`);
		this.size = size;
		this.bins = bins;
		this.maxLength = maxLength;
		const m = fftSizeFor(bins + maxLength - 1);
		this.convolutionSize = m;
		this.fft = fftOfSize(m);
		this.roots = realFftPlan(size).twiddle;
		const count = Math.max(bins, maxLength);
		this.chirp = new Float64Array(2 * count);
		for (let j = 0; j < count; j++) {
			const angle = (Math.PI * ((j * j) % (2 * size))) / size;
			this.chirp[2 * j] = Math.cos(angle);
			this.chirp[2 * j + 1] = -Math.sin(angle);
		}
		// b[d] = W^(−d²/2) for d = k − j in −(maxLength − 1)…bins − 1, negative d wrapped to M + d.
		const b = new Float64Array(2 * m);
		for (let d = 0; d < bins; d++) {
			b[2 * d] = this.chirp[2 * d];
			b[2 * d + 1] = -this.chirp[2 * d + 1];
		}
		for (let d = 1; d < maxLength; d++) {
			b[2 * (m - d)] = this.chirp[2 * d];
			b[2 * (m - d) + 1] = -this.chirp[2 * d + 1];
		}
		this.filter = new Float64Array(2 * m);
		this.fft.transform(this.filter, b);
		this.work = new Float64Array(2 * m);
		this.transformed = new Float64Array(2 * m);
	}

	/** Adds Y[k] of x (at most maxLength samples, the first at `start`) into `sum` (interleaved, ≥ 2·bins values). */
	addTo(x: Float64Array, start: number, sum: Float64Array): void {
		const length = x.length;
		if (length > this.maxLength) throw new RangeError(`${length} samples exceed this plan's ${this.maxLength}`);
		if (!(Number.isInteger(start) && start >= 0)) throw new RangeError(`start must be a whole number, got ${start}`);
		if (sum.length < 2 * this.bins) throw new RangeError(`sum needs ${2 * this.bins} values, got ${sum.length}`);
		if (length === 0) return;
		const { chirp, filter, work, transformed } = this;
		for (let j = 0; j < length; j++) {
			work[2 * j] = x[j] * chirp[2 * j];
			work[2 * j + 1] = x[j] * chirp[2 * j + 1];
		}
		work.fill(0, 2 * length);
		this.fft.transform(transformed, work);
		for (let i = 0; i < transformed.length; i += 2) {
			const re = transformed[i] * filter[i] - transformed[i + 1] * filter[i + 1];
			const im = transformed[i] * filter[i + 1] + transformed[i + 1] * filter[i];
			work[i] = re;
			work[i + 1] = im;
		}
		this.fft.inverseTransform(transformed, work);
		const { roots, size } = this;
		const halfSize = size / 2;
		for (let k = 0; k < this.bins; k++) {
			// W^(start·k) from the table (start·k is an exact integer below 2^53), times W^(k²/2).
			let r = (start * k) % size;
			let sign = 1;
			if (r >= halfSize) {
				r -= halfSize;
				sign = -1;
			}
			const wr = sign * roots[2 * r];
			const wi = -sign * roots[2 * r + 1];
			const c = chirp[2 * k] * wr - chirp[2 * k + 1] * wi;
			const s = chirp[2 * k] * wi + chirp[2 * k + 1] * wr;
			const re = transformed[2 * k];
			const im = transformed[2 * k + 1];
			sum[2 * k] += re * c - im * s;
			sum[2 * k + 1] += re * s + im * c;
		}
	}
}
