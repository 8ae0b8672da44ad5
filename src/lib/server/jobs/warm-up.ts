// A worker analyses two short synthetic recordings before it claims its first job — an impulse
// response and a recorded sweep, each as a capture is analysed (octaves with curves, then thirds)
// — so V8 has compiled the engine's hot code by then and the first real capture is analysed at
// the warm speed rather than at a first call's, which costs two to four times as much.
import { analyseRecordingWithThirds } from '../../analysis/with-thirds';
import { generateExponentialSweep } from '../../analysis/sweep';
import { convolve, exponentialNoiseDecay } from '../../analysis/synthetic';
import type { AnalysisResult } from '../../analysis/types';
import { encodeWav } from '../../analysis/wav';

const SAMPLE_RATE = 48_000;

export interface WarmUp {
	/** CPU time the warm-up took, all rounds. */
	cpuMs: number;
	/** The last analysis of each recording, so a caller can see the engine really ran. */
	impulse: AnalysisResult;
	sweep: AnalysisResult;
}

/** A room's response: an exponentially decaying noise (T = 0.5 s) after a direct sound. */
function room(durationS: number): Float64Array {
	const ir = exponentialNoiseDecay({ t60S: 0.5, durationS, sampleRate: SAMPLE_RATE, onsetS: 0.005, noiseDbRePeak: -70, seed: 7 }).map((v) => 0.1 * v);
	ir[Math.round(0.005 * SAMPLE_RATE)] += 0.8;
	return ir;
}

/** A 1 s sweep played through the room, recorded for 1.6 s: the convolution by one FFT. */
function recordedSweep(): { recording: Uint8Array; reference: Float64Array } {
	const sweep = generateExponentialSweep({ f1Hz: 40, f2Hz: 16_000, durationS: 1, sampleRate: SAMPLE_RATE, fadeInS: 0.05, fadeOutS: 0.01, amplitude: 0.5 });
	const response = room(0.6);
	const kept = convolve(sweep.samples, response, Math.round(1.6 * SAMPLE_RATE));
	let peak = 0;
	for (const value of kept) peak = Math.max(peak, Math.abs(value));
	// Half of full scale, far from clipping.
	return { recording: encodeWav(kept.map((value) => (0.5 * value) / peak), SAMPLE_RATE, 24), reference: sweep.samples };
}

/** Runs the engine `rounds` times on each recording (two calls get the hot loops optimised). */
export function warmUpEngine(rounds = 2): WarmUp {
	const started = process.cpuUsage();
	const impulseFile = encodeWav(room(1.5), SAMPLE_RATE, 24);
	const { recording, reference } = recordedSweep();
	let impulse: AnalysisResult | undefined;
	let sweep: AnalysisResult | undefined;
	for (let round = 0; round < rounds; round++) {
		impulse = analyseRecordingWithThirds(impulseFile);
		sweep = analyseRecordingWithThirds(recording, { reference });
	}
	const used = process.cpuUsage(started);
	return { cpuMs: (used.user + used.system) / 1000, impulse: impulse!, sweep: sweep! };
}
