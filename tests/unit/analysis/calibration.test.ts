import { describe, expect, it } from 'vitest';
import {
	applyCalibration,
	calibrateFromCalibrator,
	dbSplFromDbfs,
	dbSplFromRms,
	dbfsFromRms,
	isCalibrationError,
	rmsFromDbfs,
	type CalibrationProblem
} from '../../../src/lib/analysis/calibration';
import { createSeededGaussian } from '../../../src/lib/analysis/synthetic';

interface ToneOptions {
	sampleRate?: number;
	frequencyHz?: number;
	amplitude?: number;
	/** Silence (background noise only) before and after the tone. */
	beforeS?: number;
	toneS?: number;
	afterS?: number;
	/** RMS of the Gaussian background, full-scale units. */
	noiseRms?: number;
	/** Amplitude of a 50 Hz hum added throughout. */
	humAmplitude?: number;
	/** Level change in dB at time t within the tone. */
	levelDb?: (t: number) => number;
	/** Hard limit of the converter (±1) or of an analogue stage before it. */
	clipAt?: number;
}

/** A calibrator recording: background, a tone switched on with 10 ms ramps, background. */
function calibratorRecording(options: ToneOptions = {}): Float32Array {
	const fs = options.sampleRate ?? 48_000;
	const f = options.frequencyHz ?? 1000;
	const a = options.amplitude ?? 0.1;
	const before = options.beforeS ?? 0.5;
	const tone = options.toneS ?? 4;
	const after = options.afterS ?? 0.5;
	const noise = createSeededGaussian(7);
	const n = Math.round((before + tone + after) * fs);
	const out = new Float32Array(n);
	const ramp = 0.01;
	for (let i = 0; i < n; i++) {
		const t = i / fs;
		const inTone = t - before;
		let x = 0;
		if (inTone >= 0 && inTone < tone) {
			const envelope = Math.min(1, inTone / ramp, (tone - inTone) / ramp);
			const gain = 10 ** ((options.levelDb?.(inTone) ?? 0) / 20);
			x = a * gain * envelope * Math.sin(2 * Math.PI * f * t);
		}
		x += (options.noiseRms ?? 1e-4) * noise() + (options.humAmplitude ?? 0) * Math.sin(2 * Math.PI * 50 * t);
		const limit = options.clipAt ?? 1;
		out[i] = Math.max(-limit, Math.min(limit, x));
	}
	return out;
}

function problemOf(run: () => unknown): { code: CalibrationProblem; message: string } {
	try {
		run();
	} catch (error) {
		if (isCalibrationError(error)) return { code: error.code, message: error.message };
		throw error;
	}
	throw new Error('expected a calibration error');
}

describe('dBFS convention (AES17: 0 dBFS is the RMS of a sine whose peak just reaches full scale)', () => {
	it.each([
		{ what: 'full-scale sine', rms: Math.SQRT1_2, dbfs: 0 },
		{ what: 'full-scale square wave (AES17: +3.01 dBFS)', rms: 1, dbfs: 20 * Math.log10(Math.SQRT2) },
		{ what: 'sine of amplitude 0.1 → 20·lg(0.1)', rms: 0.1 / Math.SQRT2, dbfs: -20 }
	])('$what', ({ rms, dbfs }) => {
		// Round-off only.
		expect(dbfsFromRms(rms)).toBeCloseTo(dbfs, 12);
		expect(rmsFromDbfs(dbfs)).toBeCloseTo(rms, 12);
	});

	it('refuses a negative or non-finite RMS', () => {
		expect(() => dbfsFromRms(-1)).toThrow(RangeError);
		expect(() => dbfsFromRms(Number.NaN)).toThrow(RangeError);
	});
});

