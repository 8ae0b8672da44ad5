// Synthetic impulse responses for the demo room, made from formulas: the direct sound, the six
// first-order image-source reflections, a diffuse tail per octave band decaying with that band's
// reverberation time, a few lightly damped axial modes, and a background-noise floor.
// Invented but physically plausible where the analysis looks: the diffuse field is there from the
// first milliseconds, as in a real small room, so its own random peaks compete with the
// reflections; the direct sound and the reflections fall off as 1/r while the diffuse field does
// not, so a nearer position hears a stronger direct sound and positions differ in level.
// For the demo only — never used as a check value.
import {
	designButterworthBandpass,
	filterForwardInPlace,
	firstOrderImages,
	speedOfSound,
	type Point3,
	type RoomBox
} from '../../src/lib/analysis';
import { createSeededGaussian } from '../../src/lib/analysis/synthetic';
import { treatedT60S, UNTREATED_T60_S } from './plan';

export interface Condition {
	/** Reverberation time per octave band 63 … 8000 Hz, seconds. */
	t60S: number[];
	/** Pressure reflection factor of each surface for the early reflections. */
	reflection: Record<'floor' | 'ceiling' | 'front' | 'back' | 'left' | 'right', number>;
	/** Decay time of the axial modes below 100 Hz, seconds. */
	modeT60S: number;
}

export const OCTAVES_HZ = [63, 125, 250, 500, 1000, 2000, 4000, 8000];

/** Distance at which the direct sound has amplitude 1 before the output gain. */
const REFERENCE_DISTANCE_M = 1;
const OUTPUT_GAIN = 0.5;

export const UNTREATED: Condition = {
	t60S: UNTREATED_T60_S,
	reflection: { floor: 0.8, ceiling: 0.85, front: 0.8, back: 0.85, left: 0.9, right: 0.9 },
	modeT60S: 1.1
};

/** After treatment: the demo plan's prediction as installed (scripts/demo/plan.ts). */
export const TREATED: Condition = {
	t60S: treatedT60S(),
	reflection: { floor: 0.75, ceiling: 0.5, front: 0.7, back: 0.35, left: 0.3, right: 0.3 },
	// The traps tame the modes, but below their tuning they still ring longer than the tail.
	modeT60S: 0.65
};

export function synthesiseResponse(room: RoomBox, source: Point3, mic: Point3, condition: Condition, seed: number, sampleRate = 48_000, lengthS = 1.8): Float64Array {
	const n = Math.round(lengthS * sampleRate);
	const ir = new Float64Array(n);
	const c = speedOfSound(20);
	const directM = Math.hypot(source.x - mic.x, source.y - mic.y, source.z - mic.z);
	const lead = 0.005; // a little silence before the direct sound
	const at = (delayS: number) => Math.round((lead + delayS) * sampleRate);

	// Direct sound and first-order reflections, as short Hann pulses (band-limited impulses), 1/r re 1 m.
	const pulse = (index: number, amplitude: number) => {
		const half = 3;
		for (let i = -half; i <= half; i++) {
			const w = 0.5 * (1 + Math.cos((Math.PI * i) / (half + 1)));
			if (index + i >= 0 && index + i < n) ir[index + i] += amplitude * w;
		}
	};
	pulse(at(directM / c), REFERENCE_DISTANCE_M / directM);
	for (const image of firstOrderImages(room, source, mic, 20)) {
		pulse(at(image.pathM / c), (condition.reflection[image.surface] * REFERENCE_DISTANCE_M) / image.pathM);
	}

	// Diffuse tail: octave bands of noise, each with its own exponential decay, from the direct
	// sound on. The reflections' density grows as t² (Kuttruff, Room Acoustics; from memory), so the
	// diffuse power rises as t² until the mixing time, about √V ms (V in m³; Lindau, Kosanke &
	// Weinzierl, JAES 60(11), 2012; from memory).
	const gauss = createSeededGaussian(seed);
	const tailStart = at(directM / c);
	const mixingS = Math.sqrt(room.lengthM * room.widthM * room.heightM) / 1000;
	const tailLevel = 0.08;
	OCTAVES_HZ.forEach((fc, b) => {
		const band = new Float64Array(n);
		for (let i = tailStart; i < n; i++) band[i] = gauss();
		filterForwardInPlace(designButterworthBandpass(2, fc / Math.SQRT2, Math.min(fc * Math.SQRT2, sampleRate * 0.45), sampleRate), band);
		const k = (3 * Math.LN10) / condition.t60S[b]; // amplitude decay: 60 dB in T
		for (let i = tailStart; i < n; i++) {
			const t = (i - tailStart) / sampleRate;
			const rise = Math.min(1, t / mixingS);
			ir[i] += tailLevel * rise * Math.exp(-k * t) * band[i];
		}
	});

	// Axial modes below 100 Hz ring longer than the rest of the low end. Each builds up over one
	// round trip between its walls (2d/c), as the reflections that make it add in phase.
	const kMode = (3 * Math.LN10) / condition.modeT60S;
	const dims = [room.lengthM, room.widthM, room.heightM];
	const phase = createSeededGaussian(seed + 1);
	for (const d of dims) {
		const buildUpS = (2 * d) / c;
		for (let order = 1; (order * c) / (2 * d) < 100; order++) {
			const f = (order * c) / (2 * d);
			const p0 = phase() * Math.PI;
			for (let i = tailStart; i < n; i++) {
				const t = (i - tailStart) / sampleRate;
				ir[i] += 0.018 * Math.min(1, t / buildUpS) * Math.exp(-kMode * t) * Math.sin(2 * Math.PI * f * t + p0);
			}
		}
	}

	// Background noise about 70 dB below the direct sound's peak at 3 m.
	const noise = createSeededGaussian(seed + 2);
	for (let i = 0; i < n; i++) ir[i] += 1e-4 * noise();

	// One gain for every position (a real capture keeps its level): about −3 dBFS for a source 0.7 m away.
	for (let i = 0; i < n; i++) ir[i] *= OUTPUT_GAIN;
	return ir;
}
