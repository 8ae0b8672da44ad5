/**
 * The cases pinned by fixtures-golden.test.ts: every fixture, the recorded sweep deconvolved with
 * its reference, both band kinds, and one seeded 96 kHz response (the engine's own generator), so
 * speed work on the engine can be checked to change no result.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyseImpulseResponse, analyseRecording } from '../../../../src/lib/analysis/analyse';
import { exponentialNoiseDecay } from '../../../../src/lib/analysis/synthetic';
import type { AnalysisResult } from '../../../../src/lib/analysis/types';
import { decodeWav } from '../../../../src/lib/analysis/wav';

const fixture = (name: string) => readFileSync(fileURLToPath(new URL(`../../../../fixtures/${name}`, import.meta.url)));

export interface GoldenCase {
	name: string;
	run: () => AnalysisResult;
}

const kinds = ['octave', 'third'] as const;

export const GOLDEN_CASES: GoldenCase[] = [
	...kinds.flatMap((bands) => [
		{ name: `living_room_1 ${bands}`, run: () => analyseRecording(fixture('living_room_1.wav'), { bands }) },
		{ name: `decay-t0.5-48k ${bands}`, run: () => analyseRecording(fixture('decay-t0.5-48k.wav'), { bands }) },
		{ name: `stereo channel 0 ${bands}`, run: () => analyseRecording(fixture('stereo-t0.3-t0.6-48k.wav'), { bands, channel: 0 }) },
		{ name: `stereo channel 1 ${bands}`, run: () => analyseRecording(fixture('stereo-t0.3-t0.6-48k.wav'), { bands, channel: 1 }) },
		{
			name: `sweep-recorded-48k with reference ${bands}`,
			run: () => {
				const played = decodeWav(fixture('sweep-1s-48k.wav'));
				return analyseRecording(fixture('sweep-recorded-48k.wav'), { bands, reference: played.samples, referenceSampleRate: played.sampleRate });
			}
		},
		{
			name: `seeded 2 s 96 kHz ${bands}`,
			run: () => {
				const ir = exponentialNoiseDecay({ t60S: 0.7, durationS: 2, sampleRate: 96000, onsetS: 0.004, noiseDbRePeak: -70, seed: 13 }).map((v) => 0.3 * v);
				ir[384] += 0.9;
				return analyseImpulseResponse(ir, 96000, { bands, room: { lengthM: 6, widthM: 4.5, heightM: 2.7, source: { x: 1.5, y: 1.2, z: 1.2 }, mic: { x: 4, y: 3, z: 1.2 } } });
			}
		}
	])
];
