import { describe, expect, it } from 'vitest';
import {
	dbTickStep,
	linearTicks,
	niceStep,
	octaveLabelStride,
	octaveTickLabels,
	octaveTicks,
	paddedRange
} from '../../../src/lib/charts/ticks';

describe('octaveTicks', () => {
	it('gives the ISO 266 nominal octave frequencies across the audio range', () => {
		// ISO 266 nominal octave mid-band frequencies (ISO 266:1997 preferred frequencies: every third entry of the one-third-octave list).
		expect(octaveTicks(20, 20000)).toEqual([31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000]);
	});

	it('keeps only the ticks inside the range, with the ends included', () => {
		expect(octaveTicks(63, 1000)).toEqual([63, 125, 250, 500, 1000]);
		expect(octaveTicks(70, 240)).toEqual([125]);
		expect(octaveTicks(300, 400)).toEqual([]);
	});

	it('rejects an empty or negative range', () => {
		expect(() => octaveTicks(0, 100)).toThrow(RangeError);
		expect(() => octaveTicks(100, 100)).toThrow(RangeError);
	});
});

describe('octave label thinning', () => {
	const strides = [
		{ pxPerOctave: 40, labelPx: 40, stride: 1 },
		{ pxPerOctave: 30, labelPx: 40, stride: 2 },
		{ pxPerOctave: 14, labelPx: 40, stride: 3 },
		{ pxPerOctave: 100, labelPx: 40, stride: 1 }
	];
	it.each(strides)('$pxPerOctave px per octave, $labelPx px labels → every $stride', ({ pxPerOctave, labelPx, stride }) => {
		expect(octaveLabelStride(pxPerOctave, labelPx)).toBe(stride);
	});

	it('keeps 1 kHz labelled and blanks the skipped octaves', () => {
		const ticks = [31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000];
		expect(octaveTickLabels(ticks, 1)).toEqual(['31.5', '63', '125', '250', '500', '1k', '2k', '4k', '8k', '16k']);
		expect(octaveTickLabels(ticks, 2)).toEqual(['', '63', '', '250', '', '1k', '', '4k', '', '16k']);
		expect(octaveTickLabels(ticks, 3)).toEqual(['', '', '125', '', '', '1k', '', '', '8k', '']);
		expect(() => octaveTickLabels(ticks, 0)).toThrow(RangeError);
	});
});

describe('niceStep (1-2-5 series, Heckbert, Graphics Gems 1990)', () => {
	// Worked by hand: span / maxTicks, rounded up to the next 1, 2 or 5 times a power of ten.
	const cases = [
		{ span: 60, maxTicks: 6, step: 10 }, // exactly 10
		{ span: 45, maxTicks: 5, step: 10 }, // 9 → 10
		{ span: 1, maxTicks: 5, step: 0.2 },
		{ span: 7, maxTicks: 7, step: 1 },
		{ span: 13, maxTicks: 3, step: 5 }, // 4.33 → 5
		{ span: 130, maxTicks: 4, step: 50 }, // 32.5 → 50
		{ span: 0.03, maxTicks: 2, step: 0.02 } // 0.015 → 0.02
	];
	it.each(cases)('span $span in at most $maxTicks steps → $step', ({ span, maxTicks, step }) => {
		expect(niceStep(span, maxTicks)).toBeCloseTo(step, 12);
	});

	it('always returns the smallest 1-2-5 step that keeps within maxTicks', () => {
		const series = (k: number) => [1, 2, 5].map((m) => m * 10 ** k);
		const steps = [-6, -5, -4, -3, -2, -1, 0, 1, 2, 3, 4].flatMap(series).sort((a, b) => a - b);
		for (let i = 0; i < 500; i++) {
			const span = 10 ** (Math.sin(i * 12.9898) * 3 + 1); // spread over 0.01 … 10 000
			const maxTicks = 1 + (i % 12);
			const step = niceStep(span, maxTicks);
			const at = steps.findIndex((s) => Math.abs(s - step) <= s * 1e-12);
			expect(at, `step ${step} for span ${span}`).toBeGreaterThan(0);
			expect(span / step).toBeLessThanOrEqual(maxTicks * (1 + 1e-9));
			expect(span / steps[at - 1]).toBeGreaterThan(maxTicks);
		}
	});

	it('rejects an empty span or no ticks', () => {
		expect(() => niceStep(0, 5)).toThrow(RangeError);
		expect(() => niceStep(10, 0)).toThrow(RangeError);
	});
});

describe('dbTickStep', () => {
	it('uses whole decibels and keeps ticks apart on small plots', () => {
		expect(dbTickStep(60, 300, 28)).toBe(10); // 10 ticks fit → 60/10 = 6 → 10
		expect(dbTickStep(60, 100, 28)).toBe(20); // 3 fit → 20
		expect(dbTickStep(3, 400, 28)).toBe(1); // would be 0.2; decibel axes stay whole
		expect(() => dbTickStep(60, 0)).toThrow(RangeError);
	});
});

describe('linearTicks and paddedRange', () => {
	it('lists the multiples of the step inside the range, ends included', () => {
		expect(linearTicks(-63, 4, 10)).toEqual([-60, -50, -40, -30, -20, -10, 0]);
		expect(linearTicks(-60, 0, 20)).toEqual([-60, -40, -20, 0]);
		// 0.1 steps without binary noise (0.30000000000000004 would be a poor label)
		expect(linearTicks(0, 0.5, 0.1)).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5]);
		expect(() => linearTicks(1, 0, 1)).toThrow(RangeError);
	});

	it('widens a range outwards to whole steps', () => {
		expect(paddedRange(-57.3, 3.1, 10)).toEqual([-60, 10]);
		expect(paddedRange(-20, 0, 10)).toEqual([-20, 0]);
		expect(paddedRange(-10, -10, 5)).toEqual([-15, -5]); // a flat range still gets height
		expect(() => paddedRange(Number.NaN, 0, 10)).toThrow(RangeError);
	});
});
