import { describe, expect, it } from 'vitest';
import {
	POWER_FLOOR_DB,
	SMOOTHING_FRACTIONS,
	frequencyResponse,
	logSpacedCurve,
	smoothFractionalOctave
} from '../../../src/lib/analysis/response';

const SAMPLE_RATE = 48000;

function impulseAt(length: number, index: number, amplitude = 1): Float64Array {
	const ir = new Float64Array(length);
	ir[index] = amplitude;
	return ir;
}

/** Uniform grid 0, df, 2·df, … (n points), as an FFT of a real signal gives. */
function uniformGrid(n: number, df: number): Float64Array {
	return Float64Array.from({ length: n }, (_, k) => k * df);
}

describe('frequencyResponse', () => {
	// |DFT of δ[n − d]|² = 1 for every bin (closed form), so 0 dB; 1e-9 dB for round-off.
	it.each([
		{ name: 'impulse at 0', ir: impulseAt(1000, 0), startIndex: undefined },
		{ name: 'impulse at 40, analysed from 0', ir: impulseAt(1000, 40), startIndex: undefined },
		{ name: 'impulse at 300, analysed from 300', ir: impulseAt(4096, 300), startIndex: 300 }
	])('unit impulse is flat 0 dB: $name', ({ ir, startIndex }) => {
		const { freqHz, powerDb } = frequencyResponse(ir, SAMPLE_RATE, { startIndex });
		expect(freqHz.length).toBe(powerDb.length);
		expect(freqHz[freqHz.length - 1]).toBeCloseTo(SAMPLE_RATE / 2, 9);
		for (const level of powerDb) expect(Math.abs(level)).toBeLessThan(1e-9);
	});

	// h = [1, a]: |H(ω)|² = |1 + a·e^(−jω)|² = 1 + a² + 2a·cos ω, ω = 2πf/fs (closed form).
	// 1e-9 dB tolerance (double round-off) wherever the closed form is above −200 dB.
	it.each([{ a: 0.5 }, { a: -0.9 }, { a: 1 }, { a: 2 }])('two-tap FIR [1, $a] matches 1 + a² + 2a·cos ω', ({ a }) => {
		const ir = new Float64Array(1000);
		ir[0] = 1;
		ir[1] = a;
		const { freqHz, powerDb } = frequencyResponse(ir, SAMPLE_RATE);
		expect(freqHz.length).toBe(1024 / 2 + 1); // zero-padded to the next power of two
		freqHz.forEach((f, k) => {
			const omega = (2 * Math.PI * f) / SAMPLE_RATE;
			const power = 1 + a * a + 2 * a * Math.cos(omega);
			if (power > 1e-20) expect(Math.abs(powerDb[k] - 10 * Math.log10(power))).toBeLessThan(1e-9);
			else expect(powerDb[k]).toBeLessThan(-200); // a = 1 has a zero at Nyquist
		});
	});

	it('analyses only up to 1 s by default and windowS when given', () => {
		const late = impulseAt(2 * 8000, 12000); // at 1.5 s, fs = 8 kHz
		expect(Math.max(...frequencyResponse(late, 8000).powerDb)).toBe(POWER_FLOOR_DB);
		const included = frequencyResponse(late, 8000, { windowS: 1.9 }).powerDb;
		expect(Math.abs(included[10])).toBeLessThan(1e-9);
		const fromStart = frequencyResponse(late, 8000, { startIndex: 11000 }).powerDb;
		expect(Math.abs(fromStart[10])).toBeLessThan(1e-9);
	});

	it('fades the last 10 % of the window with the falling half of a Hann window', () => {
		// An impulse in the middle of the 100-sample fade of a 1000-sample window sits at the
		// Hann midpoint, gain 0.5 → −6.02 dB; ±0.2 dB covers the half-sample placement of the taper.
		const { powerDb } = frequencyResponse(impulseAt(1000, 949), SAMPLE_RATE);
		expect(Math.abs(powerDb[5] - 20 * Math.log10(0.5))).toBeLessThan(0.2);
		const beforeFade = frequencyResponse(impulseAt(1000, 899), SAMPLE_RATE).powerDb;
		expect(Math.abs(beforeFade[5])).toBeLessThan(1e-9);
	});

	it.each([
		{ name: 'empty', call: () => frequencyResponse(new Float64Array(0), SAMPLE_RATE), message: /empty/ },
		{ name: 'startIndex past the end', call: () => frequencyResponse(impulseAt(10, 0), SAMPLE_RATE, { startIndex: 10 }), message: /startIndex/ },
		{ name: 'negative window', call: () => frequencyResponse(impulseAt(10, 0), SAMPLE_RATE, { windowS: -1 }), message: /windowS/ },
		{ name: 'NaN sample', call: () => frequencyResponse(Float64Array.from([1, Number.NaN]), SAMPLE_RATE), message: /sample 1/ },
		{ name: 'FFT size not a power of two', call: () => frequencyResponse(impulseAt(10, 0), SAMPLE_RATE, { fftSize: 100 }), message: /power of two/ }
	])('rejects $name', ({ call, message }) => {
		expect(call).toThrow(message);
	});
});