describe('calibrateFromCalibrator: round trip through a known tone', () => {
	// A 1 kHz sine of amplitude A reads 20·lg(A) dBFS (AES17); a calibrator stated at L dB SPL
	// (IEC 60942: 94 dB = 1 Pa, 114 dB = 10 Pa) gives offset L − 20·lg(A). Tolerance 0.1 dB as
	// asked of the calibration; the tone is long and clean, so the estimate is far closer.
	it.each([
		{ sampleRate: 48_000, amplitude: 0.1, stated: 94 },
		{ sampleRate: 44_100, amplitude: 0.5, stated: 114 },
		{ sampleRate: 96_000, amplitude: 0.02, stated: 94 }
	])('$amplitude full scale at $sampleRate Hz, calibrator $stated dB SPL', ({ sampleRate, amplitude, stated }) => {
		const result = calibrateFromCalibrator(calibratorRecording({ sampleRate, amplitude }), sampleRate, stated);
		const expectedDbfs = 20 * Math.log10(amplitude);
		expect(Math.abs(result.toneDbfs - expectedDbfs)).toBeLessThan(0.1);
		expect(Math.abs(result.offsetDb - (stated - expectedDbfs))).toBeLessThan(0.1);
		expect(Math.abs(dbSplFromDbfs(result.toneDbfs, result) - stated)).toBeLessThan(1e-9);
		// Another tone through the same chain, 12 dB lower: its SPL is 12 dB below the calibrator's.
		const quieter = (amplitude * 10 ** (-12 / 20)) / Math.SQRT2;
		expect(Math.abs(dbSplFromRms(quieter, result) - (stated - 12))).toBeLessThan(0.1);
		expect(result.statedLevelDbSpl).toBe(stated);
		expect(result.sampleRate).toBe(sampleRate);
	});

	it('uses the steady part only: the switching on and off and the background are left out', () => {
		const result = calibrateFromCalibrator(calibratorRecording({ beforeS: 1, toneS: 3, afterS: 1 }), 48_000, 94);
		// The tone runs 1…4 s; the steady part lies inside it, at least the 1 s minimum long.
		expect(result.steady.startS).toBeGreaterThanOrEqual(1);
		expect(result.steady.endS).toBeLessThanOrEqual(4);
		expect(result.steady.durationS).toBeGreaterThanOrEqual(2.5);
		expect(result.levelSpreadDb).toBeLessThan(0.05);
	});

	it('reads the tone in its band: 50 Hz hum 20 dB below the tone raises the broadband level, not the tone level', () => {
		// Tone 0.1 (−20 dBFS), hum 0.01 (−40 dBFS): broadband 10·lg(1 + 0.01) = 0.043 dB above the tone.
		// Tolerance 0.01 dB: the band filter passes 1 kHz at 0 dB and takes 50 Hz down by far more than 40 dB.
		const result = calibrateFromCalibrator(calibratorRecording({ humAmplitude: 0.01 }), 48_000, 94);
		expect(Math.abs(result.toneDbfs - -20)).toBeLessThan(0.01);
		expect(Math.abs(result.broadbandDbfs - result.toneDbfs - 10 * Math.log10(1.01))).toBeLessThan(0.01);
		expect(result.bandEnergyFraction).toBeCloseTo(1 / 1.01, 2);
	});

	it('accepts a tone slightly off 1 kHz (a calibrator within its tolerance) and measures its frequency', () => {
		const result = calibrateFromCalibrator(calibratorRecording({ frequencyHz: 1012 }), 48_000, 94);
		expect(Math.abs(result.toneFrequencyHz - 1012)).toBeLessThan(0.5);
		expect(Math.abs(result.toneDbfs - -20)).toBeLessThan(0.1);
	});

	it('keeps the background: a tone in noise 40 dB below it reads within 0.1 dB', () => {
		const result = calibrateFromCalibrator(calibratorRecording({ noiseRms: 0.001 }), 48_000, 94);
		expect(Math.abs(result.toneDbfs - -20)).toBeLessThan(0.1);
	});
});

