import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
	AnalyticSignalPlan,
	ENERGY_FLOOR_DB,
	analyticEnvelope,
	analyticSignal,
	energyTimeCurveDb
} from '../../../src/lib/analysis/envelope';

const SYSTEM_PYTHON = '/usr/bin/python3';
const HILBERT_HELPER = fileURLToPath(new URL('../../reference/hilbert.py', import.meta.url));
const scipyAvailable =
	existsSync(SYSTEM_PYTHON) && spawnSync(SYSTEM_PYTHON, ['-c', 'import scipy.signal'], { encoding: 'utf8' }).status === 0;

function scipyHilbert(x: Float64Array, n: number): { re: number[]; im: number[] } {
	const run = spawnSync(SYSTEM_PYTHON, [HILBERT_HELPER], {
		input: JSON.stringify({ x: Array.from(x), n }),
		encoding: 'utf8',
		maxBuffer: 64 * 1024 * 1024
	});
	if (run.status !== 0) throw new Error(`hilbert.py failed: ${run.stderr}`);
	return JSON.parse(run.stdout);
}

/** Deterministic pseudo-random samples in [−1, 1) (LCG, Numerical Recipes constants). */
function noise(length: number, seed: number): Float64Array {
	const x = new Float64Array(length);
	let state = seed >>> 0;
	for (let i = 0; i < length; i++) {
		state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
		x[i] = state / 2 ** 31 - 1;
	}
	return x;
}

describe('analyticEnvelope: exact cases on periodic signals', () => {
	// For a tone on an FFT bin the discrete analytic signal is exactly A·e^(jωn), and for an
	// amplitude-modulated tone a(n)·cos(ωn) with a's spectrum below ω it is a(n)·e^(jωn)
	// (Bedrosian's product theorem, Proc. IEEE 51:868, 1963, exact for periodic sequences).
	// Tolerance 1e-9: FFT round-off on 4096 points is ~1e-13.
	const n = 4096;
	const cases = [
		{ name: 'pure tone, bin 100', amplitude: 0.8, bin: 100, depth: 0, modBin: 0 },
		{ name: 'pure tone, bin 1500', amplitude: 2.5, bin: 1500, depth: 0, modBin: 0 },
		{ name: 'AM tone, 50 % at bin 7', amplitude: 1, bin: 400, depth: 0.5, modBin: 7 },
		{ name: 'AM tone, 90 % at bin 31', amplitude: 0.3, bin: 900, depth: 0.9, modBin: 31 }
	];
	it.each(cases)('$name: envelope = A·(1 + m·cos Ωn)', ({ amplitude, bin, depth, modBin }) => {
		const x = new Float64Array(n);
		const expected = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			expected[i] = amplitude * (1 + depth * Math.cos((2 * Math.PI * modBin * i) / n));
			x[i] = expected[i] * Math.cos((2 * Math.PI * bin * i) / n);
		}
		const envelope = analyticEnvelope(x);
		for (let i = 0; i < n; i++) expect(envelope[i]).toBeCloseTo(expected[i], 9);
	});

	it('negative case: the envelope is not |x| (a tone crosses zero, its envelope does not)', () => {
		const x = new Float64Array(n);
		for (let i = 0; i < n; i++) x[i] = Math.cos((2 * Math.PI * 64 * i) / n);
		const envelope = analyticEnvelope(x);
		expect(Math.abs(x[16])).toBeLessThan(1e-9); // quarter period: cos = 0
		expect(envelope[16]).toBeCloseTo(1, 9);
	});
});

describe('analyticEnvelope: decaying tone A·e^(−t/τ)·cos(2πft)', () => {
	// Analytic result: envelope A·e^(−t/τ) (Bedrosian's theorem). The one-sided onset puts some
	// of the envelope's spectrum above f, so the identity is approximate: the deviation decays
	// roughly as A/(π·n) from the onset (≈ 0.07 % of A at 10 ms, 48 kHz; scipy shows the same).
	// Compared from 10 ms to 3τ (tone still ≥ −26 dB) with 0.5 % relative tolerance; a wrong
	// spectral weighting (e.g. positive frequencies not doubled) is off by a factor ~2.
	const sampleRate = 48000;
	const n = 65536;
	const cases = [
		{ amplitude: 0.7, freqHz: 1000, tauS: 0.02 },
		{ amplitude: 1.3, freqHz: 2000, tauS: 0.05 },
		{ amplitude: 0.05, freqHz: 4000, tauS: 0.05 },
		{ amplitude: 3, freqHz: 500, tauS: 0.1 }
	];
	it.each(cases)('A = $amplitude, f = $freqHz Hz, τ = $tauS s', ({ amplitude, freqHz, tauS }) => {
		const x = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			const t = i / sampleRate;
			x[i] = amplitude * Math.exp(-t / tauS) * Math.cos(2 * Math.PI * freqHz * t);
		}
		const envelope = analyticEnvelope(x);
		// Step 7 samples: visits every phase of the tone, not only its crests.
		for (let i = Math.round(0.01 * sampleRate); i <= Math.round(3 * tauS * sampleRate); i += 7) {
			const expected = amplitude * Math.exp(-i / sampleRate / tauS);
			expect(Math.abs(envelope[i] / expected - 1)).toBeLessThan(5e-3);
		}
	});
});