describe('smoothFractionalOctave', () => {
	const grid = uniformGrid(24001, 1); // 0…24 kHz in 1 Hz bins

	it.each(SMOOTHING_FRACTIONS.map((fraction) => ({ fraction })))('a flat spectrum stays flat at 1/$fraction octave', ({ fraction }) => {
		// Mean of equal powers is that power (definition); 1e-9 dB round-off.
		const flat = new Float64Array(grid.length).fill(-17.5);
		for (const level of smoothFractionalOctave(grid, flat, fraction)) expect(Math.abs(level + 17.5)).toBeLessThan(1e-9);
	});

	// Power P(f) = f on a uniform grid: the band mean is the mean of an arithmetic series,
	// (first + last bin)/2 with first = ⌈f·2^(−1/2b)⌉, last = ⌊f·2^(1/2b)⌋ (closed form). 1e-9 dB.
	it.each([
		{ fraction: 1 as const, freqHz: 1000 },
		{ fraction: 3 as const, freqHz: 250 },
		{ fraction: 12 as const, freqHz: 5000 },
		{ fraction: 24 as const, freqHz: 20000 }
	])('keeps the band power mean: P = f at $freqHz Hz, 1/$fraction octave', ({ fraction, freqHz }) => {
		const powerDb = grid.map((f) => (f > 0 ? 10 * Math.log10(f) : -300));
		const smoothed = smoothFractionalOctave(grid, powerDb, fraction);
		const first = Math.ceil(freqHz * 2 ** (-1 / (2 * fraction)));
		const last = Math.floor(freqHz * 2 ** (1 / (2 * fraction)));
		expect(Math.abs(smoothed[freqHz] - 10 * Math.log10((first + last) / 2))).toBeLessThan(1e-9);
	});

	// Pink spectrum P = 1/f: the continuous band mean is ln(r²)/(f·(r − 1/r)), r = 2^(1/2b),
	// i.e. 10·lg(2·ln r/(r − 1/r)) dB below the centre (closed form: −0.0865 dB for an octave).
	// The 1 Hz grid sums instead of integrating; that differs by < 1/(bins in the band) ≈ 0.002 dB,
	// hence 0.005 dB tolerance.
	it.each([
		{ fraction: 1 as const, freqHz: 1000 },
		{ fraction: 1 as const, freqHz: 4000 },
		{ fraction: 3 as const, freqHz: 10000 }
	])('pink spectrum at $freqHz Hz, 1/$fraction octave, sits at the closed-form offset', ({ fraction, freqHz }) => {
		const powerDb = grid.map((f) => (f > 0 ? -10 * Math.log10(f) : 0));
		const smoothed = smoothFractionalOctave(grid, powerDb, fraction);
		const r = 2 ** (1 / (2 * fraction));
		const offsetDb = 10 * Math.log10((2 * Math.log(r)) / (r - 1 / r));
		expect(Math.abs(smoothed[freqHz] - (powerDb[freqHz] + offsetDb))).toBeLessThan(0.005);
	});

	it('matches the band mean computed directly, also 250 dB below a loud band', () => {
		// Direct O(n²) evaluation of the definition in the test; values span 0 to −250 dB, where a
		// plain prefix sum would lose the quiet bins (1e-16 of the loud total). 1e-6 dB.
		const n = 4000;
		const freqHz = uniformGrid(n, 5);
		const powerDb = new Float64Array(n);
		let state = 12345;
		for (let k = 0; k < n; k++) {
			state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
			const jitter = (state / 2 ** 32) * 20;
			powerDb[k] = k < n / 2 ? -jitter : -230 - jitter;
		}
		for (const fraction of [1, 6] as const) {
			const smoothed = smoothFractionalOctave(freqHz, powerDb, fraction);
			const halfWidth = 2 ** (1 / (2 * fraction));
			for (const k of [1, 17, 500, 1999, 2600, 3100, 3999]) {
				let sum = 0;
				let count = 0;
				for (let j = 0; j < n; j++) {
					if (freqHz[j] >= freqHz[k] / halfWidth && freqHz[j] <= freqHz[k] * halfWidth) {
						sum += 10 ** (powerDb[j] / 10);
						count++;
					}
				}
				expect(Math.abs(smoothed[k] - 10 * Math.log10(sum / count))).toBeLessThan(1e-6);
			}
		}
	});

	it.each([
		{ name: 'unsupported fraction', call: () => smoothFractionalOctave(grid, new Float64Array(grid.length), 2 as 3), message: /fraction/ },
		{ name: 'length mismatch', call: () => smoothFractionalOctave(grid, new Float64Array(5), 3), message: /frequencies but/ },
		{ name: 'decreasing grid', call: () => smoothFractionalOctave(Float64Array.from([0, 2, 1]), new Float64Array(3), 3), message: /increasing/ },
		{ name: 'NaN level', call: () => smoothFractionalOctave(Float64Array.from([1, 2]), Float64Array.from([0, Number.NaN]), 3), message: /not a number/ }
	])('rejects $name', ({ call, message }) => {
		expect(call).toThrow(message);
	});
});

