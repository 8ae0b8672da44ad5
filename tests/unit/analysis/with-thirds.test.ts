import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyseRecording, analyseRecordingInOctavesAndThirds } from '../../../src/lib/analysis/analyse';
import { exponentialNoiseDecay } from '../../../src/lib/analysis/synthetic';
import { encodeWav } from '../../../src/lib/analysis/wav';
import { analyseRecordingWithThirds } from '../../../src/lib/analysis/with-thirds';

const fixture = (name: string) => new Uint8Array(readFileSync(fileURLToPath(new URL(`../../../fixtures/${name}`, import.meta.url))));

describe('analyseRecordingWithThirds: octaves and one-third octaves of one recording', () => {
	// Exponentially decaying white noise, T = 0.6 s (fixtures/README.md, channel 1 of the stereo fixture).
	const bytes = fixture('stereo-t0.3-t0.6-48k.wav');
	const both = analyseRecordingWithThirds(bytes, { channel: 1 });

	it('keeps the octave result, extra octaves included, as the octave analysis gives it', () => {
		const octaves = analyseRecording(bytes, { channel: 1, bands: 'octave', extraOctaves: true });
		expect(octaves.bands.map((b) => b.centerHz)).toEqual([31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000]);
		expect(both.bandKind).toBe('octave');
		expect(both.bands).toEqual(octaves.bands);
		expect(both.broadband).toEqual(octaves.broadband);
		expect(both.warnings).toEqual(octaves.warnings);
		expect(both.reflections).toEqual(octaves.reflections);
	});

	it('the thirds pass looks for no reflections (they do not depend on the bands), the octave result keeps them', () => {
		// A direct sound and one reflection at half its amplitude (−6 dB) 139 samples (2.9 ms) after it, over a decaying diffuse field.
		const ir = exponentialNoiseDecay({ t60S: 0.5, durationS: 1.5, sampleRate: 48000, onsetS: 0.004, noiseDbRePeak: -70, seed: 4 }).map((v) => 0.05 * v);
		ir[192] += 0.9;
		ir[192 + 139] += 0.5;
		const { octaves, thirds } = analyseRecordingInOctavesAndThirds(encodeWav(ir, 48000, '32f'));
		expect(octaves.reflections.length).toBeGreaterThan(0);
		expect(octaves.reflections[0].delayMs).toBeCloseTo((139 / 48000) * 1000, 1);
		expect(thirds.reflections).toEqual([]);
		expect(thirds.bands).toEqual(analyseRecording(encodeWav(ir, 48000, '32f'), { bands: 'third' }).bands);
	});

	it('adds the 24 one-third-octave bands 50 Hz – 10 kHz (IEC 61260-1, ISO 266 nominal)', () => {
		const thirds = both.thirdOctaveBands ?? [];
		expect(thirds.map((b) => b.centerHz)).toEqual(analyseRecording(bytes, { channel: 1, bands: 'third' }).bands.map((b) => b.centerHz));
		expect(thirds).toHaveLength(24);
		expect(thirds[0].centerHz).toBe(50);
		expect(thirds[23].centerHz).toBe(10000);
	});

	it('reads the known T = 0.5 s in the one-third octaves at the octave centres 125 Hz – 4 kHz within the 5 % JND (ISO 3382-1:2009 Annex A, from memory)', () => {
		// One decaying cosine at each exact octave centre, T = 0.5 s (fixtures/README.md): the third around each centre holds it.
		const decay = analyseRecordingWithThirds(fixture('decay-t0.5-48k.wav'));
		const centres = [125, 250, 500, 1000, 2000, 4000];
		const thirds = (decay.thirdOctaveBands ?? []).filter((b) => centres.includes(b.centerHz));
		expect(thirds).toHaveLength(centres.length);
		for (const band of thirds) expect(Math.abs((band.t30S ?? NaN) / 0.5 - 1), `${band.centerHz} Hz`).toBeLessThan(0.05);
	});
});