describe('calibrateFromCalibrator: refusals name the problem', () => {
	it('a tone clipped at full scale', () => {
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ amplitude: 1.5 }), 48_000, 94));
		expect(problem.code).toBe('clipped');
		expect(problem.message).toMatch(/clips/);
	});

	it('a tone clipped before the converter (flattened peaks below full scale)', () => {
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ amplitude: 0.5, clipAt: 0.45 }), 48_000, 94));
		expect(problem.code).toBe('clipped');
		expect(problem.message).toMatch(/crest factor/);
	});

	it('a tone too short: 0.5 s of tone in a 2.5 s recording', () => {
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ beforeS: 1, toneS: 0.5, afterS: 1 }), 48_000, 94));
		expect(problem).toEqual({ code: 'too_short', message: expect.stringMatching(/^the tone lasts 0\.5 s/) });
	});

	it('a recording too short: 0.8 s in all', () => {
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ beforeS: 0, toneS: 0.8, afterS: 0 }), 48_000, 94));
		expect(problem).toEqual({ code: 'too_short', message: expect.stringMatching(/^the recording lasts 0\.8 s/) });
	});

	it('a 500 Hz tone is not a 1 kHz calibrator, and the message names the band it is in', () => {
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ frequencyHz: 500 }), 48_000, 94));
		expect(problem.code).toBe('not_1khz_tone');
		expect(problem.message).toMatch(/strongest band is 500 Hz/);
	});

	it('a tone buried in hum 6 dB below it: not clean, and the message names the hum band', () => {
		// Band share about 1/(1 + 0.25) = 80 %, under the 90 % asked.
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ humAmplitude: 0.05 }), 48_000, 94));
		expect(problem.code).toBe('not_1khz_tone');
		expect(problem.message).toMatch(/noise or hum besides it, most at 50 Hz/);
	});

	it('a level that wanders by ±1.5 dB', () => {
		const problem = problemOf(() =>
			calibrateFromCalibrator(calibratorRecording({ levelDb: (t) => 1.5 * Math.sin(2 * Math.PI * 0.5 * t) }), 48_000, 94)
		);
		expect(problem.code).toBe('unstable_level');
		expect(problem.message).toMatch(/wanders over 3\.0 dB/);
	});

	it('a level that drifts 2 dB across the tone', () => {
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ levelDb: (t) => t / 2 }), 48_000, 94));
		expect(problem.code).toBe('unstable_level');
	});

	it('a silent recording', () => {
		expect(problemOf(() => calibrateFromCalibrator(new Float32Array(48_000 * 3), 48_000, 94)).code).toBe('silent');
	});

	it.each([
		{ what: 'a stated level in pascals, not dB', stated: 1, sampleRate: 48_000, pattern: /stated level/ },
		{ what: 'a sample rate below 44.1 kHz', stated: 94, sampleRate: 8000, pattern: /sample rate/ }
	])('bad input: $what', ({ stated, sampleRate, pattern }) => {
		const problem = problemOf(() => calibrateFromCalibrator(calibratorRecording({ sampleRate: 48_000 }), sampleRate, stated));
		expect(problem.code).toBe('invalid_input');
		expect(problem.message).toMatch(pattern);
	});

	it('bad input: a non-finite sample', () => {
		const samples = calibratorRecording();
		samples[100] = Number.NaN;
		expect(problemOf(() => calibrateFromCalibrator(samples, 48_000, 94)).message).toMatch(/sample 100/);
	});
});

describe('applyCalibration: dBFS → dB SPL with the chain offset', () => {
	it('adds the offset and keeps unmeasured bands null', () => {
		expect(applyCalibration([-20, null, -35.5], { offsetDb: 114 })).toEqual([94, null, 78.5]);
		expect(applyCalibration([-20], { offsetDb: 100 })).toEqual([80]);
	});

	it('refuses a non-finite offset', () => {
		expect(() => applyCalibration([-20], { offsetDb: Number.NaN })).toThrow(RangeError);
	});
});
