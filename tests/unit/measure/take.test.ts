import { describe, expect, it } from 'vitest';
import { analyseRecording, deconvolveSweep, encodeWav, generateExponentialSweep } from '../../../src/lib/analysis';
import { dbfsFromRms } from '../../../src/lib/analysis/calibration';
import { createSeededGaussian } from '../../../src/lib/analysis/synthetic';
import { analyseTake, LEAD_S, MAX_DELAY_S, requiredLength, TakeError, takeRefusal, type TakePlan } from '../../../src/lib/measure/take';
import { repeatedRecording, syntheticImpulseResponse } from '../../helpers/room-recording';

const SR = 48_000;
const SWEEP = { f1Hz: 50, f2Hz: 16_000, durationS: 1 };
const SILENCE_S = 0.8;
const played = generateExponentialSweep({ ...SWEEP, sampleRate: SR, fadeInS: 0.02, fadeOutS: 0.02, amplitude: 0.5, silenceS: SILENCE_S });
const PERIOD = played.samples.length;
const LEAD = Math.round(LEAD_S * SR);
/** Output-to-input latency plus the sound's path, in samples (an arbitrary, not round, figure). */
const DELAY = 590;
const T60 = 0.3;
const room = syntheticImpulseResponse({ t60S: T60, directS: DELAY / SR, tailDb: -30, lengthS: 0.7, seed: 11 }, SR);
const NOISE_RMS = 1e-3;
/** Keeps the recording's peaks near −6 dBFS, as a level check would. */
const GAIN = 0.2;

function plan(repetitions: number, firstStart: number): TakePlan {
	return { sampleRate: SR, signal: played.samples, sweepSamples: played.sweepSamples, sweep: SWEEP, repetitions, firstStart };
}

function recording(repetitions: number, noiseRms = NOISE_RMS, seed = 5, ir = room) {
	return repeatedRecording({ signal: played.samples, ir, sampleRate: SR, repetitions, leadInS: 0.5, tailS: MAX_DELAY_S, gain: GAIN, noiseRms, seed });
}

describe('a take: timing from the deconvolution, then the average', () => {
	const rec = recording(3);
	const result = analyseTake(plan(3, rec.firstStart), { measured: rec.samples });

	it('finds each repetition where its direct sound arrived, to the sample', () => {
		// The synthetic room's largest sample is its direct sound, so the deconvolution peaks there.
		expect(result.arrivals).toEqual([0, 1, 2].map((k) => rec.firstStart + DELAY + k * PERIOD));
		expect(result.delayS).toBeCloseTo(DELAY / SR, 12);
		expect(result.driftSamples).toBe(0);
		expect(result.prominenceDb).toBeGreaterThan(30);
		expect(result.timedByLoopback).toBe(false);
	});

	it('cuts one period from LEAD_S before the arrival: the averaged sweep arrives at LEAD_S', () => {
		expect(result.average.length).toBe(PERIOD);
		const ir = deconvolveSweep(result.average, played.samples.subarray(0, played.sweepSamples), SR, SWEEP);
		expect(ir.peakLag).toBe(LEAD);
	});

	it('divides the noise power by the number of repetitions', () => {
		// The same room without noise gives the clean average; what is left over is the averaged noise.
		const clean = analyseTake(plan(3, rec.firstStart), { measured: recording(3, 0).samples }).average;
		let sum = 0;
		for (let i = 0; i < PERIOD; i++) sum += (result.average[i] - clean[i]) ** 2;
		const residualRms = Math.sqrt(sum / PERIOD);
		// Variance of a mean of N independent values is σ²/N (Bendat & Piersol, Random Data, §4.1 — from
		// memory); 86 400 samples estimate an RMS to ±0.3 % (1/√(2n)), so 3 % is a wide margin.
		expect(residualRms / (NOISE_RMS / Math.sqrt(3))).toBeGreaterThan(0.97);
		expect(residualRms / (NOISE_RMS / Math.sqrt(3))).toBeLessThan(1.03);
		// The page's figures: the noise of one repetition from the spread between them, and 10·lg 3 less in the average.
		expect(result.noise).not.toBeNull();
		expect(Math.abs(result.noise!.perRepetitionDbfs - dbfsFromRms(NOISE_RMS))).toBeLessThan(0.1);
		expect(result.noise!.perRepetitionDbfs - result.noise!.averagedDbfs).toBeCloseTo(10 * Math.log10(3), 9);
		expect(Math.abs(result.backgroundDbfs! - dbfsFromRms(NOISE_RMS))).toBeLessThan(0.2);
	});

	it('has no noise figure for one repetition, whose average is the repetition itself', () => {
		const one = recording(1);
		const single = analyseTake(plan(1, one.firstStart), { measured: one.samples });
		expect(single.noise).toBeNull();
		const start = one.firstStart + DELAY - LEAD;
		expect(Array.from(single.average.subarray(0, 2000))).toEqual(Array.from(one.samples.subarray(start, start + 2000)));
	});

	it('averages to a recording the engine analyses to the room’s T', () => {
		const wav = encodeWav(result.average, SR, '32f');
		const analysed = analyseRecording(wav, { reference: played.samples, sweep: SWEEP });
		// Within ISO 3382-1:2009's just noticeable difference for reverberation (Annex A, Table A.1: 5 %).
		expect(Math.abs(analysed.broadband.t20S! / T60 - 1)).toBeLessThan(0.05);
		expect(Math.abs(analysed.broadband.t30S! / T60 - 1)).toBeLessThan(0.05);
	});

	it('keeps the lag and the average when the input starts before the recording’s own idea of the first start', () => {
		// A fake or buffered input can deliver the arrival before the page sent the sweep: still found.
		const early = analyseTake(plan(3, rec.firstStart + 4000), { measured: rec.samples });
		expect(early.arrivals).toEqual(result.arrivals);
		expect(early.delayS).toBeCloseTo((DELAY - 4000) / SR, 12);
	});
});

