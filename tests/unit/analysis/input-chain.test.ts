import { describe, expect, it } from 'vitest';
import { analyseImpulseResponse } from '../../../src/lib/analysis';
import { calibrateFromCalibrator } from '../../../src/lib/analysis/calibration';
import { bandLevelsDbfs, captureLevels } from '../../../src/lib/analysis/input-chain';
import { parseMicCorrection } from '../../../src/lib/analysis/mic-correction';

const FS = 48_000;

/**
 * Decaying tones A·e^(−t/τ)·sin(2πft) from t = 10 ms. Each one's energy is
 * E = ∫ A²e^(−2t/τ)sin²(ωt) dt = (A²/2)·(τ/2 − (2/τ)/((2/τ)² + 4ω²)) (a table integral,
 * Gradshteyn & Ryzhik 3.893 with sin² = (1 − cos 2ωt)/2). By Parseval's relation for the DFT
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, §8.6.4) a tone's N-point spectrum holds
 * Σ|X(k)|² = (N/2)·fs·E over its positive-frequency bins, so over a band of width B (B·N/fs bins)
 * around it the mean power is fs²·E/(2B): its band level is 10·lg(fs²·E/(2B)), in closed form.
 */
function decayingTones(tones: { f: number; a: number; tau: number }[], durationS = 1.5): Float64Array {
	const x = new Float64Array(Math.round(durationS * FS));
	const start = Math.round(0.01 * FS);
	for (const { f, a, tau } of tones) {
		for (let i = start; i < x.length; i++) {
			const t = (i - start) / FS;
			x[i] += a * Math.exp(-t / tau) * Math.sin(2 * Math.PI * f * t);
		}
	}
	return x;
}
const bandLevelDb = ({ f, a, tau }: { f: number; a: number; tau: number }) => {
	const w = 2 * Math.PI * f;
	const energy = ((a * a) / 2) * (tau / 2 - 2 / tau / ((2 / tau) ** 2 + 4 * w * w));
	// The octave the engine reports the tone in: exact mid-band frequency (IEC 61260-1), width
	// f_m·(√2 − 1/√2) of the 1/1-octave window the response is smoothed over.
	const exactHz = result.bands.find((b) => b.centerHz === f)!.exactHz;
	const bandwidthHz = exactHz * (Math.SQRT2 - 1 / Math.SQRT2);
	return 10 * Math.log10((FS * FS * energy) / (2 * bandwidthHz));
};

const TONES = [
	{ f: 250, a: 0.3, tau: 0.12 },
	{ f: 1000, a: 0.5, tau: 0.1 }
];
const result = analyseImpulseResponse(decayingTones(TONES), FS, { bands: 'octave' });
const level = (bands: { centerHz: number; levelDb: number | null }[], hz: number) => bands.find((b) => b.centerHz === hz)!.levelDb!;

/** A calibrator recording from formulas: 0.5 s of silence, 4 s of 1 kHz at amplitude A, 0.5 s of silence. */
function calibratorTone(amplitude: number): Float64Array {
	const x = new Float64Array(5 * FS);
	for (let i = FS / 2; i < 4.5 * FS; i++) x[i] = amplitude * Math.sin((2 * Math.PI * 1000 * i) / FS);
	return x;
}

describe('band levels of an analysis', () => {
	it('read each octave band of decaying tones at the closed-form band level within 0.1 dB', () => {
		const bands = bandLevelsDbfs(result);
		for (const tone of TONES) expect(level(bands, tone.f)).toBeCloseTo(bandLevelDb(tone), 1);
		// Between the tones there is (almost) nothing: far below both.
		expect(level(bands, 4000)).toBeLessThan(bandLevelDb(TONES[1]) - 40);
	});

	it('without a chain are relative, unshifted, and labelled so', () => {
		const levels = captureLevels(result, null);
		expect(levels.calibrated).toBe(false);
		expect(levels.axisLabel).toBe('dB (relative)');
		expect(levels.offsetDb).toBeNull();
		expect(levels.responseShiftDb.every((v) => v === 0)).toBe(true);
		expect(levels.responseShiftDb.length).toBe(result.curves.frequencyResponse.freqHz.length);
		expect(level(levels.bands, 1000)).toBeCloseTo(level(bandLevelsDbfs(result), 1000), 1);
	});
});

describe('levels through a calibrated chain', () => {
	// A 94 dB calibrator (IEC 60942: 94 dB SPL = 1 Pa) read at amplitude 0.05, i.e. −26.02 dBFS
	// (AES17: a sine of amplitude A reads 20·lg A dBFS): dB SPL = dBFS + 120.02.
	const amplitude = 0.05;
	const calibration = calibrateFromCalibrator(calibratorTone(amplitude), FS, 94);
	const expectedOffset = 94 - 20 * Math.log10(amplitude);

	it('shift every band by the calibration offset: the 1 kHz tone reads its closed-form level in dB SPL within 0.1 dB', () => {
		expect(calibration.offsetDb).toBeCloseTo(expectedOffset, 1);
		const levels = captureLevels(result, { id: 1, offsetDb: calibration.offsetDb, statedLevelDbSpl: 94, correction: null });
		expect(levels.calibrated).toBe(true);
		expect(levels.axisLabel).toBe('dB SPL');
		for (const tone of TONES) expect(level(levels.bands, tone.f)).toBeCloseTo(bandLevelDb(tone) + expectedOffset, 1);
		expect(levels.responseShiftDb.every((v) => Math.abs(v - calibration.offsetDb) < 0.01)).toBe(true);
	});

	it('take the microphone deviation out at each band (log-frequency interpolation), or add a correction', () => {
		// A microphone 1 dB hot at 500 Hz rising to 3 dB at 2 kHz: 2 dB at 1 kHz (halfway in log frequency).
		const file = parseMicCorrection('* test microphone\n500 1.0\n2000 3.0\n');
		const chain = { id: 1, offsetDb: 100, statedLevelDbSpl: 94, correction: { filename: 'mic.txt', points: file.points, sense: 'deviation' as const } };
		const plain = captureLevels(result, { ...chain, correction: null });
		const deviation = captureLevels(result, chain);
		expect(level(deviation.bands, 1000) - level(plain.bands, 1000)).toBeCloseTo(-2, 1);
		// Below the file's range the correction is its first value, flat.
		expect(level(deviation.bands, 250) - level(plain.bands, 250)).toBeCloseTo(-1, 1);
		const added = captureLevels(result, { ...chain, correction: { ...chain.correction, sense: 'correction' } });
		expect(level(added.bands, 1000) - level(plain.bands, 1000)).toBeCloseTo(2, 1);
		expect(deviation.correction).toEqual({ filename: 'mic.txt', sense: 'deviation', lowHz: 500, highHz: 2000 });
		const grid = result.curves.frequencyResponse.freqHz;
		const i = grid.findIndex((f) => f >= 1000);
		expect(deviation.responseShiftDb[i]).toBeCloseTo(100 - 1 - 2 * Math.log2(grid[i] / 500) / 2, 1);
	});

	it('refuses an offset that is not a number', () => {
		expect(() => captureLevels(result, { id: 1, offsetDb: Number.NaN, statedLevelDbSpl: 94, correction: null })).toThrow(RangeError);
	});
});
