import { describe, expect, it } from 'vitest';
import { blockLevels, CLIP_HOLD_S, levelVerdict, METER_FLOOR_DBFS, MeterState, NEAR_FULL_SCALE_DBFS, TOO_QUIET_PEAK_DBFS, verdictMessage } from '../../../src/lib/measure/levels';

const SR = 48_000;
const sine = (amplitude: number, n = 4800, f = 1000) => Float32Array.from({ length: n }, (_, i) => amplitude * Math.sin((2 * Math.PI * f * i) / SR));

describe('block levels (dBFS by AES17)', () => {
	it('reads a sine of amplitude A as 20·lg A for both peak and RMS', () => {
		// AES17: 0 dBFS is the RMS of a full-scale sine, so a sine's RMS level equals its peak level.
		const l = blockLevels(sine(0.5));
		expect(l.peakDbfs).toBeCloseTo(20 * Math.log10(0.5), 2);
		expect(l.rmsDbfs).toBeCloseTo(20 * Math.log10(0.5), 2);
		expect(l.clipRuns).toBe(0);
	});

	it('floors silence at the meter floor', () => {
		const l = blockLevels(new Float32Array(256));
		expect(l.peakDbfs).toBe(METER_FLOOR_DBFS);
		expect(l.rmsDbfs).toBe(METER_FLOOR_DBFS);
	});

	it('counts clipping by the engine rule: three samples in a row at full scale, not two', () => {
		const two = new Float32Array(100);
		two[10] = two[11] = 1;
		expect(blockLevels(two).clipRuns).toBe(0);
		const three = new Float32Array(100);
		three[10] = three[11] = three[12] = -1;
		expect(blockLevels(three).clipRuns).toBe(1);
	});
});

describe('the live meter', () => {
	it('keeps the clip lamp lit for CLIP_HOLD_S of input after a clip, then puts it out', () => {
		const m = new MeterState(SR);
		const clip = new Float32Array(480);
		clip.fill(1, 0, 5);
		m.push(clip);
		expect(m.clipping).toBe(true);
		const quiet = new Float32Array(480);
		const blocks = Math.floor((CLIP_HOLD_S * SR) / 480) - 2;
		for (let i = 0; i < blocks; i++) m.push(quiet);
		expect(m.clipping).toBe(true);
		for (let i = 0; i < 4; i++) m.push(quiet);
		expect(m.clipping).toBe(false);
	});

	it('holds the peak marker above a falling level, then lets it fall', () => {
		const m = new MeterState(SR);
		m.push(sine(0.5, 480));
		m.push(sine(0.05, 480));
		expect(m.peakDbfs).toBeCloseTo(-26, 0);
		expect(m.heldPeakDbfs).toBeCloseTo(-6, 0);
		for (let i = 0; i < 120; i++) m.push(sine(0.05, 480)); // 1.2 s
		expect(m.heldPeakDbfs).toBeCloseTo(-26, 0);
	});

	it('refuses a sample rate that is not positive', () => {
		expect(() => new MeterState(0)).toThrow(RangeError);
	});
});

describe('the level check verdict', () => {
	it.each([
		[{ peakDbfs: 0, clipRuns: 2 }, 'clipping'],
		[{ peakDbfs: -20, clipRuns: 1 }, 'clipping'],
		[{ peakDbfs: NEAR_FULL_SCALE_DBFS + 0.1, clipRuns: 0 }, 'near-full-scale'],
		[{ peakDbfs: NEAR_FULL_SCALE_DBFS, clipRuns: 0 }, 'good'],
		[{ peakDbfs: -12, clipRuns: 0 }, 'good'],
		[{ peakDbfs: TOO_QUIET_PEAK_DBFS, clipRuns: 0 }, 'good'],
		[{ peakDbfs: TOO_QUIET_PEAK_DBFS - 0.1, clipRuns: 0 }, 'too-quiet']
	] as const)('%o is %s', (figures, verdict) => {
		expect(levelVerdict(figures)).toBe(verdict);
		expect(verdictMessage(verdict).length).toBeGreaterThan(10);
	});
});
