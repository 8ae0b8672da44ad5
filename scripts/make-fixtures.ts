/**
 * Writes the small WAV fixtures under fixtures/ from formulas (fixed seeds: the same bytes every
 * run). Usage: npx tsx scripts/make-fixtures.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analysisBands } from '../src/lib/analysis/bands';
import { generateExponentialSweep } from '../src/lib/analysis/sweep';
import { convolve, exponentialNoiseDecay, multiToneDecay } from '../src/lib/analysis/synthetic';
import { encodeWav } from '../src/lib/analysis/wav';

const SAMPLE_RATE = 48000;
const directory = fileURLToPath(new URL('../fixtures/', import.meta.url));

function write(name: string, channels: Float64Array | Float64Array[]): void {
	const bytes = encodeWav(channels, SAMPLE_RATE, 16);
	writeFileSync(directory + name, bytes);
	console.log(`${name}: ${(bytes.length / 1024).toFixed(0)} kB`);
}

function scaleToPeak(x: Float64Array, peak: number): Float64Array {
	let max = 0;
	for (const v of x) max = Math.max(max, Math.abs(v));
	return x.map((v) => (v * peak) / max);
}

// Octave-centre tones decaying with T = 0.5 s: every octave band and the broadband T is 0.5 s.
write(
	'decay-t0.5-48k.wav',
	scaleToPeak(
		multiToneDecay({
			t60S: 0.5,
			durationS: 1,
			sampleRate: SAMPLE_RATE,
			onsetS: 0.01,
			frequenciesHz: analysisBands('octave').map((band) => band.exactHz),
			noiseDbRePeak: -90,
			seed: 1
		}),
		0.8
	)
);

// Two channels with different decays, for choosing the channel: T = 0.3 s on channel 0, 0.6 s on channel 1.
write('stereo-t0.3-t0.6-48k.wav', [
	scaleToPeak(exponentialNoiseDecay({ t60S: 0.3, durationS: 0.8, sampleRate: SAMPLE_RATE, onsetS: 0.005, noiseDbRePeak: -80, seed: 2 }), 0.8),
	scaleToPeak(exponentialNoiseDecay({ t60S: 0.6, durationS: 0.8, sampleRate: SAMPLE_RATE, onsetS: 0.005, noiseDbRePeak: -80, seed: 3 }), 0.8)
]);

// The sweep as played, and its recording through a synthetic room (direct sound at 4 ms, a reflection
// 3 ms later at −6 dB, a T = 0.4 s diffuse decay 12 dB below the direct sound), 0.6 s recorded after it.
{
	const sweep = generateExponentialSweep({ f1Hz: 20, f2Hz: 20000, durationS: 1, sampleRate: SAMPLE_RATE, fadeInS: 0.05, fadeOutS: 0.01, amplitude: 0.5 });
	write('sweep-1s-48k.wav', sweep.samples);
	const room = exponentialNoiseDecay({ t60S: 0.4, durationS: 0.6, sampleRate: SAMPLE_RATE, onsetS: 0.004, seed: 4 }).map((v) => v * 10 ** (-12 / 20) * 0.05);
	room[192] += 1;
	room[192 + 144] += 0.5;
	const recorded = convolve(sweep.samples, room);
	write('sweep-recorded-48k.wav', scaleToPeak(recorded.slice(0, sweep.samples.length + Math.round(0.6 * SAMPLE_RATE)), 0.7));
}
