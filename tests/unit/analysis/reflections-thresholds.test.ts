// The two levels a peak must reach to count as a reflection, each tested at, just below and just
// above: at or above thresholdDb re the direct sound, and at least marginDb above the local
// diffuse level. Both are the detector's documented rules (product rules, common practice, no
// source); what is checked is that each holds at its edge.
import { describe, expect, it } from 'vitest';
import { detectReflections } from '../../../src/lib/analysis/reflections';
import { exponentialNoiseDecay } from '../../../src/lib/analysis/synthetic';

const SAMPLE_RATE = 48000;
const DIRECT = 1000;

describe('thresholdDb: a peak at or above it is kept', () => {
	// A direct sound and one copy 150 samples later, 12 dB down, in silence: no diffuse field, so
	// only the threshold decides. Its level as found is the value the threshold is set to.
	const ir = new Float64Array(6000);
	ir[DIRECT] = 1;
	ir[DIRECT + 150] = 10 ** (-12 / 20);
	const [copy] = detectReflections(ir, SAMPLE_RATE, DIRECT, { thresholdDb: -30 });

	it('the copy is found at about −12 dB (±0.5 dB: the envelope of a sampled impulse)', () => {
		expect(Math.abs(copy.levelDb + 12)).toBeLessThan(0.5);
	});

	it.each([
		{ offsetDb: 0, kept: true, case: 'exactly at the threshold' },
		{ offsetDb: -1e-9, kept: true, case: 'just above the threshold' },
		{ offsetDb: 1e-9, kept: false, case: 'just below the threshold' }
	])('a peak $case: kept $kept', ({ offsetDb, kept }) => {
		const found = detectReflections(ir, SAMPLE_RATE, DIRECT, { thresholdDb: copy.levelDb + offsetDb });
		expect(found.map((r) => r.delayMs)).toEqual(kept ? [copy.delayMs] : []);
	});
});

describe('marginDb: a peak must stand at least this far above the local diffuse level', () => {
	// A −6 dB reflection 5 ms after a unit direct sound, inside a diffuse tail 30 dB down (Gaussian
	// noise under an exponential envelope: Polack, Applied Acoustics 38, 1993, from memory).
	const tail = exponentialNoiseDecay({ t60S: 0.5, durationS: 0.2, sampleRate: SAMPLE_RATE, onsetS: (DIRECT + 24) / SAMPLE_RATE, seed: 7 });
	const ir = tail.map((v) => v * 10 ** (-30 / 20));
	ir[DIRECT] += 1;
	ir[DIRECT + 240] += 10 ** (-6 / 20);
	const strong = detectReflections(ir, SAMPLE_RATE, DIRECT, { marginDb: 10 }).find((r) => Math.abs(r.delayMs - 5) < 0.05)!;

	it('the reflection is found, well clear of the diffuse field (over 15 dB above it)', () => {
		expect(strong).toBeDefined();
		expect(strong.aboveDiffuseDb!).toBeGreaterThan(15);
	});

	it.each([
		{ offsetDb: -1e-6, kept: true, case: 'a margin just under its height' },
		{ offsetDb: 1e-6, kept: false, case: 'a margin just over its height' }
	])('$case: kept $kept', ({ offsetDb, kept }) => {
		const found = detectReflections(ir, SAMPLE_RATE, DIRECT, { marginDb: strong.aboveDiffuseDb! + offsetDb });
		expect(found.some((r) => r.delayMs === strong.delayMs)).toBe(kept);
	});
});
