// Recordings of a room made from formulas, for the browser measurement: the test signal played
// several times back to back through a synthetic impulse response (a direct sound and an
// exponentially decaying diffuse tail of known T), with steady background noise, as a microphone
// would hear it.
import { convolve, createSeededGaussian, exponentialNoiseDecay } from '../../src/lib/analysis/synthetic';

export interface SyntheticRoom {
	/** Reverberation time of the diffuse tail, s (every band: the tail is white). */
	t60S: number;
	/** The direct sound's delay after the start of the response, s. */
	directS: number;
	/** The tail's level re the direct sound's peak at its start, dB. */
	tailDb: number;
	lengthS: number;
	seed: number;
}

/** A direct sound (a unit sample) followed by an exponentially decaying white-noise tail. */
export function syntheticImpulseResponse(room: SyntheticRoom, sampleRate: number): Float64Array {
	const ir = exponentialNoiseDecay({ t60S: room.t60S, durationS: room.lengthS, sampleRate, onsetS: room.directS, seed: room.seed });
	const tail = 10 ** (room.tailDb / 20);
	for (let i = 0; i < ir.length; i++) ir[i] *= tail;
	ir[Math.round(room.directS * sampleRate)] += 1;
	return ir;
}

export interface RepeatedRecording {
	/** What the microphone records. */
	samples: Float64Array;
	/** Index of the first repetition's start (its signal's sample 0 in the recording's time). */
	firstStart: number;
	/** One period of the recording without noise, from the first repetition's start. */
	cleanPeriod: Float64Array;
}

/**
 * `repetitions` copies of `signal` back to back after `leadInS` of background, through `ir`,
 * scaled by `gain`, with Gaussian background noise of RMS `noiseRms` everywhere, and `tailS`
 * after the last repetition.
 */
export function repeatedRecording(options: {
	signal: Float64Array;
	ir: Float64Array;
	sampleRate: number;
	repetitions: number;
	leadInS: number;
	tailS: number;
	gain: number;
	noiseRms: number;
	seed: number;
}): RepeatedRecording {
	const { signal, ir, sampleRate, repetitions, gain } = options;
	const firstStart = Math.round(options.leadInS * sampleRate);
	const period = signal.length;
	const total = firstStart + repetitions * period + Math.round(options.tailS * sampleRate);
	const excitation = new Float64Array(repetitions * period);
	for (let k = 0; k < repetitions; k++) excitation.set(signal, k * period);
	const wet = convolve(excitation, ir);
	const samples = new Float64Array(total);
	for (let i = 0; i < wet.length && firstStart + i < total; i++) samples[firstStart + i] = gain * wet[i];
	// The clean period of a repetition that follows another: its own response and the previous one's tail.
	const cleanPeriod = samples.slice(firstStart + (repetitions > 1 ? period : 0), firstStart + (repetitions > 1 ? 2 * period : period));
	const gauss = createSeededGaussian(options.seed);
	for (let i = 0; i < total; i++) samples[i] += options.noiseRms * gauss();
	return { samples, firstStart, cleanPeriod };
}
