import { describe, expect, it } from 'vitest';
import { generateExponentialSweep, harmonicLeadS } from '../../../src/lib/analysis/sweep';
import { runReference } from './helpers/python-reference';

const base = { f1Hz: 20, f2Hz: 20000, durationS: 1, sampleRate: 48000, fadeInS: 0, fadeOutS: 0, amplitude: 1 };

describe('exponential sine sweep (Farina, AES 108th Convention, preprint 5093, 2000)', () => {
	it.each([
		{ f1Hz: 20, f2Hz: 20000, durationS: 1, sampleRate: 48000 },
		{ f1Hz: 50, f2Hz: 5000, durationS: 0.5, sampleRate: 44100 },
		{ f1Hz: 10, f2Hz: 48000, durationS: 0.25, sampleRate: 96000 }
	])(
		'equals scipy.signal.chirp(method="logarithmic", phi=−90) without fades: $f1Hz–$f2Hz Hz, $durationS s at $sampleRate Hz',
		({ f1Hz, f2Hz, durationS, sampleRate }) => {
			const sweep = generateExponentialSweep({ ...base, f1Hz, f2Hz, durationS, sampleRate });
			const reference = runReference<{ samples: number[] }>('sweep.py', { f1Hz, f2Hz, durationS, sampleRate }).samples;
			expect(sweep.samples).toHaveLength(reference.length);
			// The two agree to about 4e-11 (measured against scipy); the phase reaches ~1e4 rad, so round-off of ~1e-12·phase is expected.
			let worst = 0;
			for (let i = 0; i < reference.length; i++) worst = Math.max(worst, Math.abs(sweep.samples[i] - reference[i]));
			expect(worst).toBeLessThan(1e-9);
		}
	);

	it('half-Hann fades: 0 at the ends, half amplitude mid-fade, full amplitude × the formula between', () => {
		const options = { ...base, fadeInS: 0.1, fadeOutS: 0.05, amplitude: 0.5 };
		const faded = generateExponentialSweep(options).samples;
		const plain = generateExponentialSweep({ ...options, fadeInS: 0, fadeOutS: 0 }).samples;
		expect(faded[0]).toBe(0);
		expect(faded[faded.length - 1]).toBeCloseTo(0, 12);
		const midFadeIn = 2400; // half of 0.1 s at 48 kHz: w = 0.5·(1 − cos(π/2)) = 0.5
		expect(faded[midFadeIn]).toBeCloseTo(0.5 * plain[midFadeIn], 12);
		for (let i = 4800; i < 48000 - 2400; i += 101) expect(faded[i]).toBe(plain[i]);
		expect(Math.max(...plain.map(Math.abs))).toBeLessThanOrEqual(0.5);
	});

	it('silence after the sweep is appended as zeros', () => {
		const sweep = generateExponentialSweep({ ...base, silenceS: 0.25 });
		expect(sweep.samples).toHaveLength(48000 + 12000);
		expect(sweep.sweepSamples).toBe(48000);
		expect(sweep.samples.subarray(48000).every((v) => v === 0)).toBe(true);
	});

	it.each([
		{ order: 2, expected: 1.0034 },
		{ order: 3, expected: 1.5904 },
		{ order: 5, expected: 2.3299 }
	])('harmonic $order leads by Δt = T·ln N / ln(f2/f1) = $expected s for T = 10 s, 20 Hz–20 kHz (Farina, AES 108th Convention, preprint 5093, 2000; computed from its formula)', ({ order, expected }) => {
		// Given to 4 decimals.
		expect(Math.abs(harmonicLeadS(order, 20, 20000, 10) - expected)).toBeLessThan(5e-5);
	});

	it.each([
		{ change: { f2Hz: 30000 }, why: 'f2 above Nyquist' },
		{ change: { f2Hz: 10 }, why: 'f2 below f1' },
		{ change: { amplitude: 1.5 }, why: 'amplitude above full scale' },
		{ change: { amplitude: 0 }, why: 'zero amplitude' },
		{ change: { fadeInS: 0.7, fadeOutS: 0.5 }, why: 'fades longer than the sweep' },
		{ change: { durationS: -1 }, why: 'negative duration' },
		{ change: { silenceS: -0.1 }, why: 'negative silence' }
	])('rejects $why', ({ change }) => {
		expect(() => generateExponentialSweep({ ...base, ...change })).toThrow(RangeError);
	});

	it('rejects a harmonic order below 2', () => {
		expect(() => harmonicLeadS(1, 20, 20000, 10)).toThrow(RangeError);
	});
});