describe.skipIf(!scipyAvailable)('analyticSignal against scipy.signal.hilbert', () => {
	// Independent implementation: scipy.signal.hilbert (FFT method, Marple 1999) with the same
	// zero-padded length. Tolerance 1e-9 absolute on samples of magnitude ≤ 1: both are
	// double-precision FFTs of ≤ 4096 points (round-off ~1e-13).
	const cases = [
		{ name: 'noise, 1000 samples (padded to 1024)', x: noise(1000, 1) },
		{ name: 'noise, 4096 samples (no padding)', x: noise(4096, 2) },
		{ name: 'five samples (padded to 8)', x: Float64Array.from([0.5, -1, 0.25, 0.75, -0.1]) },
		{ name: 'a single impulse in 300 zeros', x: Float64Array.from({ length: 300 }, (_, i) => (i === 37 ? 1 : 0)) }
	];
	it.each(cases)('$name', ({ x }) => {
		const fftSize = new AnalyticSignalPlan(x.length).fftSize;
		const reference = scipyHilbert(x, fftSize);
		const { re, im } = analyticSignal(x);
		expect(re.length).toBe(x.length);
		for (let i = 0; i < x.length; i++) {
			expect(Math.abs(re[i] - reference.re[i])).toBeLessThan(1e-9);
			expect(Math.abs(im[i] - reference.im[i])).toBeLessThan(1e-9);
		}
	});
});

describe('energyTimeCurveDb', () => {
	it('is 0 dB at its maximum and falls 20·lg(e)/τ dB per second on an exponential envelope', () => {
		// Envelope A·e^(−t/τ) gives 10·lg(e²) = −(20/ln 10)·t/τ dB (analytic). Levels at 10…90 ms
		// re the level at 10 ms, 0.1 dB tolerance: twice the 0.5 % envelope accuracy above (0.043 dB).
		const sampleRate = 48000;
		const tauS = 0.03;
		const n = 16384;
		const x = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			const t = i / sampleRate;
			x[i] = Math.exp(-t / tauS) * Math.cos(2 * Math.PI * 3000 * t);
		}
		const curve = energyTimeCurveDb(x);
		expect(Math.max(...curve)).toBe(0);
		const start = Math.round(0.01 * sampleRate);
		for (const i of [start + 5, 1201, 2403, 3111, 4321]) {
			const expectedDrop = (-20 / Math.LN10) * ((i - start) / sampleRate / tauS);
			expect(Math.abs(curve[i] - curve[start] - expectedDrop)).toBeLessThan(0.1);
		}
	});

	it('floors silent samples at the stated floor instead of −Infinity', () => {
		const x = new Float64Array(64);
		expect(Array.from(energyTimeCurveDb(x)).every((v) => v === ENERGY_FLOOR_DB)).toBe(true);
		x[0] = 1;
		// Envelope of a unit impulse on 64 points: the imaginary part is zero at even offsets,
		// so |analytic| is exactly 0 at even samples ≥ 2 (real part 0 off the impulse).
		const curve = energyTimeCurveDb(x);
		expect(curve[0]).toBe(0);
		expect(curve[2]).toBe(ENERGY_FLOOR_DB);
		expect(curve[1]).toBeGreaterThan(ENERGY_FLOOR_DB);
	});

	it.each([
		{ name: 'empty', x: new Float64Array(0), message: /empty/ },
		{ name: 'NaN sample', x: Float64Array.from([0, Number.NaN, 1]), message: /sample 1 is not a finite number/ },
		{ name: 'infinite sample', x: Float64Array.from([Infinity]), message: /sample 0/ }
	])('rejects bad input: $name', ({ x, message }) => {
		expect(() => energyTimeCurveDb(x)).toThrow(message);
	});
});