describe('logSpacedCurve', () => {
	const fftSize = 8192;
	const grid = uniformGrid(fftSize / 2 + 1, SAMPLE_RATE / fftSize);
	// A curve linear in log frequency, L = 3 − 4.5·log2(f/Hz) dB.
	const linearInLog = grid.map((f) => (f > 0 ? 3 - 4.5 * Math.log2(f) : 0));

	it.each([
		{ fMinHz: 100, fMaxHz: 1600, expectedCount: 4 * 48 + 1 }, // 4 octaves, both ends
		{ fMinHz: 20, fMaxHz: 20000, expectedCount: Math.floor(48 * Math.log2(1000)) + 1 },
		{ fMinHz: 1000, fMaxHz: 1e6, expectedCount: Math.floor(48 * Math.log2(24000 / 1000)) + 1 } // capped at Nyquist
	])('48 points per octave from $fMinHz to $fMaxHz Hz', ({ fMinHz, fMaxHz, expectedCount }) => {
		const curve = logSpacedCurve(grid, linearInLog, { fMinHz, fMaxHz });
		expect(curve.freqHz).toHaveLength(expectedCount);
		expect(curve.db).toHaveLength(expectedCount);
		// Grid f_k = fMin·2^(k/48) (definition); frequencies are rounded to 0.001 Hz.
		curve.freqHz.forEach((f, k) => expect(Math.abs(f - fMinHz * 2 ** (k / 48))).toBeLessThanOrEqual(0.0005 + 1e-9));
	});

	it('reproduces a curve that is linear in log frequency exactly (to the 0.01 dB rounding)', () => {
		const curve = logSpacedCurve(grid, linearInLog, { pointsPerOctave: 24, fMinHz: 25, fMaxHz: 12000 });
		expect(curve.freqHz).toHaveLength(Math.floor(24 * Math.log2(12000 / 25)) + 1);
		curve.freqHz.forEach((_, k) => {
			const f = 25 * 2 ** (k / 24);
			expect(Math.abs(curve.db[k] - (3 - 4.5 * Math.log2(f)))).toBeLessThanOrEqual(0.005 + 1e-9);
		});
	});

	it('negative case: a curve linear in frequency is not exact between bins', () => {
		// On a coarse grid (500 Hz bins) log interpolation of L = f/100 dB gives 7.5 dB at 707 Hz
		// (halfway between 5 and 10 dB on a log axis) instead of 7.07 dB: the exactness above is a
		// property of the log-linear input, not of the test.
		const coarse = uniformGrid(11, 500);
		const linear = coarse.map((f) => f / 100);
		const curve = logSpacedCurve(coarse, linear, { pointsPerOctave: 2, fMinHz: 500, fMaxHz: 2000 });
		expect(Math.abs(curve.db[1] - 7.07)).toBeGreaterThan(0.3);
	});

	it('raises fMin to the lowest positive bin', () => {
		const curve = logSpacedCurve(grid, linearInLog, { fMinHz: 1, fMaxHz: 100 });
		expect(curve.freqHz[0]).toBeCloseTo(SAMPLE_RATE / fftSize, 3);
	});

	it.each([
		{ name: 'fMin above fMax', options: { fMinHz: 200, fMaxHz: 100 }, message: /fMinHz < fMaxHz/ },
		{ name: 'zero points per octave', options: { pointsPerOctave: 0 }, message: /pointsPerOctave/ },
		{ name: 'range above the input', options: { fMinHz: 30000, fMaxHz: 40000 }, message: /outside/ }
	])('rejects $name', ({ options, message }) => {
		expect(() => logSpacedCurve(grid, linearInLog, options)).toThrow(message);
	});
});
