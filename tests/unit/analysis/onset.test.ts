import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from '../../../src/lib/analysis/errors';
import { findDirectSoundPeak, findImpulseStart } from '../../../src/lib/analysis/onset';
import { createSeededGaussian } from '../../../src/lib/analysis/synthetic';

const SAMPLE_RATE = 48000;

function impulseWithNoise(at: number, noiseDb: number, length = 4800): Float64Array {
	const gaussian = createSeededGaussian(at);
	const sigma = 10 ** (noiseDb / 20);
	const x = new Float64Array(length).map(() => sigma * gaussian());
	x[at] = 1;
	return x;
}

describe('start point (ISO 3382-1:2009, Annex A.3.4: first sample within 20 dB of the squared maximum)', () => {
	it.each([17, 480, 2345])('an impulse at %i after low noise (−70 dB) is found to the sample', (at) => {
		expect(findImpulseStart(impulseWithNoise(at, -70))).toBe(at);
	});

	it.each([
		{ preEchoDb: -25, expected: 1234, why: 'more than 20 dB down: not the start' },
		{ preEchoDb: -21, expected: 1234, why: 'just below the threshold' },
		{ preEchoDb: -19, expected: 1000, why: 'just above the threshold' },
		{ preEchoDb: -15, expected: 1000, why: 'within 20 dB: this is the start' }
	])('a pre-echo at $preEchoDb dB: $why', ({ preEchoDb, expected }) => {
		const x = impulseWithNoise(1234, -80);
		x[1000] = 10 ** (preEchoDb / 20);
		expect(findImpulseStart(x)).toBe(expected);
	});

	it('a rising direct sound starts before its peak, and the peak is found after the start', () => {
		// Hann-shaped pulse peaking at 2000: its square crosses −20 dB where cos²-shape reaches 0.1.
		const x = new Float64Array(4800);
		const half = 24;
		for (let k = -half; k <= half; k++) x[2000 + k] = 0.5 * (1 + Math.cos((Math.PI * k) / half));
		const start = findImpulseStart(x);
		// 0.5(1 + cos(πk/24)) ≥ 10^(−20/20) = 0.1 ⇔ |k| ≤ 24·acos(−0.8)/π = 19.9
		expect(start).toBe(2000 - 19);
		expect(findDirectSoundPeak(x, start, SAMPLE_RATE)).toBe(2000);
	});

	it.each([
		{ signal: new Float64Array(0), code: 'no_samples' },
		{ signal: new Float64Array(100), code: 'silent_signal' }
	])('rejects an input with code $code', ({ signal, code }) => {
		expect(() => findImpulseStart(signal)).toThrow(AnalysisInputError);
		try {
			findImpulseStart(signal);
		} catch (error) {
			expect((error as AnalysisInputError).code).toBe(code);
		}
	});
});
