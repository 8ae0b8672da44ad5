import { describe, expect, it } from 'vitest';
import { analyseImpulseResponse } from '../../../src/lib/analysis/analyse';
import { detectReflections } from '../../../src/lib/analysis/reflections';
import { exponentialNoiseDecay } from '../../../src/lib/analysis/synthetic';

const SAMPLE_RATE = 48000;
const ONSET = 480;

/**
 * A live room: a unit direct sound, then a diffuse field from the first half millisecond on —
 * Gaussian noise under an exponential envelope, the stochastic model of a reverberant tail
 * (Polack, Applied Acoustics 38, 1993; from memory) — of mean power `diffuseDb` re the direct
 * sound's. At −27 dB its squared envelope, exponentially distributed, tops −20 dB many times in
 * 50 ms (P(e² > 5·mean) = e⁻⁵ per independent value, some 2400 of them).
 */
function liveRoom(seed: number, diffuseDb = -27, t60S = 0.6): Float64Array {
	const scale = 10 ** (diffuseDb / 20);
	const tail = exponentialNoiseDecay({ t60S, durationS: 0.6, sampleRate: SAMPLE_RATE, onsetS: (ONSET + 24) / SAMPLE_RATE, seed });
	const ir = tail.map((v) => v * scale);
	ir[ONSET] += 1;
	return ir;
}

describe('reflections inside a live diffuse field', () => {
	// Discrete reflections of known delay and level, 18–24 dB above the diffuse field's mean power.
	const reflections = [
		{ delayMs: 2.5, levelDb: -3 },
		{ delayMs: 6.25, levelDb: -6 },
		{ delayMs: 11.5, levelDb: -9 }
	];
	it.each([11, 12, 13, 14, 15])('seed %i: exactly the three reflections, at their delays and levels', (seed) => {
		const ir = liveRoom(seed);
		for (const { delayMs, levelDb } of reflections) ir[ONSET + Math.round((delayMs * SAMPLE_RATE) / 1000)] += 10 ** (levelDb / 20);
		const found = detectReflections(ir, SAMPLE_RATE, ONSET);
		expect(found.map((r) => r.delayMs.toFixed(2))).toEqual(reflections.map((r) => r.delayMs.toFixed(2)));
		found.forEach((r, i) => {
			// The diffuse field's own pressure adds to the reflection's or takes from it: at −27 dB mean power
			// against a −9 dB reflection its RMS amplitude is 0.126 of it; 2.5 times that gives 20·lg(1.32) = 2.4 dB.
			expect(Math.abs(r.levelDb - reflections[i].levelDb), `${r.delayMs} ms`).toBeLessThan(2.4);
			expect(r.aboveDiffuseDb!).toBeGreaterThan(10);
		});
	});

	it('a diffuse field alone yields (almost) nothing: at most 10 false peaks in 100 responses', () => {
		// The margin is set for at most 0.05 diffuse peaks taken for reflections per response (exponential
		// squared envelope, see diffuseMarginDb); 0.1 allows for chance. The fixed −20 dB threshold alone
		// lets through dozens per response.
		let falsePeaks = 0;
		for (let seed = 100; seed < 200; seed++) falsePeaks += detectReflections(liveRoom(seed), SAMPLE_RATE, ONSET).length;
		expect(falsePeaks).toBeLessThanOrEqual(10);
	});

	it('the full analysis lists the three and nothing else', () => {
		const ir = liveRoom(21);
		for (const { delayMs, levelDb } of reflections) ir[ONSET + Math.round((delayMs * SAMPLE_RATE) / 1000)] += 10 ** (levelDb / 20);
		const result = analyseImpulseResponse(ir, SAMPLE_RATE);
		expect(result.reflections.map((r) => Math.round(r.delayMs * 4) / 4)).toEqual(reflections.map((r) => r.delayMs));
	});

	it('sparse reflections with no diffuse field around them are found as before (−26 dB kept at a −30 dB threshold)', () => {
		const ir = new Float64Array(6000);
		ir[1000] = 1;
		ir[1000 + 150] = 10 ** (-6 / 20);
		ir[1000 + 2000] = 10 ** (-26 / 20);
		const found = detectReflections(ir, SAMPLE_RATE, 1000, { thresholdDb: -30 });
		expect(found.map((r) => r.delayMs)).toEqual([(150 / SAMPLE_RATE) * 1000, (2000 / SAMPLE_RATE) * 1000]);
		expect(found.map((r) => Math.round(r.levelDb))).toEqual([-6, -26]);
	});
});