describe('timing from a loopback channel', () => {
	it('keeps the sound’s path in the average: the direct sound arrives its time of flight after LEAD_S', () => {
		const flight = 240; // 5 ms, 1.7 m
		const mic = recording(2, NOISE_RMS, 6, syntheticImpulseResponse({ t60S: T60, directS: (DELAY + flight) / SR, tailDb: -30, lengthS: 0.7, seed: 12 }, SR));
		const wire = new Float64Array(PERIOD);
		wire[DELAY] = 1; // the output back into the input: latency only
		const loop = repeatedRecording({ signal: played.samples, ir: wire, sampleRate: SR, repetitions: 2, leadInS: 0.5, tailS: MAX_DELAY_S, gain: 1, noiseRms: 1e-5, seed: 7 });
		const r = analyseTake(plan(2, mic.firstStart), { measured: mic.samples, loopback: loop.samples.subarray(0, mic.samples.length) });
		expect(r.timedByLoopback).toBe(true);
		expect(r.arrivals).toEqual([mic.firstStart + DELAY, mic.firstStart + DELAY + PERIOD]);
		const ir = deconvolveSweep(r.average, played.samples.subarray(0, played.sweepSamples), SR, SWEEP);
		expect(ir.peakLag).toBe(LEAD + flight);
	});
});

describe('drift between repetitions', () => {
	it('follows a repetition that arrives later than one period after the one before', () => {
		const rec = recording(3, NOISE_RMS, 8);
		const late = 7;
		// Seven samples of background inserted in the silence after the first repetition's decay.
		const cut = rec.firstStart + PERIOD - 2000;
		const samples = new Float64Array(rec.samples.length + late);
		samples.set(rec.samples.subarray(0, cut));
		samples.set(rec.samples.subarray(cut), cut + late);
		const r = analyseTake(plan(3, rec.firstStart), { measured: samples });
		const a0 = rec.firstStart + DELAY;
		expect(r.arrivals).toEqual([a0, a0 + PERIOD + late, a0 + 2 * PERIOD + late]);
		expect(r.driftSamples).toBe(late);
	});
});

describe('refusals', () => {
	it('says the test signal was not heard when the input holds only noise', () => {
		const gauss = createSeededGaussian(3);
		const noise = Float64Array.from({ length: requiredLength(plan(2, 24_000)) }, () => 0.01 * gauss());
		expect(() => analyseTake(plan(2, 24_000), { measured: noise })).toThrow(expect.objectContaining({ code: 'not_heard' }));
		expect(() => analyseTake(plan(2, 24_000), { measured: new Float64Array(noise.length) })).toThrow(expect.objectContaining({ code: 'not_heard' }));
	});

	it('says the recording is short when the last repetition has not arrived', () => {
		const rec = recording(3);
		const short = rec.samples.subarray(0, rec.firstStart + DELAY + 2 * PERIOD + played.sweepSamples / 2);
		expect(() => analyseTake(plan(3, rec.firstStart), { measured: short })).toThrow(expect.objectContaining({ code: 'recording_short' }));
	});

	it('counts clipping in the repetitions and refuses such a take', () => {
		const rec = recording(2);
		const hot = rec.samples.map((v) => Math.max(-1, Math.min(1, 12 * v)));
		const clipped = analyseTake(plan(2, rec.firstStart), { measured: hot });
		expect(clipped.clipRuns).toBeGreaterThan(0);
		expect(clipped.peakDbfs).toBe(0);
		expect(takeRefusal(clipped)).toMatch(/clipped/);
		const fine = analyseTake(plan(2, rec.firstStart), { measured: rec.samples });
		expect(fine.clipRuns).toBe(0);
		expect(fine.peakDbfs).toBeLessThan(-3);
		expect(takeRefusal(fine)).toBeNull();
	});

	it('refuses a plan it cannot cut', () => {
		const rec = recording(1);
		expect(() => analyseTake(plan(0, rec.firstStart), { measured: rec.samples })).toThrow(TakeError);
		const noSilence = { ...plan(1, rec.firstStart), signal: played.samples.subarray(0, played.sweepSamples + 100) };
		expect(() => analyseTake(noSilence, { measured: rec.samples })).toThrow(/silence/);
	});
});
