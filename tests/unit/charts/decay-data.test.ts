import { describe, expect, it } from 'vitest';
import type { DecayCurve } from '../../../src/lib/analysis/types';
import {
	decayCurveKey,
	decayFitRows,
	decayLevelRange,
	decayPlotData,
	fitLevel,
	fitReverberationTime
} from '../../../src/lib/charts/decay-data';

/**
 * An ideal exponential decay of reverberation time T is a straight line of slope −60/T dB/s
 * (closed form of p² ∝ e^(−kt); Cabrera, Xun & Guski, Acoustics Australia 44:369, 2016). Its EDT range 0…−10 dB ends at T/6,
 * T20's −5…−25 dB spans T/12…5T/12 and T30's −5…−35 dB spans T/12…7T/12 (ISO 3382-1 ranges).
 */
function idealDecay(t60S: number, durationS: number, points: number): DecayCurve {
	const slope = -60 / t60S;
	const timesS = Array.from({ length: points }, (_, i) => (i * durationS) / (points - 1));
	const line = (startS: number, endS: number) => ({ startS, endS, interceptDb: 0, slopeDbPerS: slope });
	return {
		centerHz: 1000,
		timesS,
		levelDb: timesS.map((t) => slope * t),
		noiseDb: null,
		crosspointS: null,
		fits: { edt: line(0, t60S / 6), t20: line(t60S / 12, (5 * t60S) / 12), t30: line(t60S / 12, (7 * t60S) / 12) }
	};
}

describe('fitted lines', () => {
	it('turn a slope into a reverberation time, T = −60 / slope (ISO 3382-2:2008)', () => {
		const cases = [
			{ slopeDbPerS: -120, expected: 0.5 },
			{ slopeDbPerS: -60, expected: 1 },
			{ slopeDbPerS: -200, expected: 0.3 },
			{ slopeDbPerS: 0, expected: null }, // a flat line never falls 60 dB
			{ slopeDbPerS: 15, expected: null },
			{ slopeDbPerS: Number.NEGATIVE_INFINITY, expected: null }
		];
		for (const { slopeDbPerS, expected } of cases) {
			const t = fitReverberationTime({ startS: 0, endS: 1, interceptDb: 0, slopeDbPerS });
			if (expected === null) expect(t).toBeNull();
			else expect(t).toBeCloseTo(expected, 12); // exact division
		}
		expect(fitLevel({ startS: 0, endS: 1, interceptDb: -2, slopeDbPerS: -120 }, 0.25)).toBeCloseTo(-32, 12);
	});
});

describe('decayPlotData', () => {
	const curve = idealDecay(0.5, 1, 101); // points every 10 ms

	it('adds each fit end to the grid and draws each line only over its range', () => {
		const data = decayPlotData(curve);
		// Fit ends at T/12 = 41.67 ms, T/6 = 83.3 ms, 5T/12 = 208.3 ms and 7T/12 = 291.7 ms are not on the 10 ms grid.
		expect(data.x).toHaveLength(101 + 4);
		expect(data.fits.map((f) => f.label)).toEqual(['EDT', 'T20', 'T30']);
		const t30 = data.fits.find((f) => f.key === 't30')!;
		data.x.forEach((t, i) => {
			const inRange = t >= 0.5 / 12 && t <= (7 * 0.5) / 12;
			if (inRange) expect(t30.values[i]).toBeCloseTo(-120 * t, 9);
			else expect(t30.values[i]).toBeNull();
		});
		// The T30 line reaches −5 and −35 dB exactly at its ends.
		expect(t30.values[data.x.indexOf(0.5 / 12)]).toBeCloseTo(-5, 9);
		expect(t30.values[data.x.indexOf((7 * 0.5) / 12)]).toBeCloseTo(-35, 9);
		// The curve itself has no value at the added points (drawn across them).
		expect(data.curve[data.x.indexOf(0.5 / 6)]).toBeNull();
		expect(data.curve.filter((v) => v !== null)).toHaveLength(101);
	});

	it('leaves out fits the analysis could not make', () => {
		const partial: DecayCurve = { ...curve, fits: { edt: curve.fits.edt } };
		expect(decayPlotData(partial).fits.map((f) => f.key)).toEqual(['edt']);
		expect(decayFitRows(partial).map((r) => r.label)).toEqual(['EDT']);
	});

	it('rejects a curve whose arrays disagree or whose time runs backwards', () => {
		expect(() => decayPlotData({ ...curve, levelDb: [0] })).toThrow(/101 times and 1 levels/);
		expect(() => decayPlotData({ ...curve, timesS: [...curve.timesS].reverse() })).toThrow(/must increase/);
	});
});

describe('decayFitRows', () => {
	it('gives back T for an ideal decay from every fit (EDT = T20 = T30 = T)', () => {
		for (const t60 of [0.3, 0.5, 1, 2]) {
			const rows = decayFitRows(idealDecay(t60, 3, 301));
			expect(rows.map((r) => r.key)).toEqual(['edt', 't20', 't30']);
			for (const row of rows) expect(row.timeS).toBeCloseTo(t60, 12);
		}
	});
});

describe('decayLevelRange and decayCurveKey', () => {
	const base = idealDecay(0.5, 1, 11);
	it('reaches past the lowest level or the noise line, in 10 dB steps, at most 100 dB deep', () => {
		expect(decayLevelRange(base)).toEqual([-100, 5]); // the curve reaches −120 dB: clamped to −100
		expect(decayLevelRange({ ...base, levelDb: base.levelDb.map((v) => Math.max(v, -57)) })).toEqual([-60, 5]);
		expect(decayLevelRange({ ...base, levelDb: base.levelDb.map((v) => Math.max(v, -57)), noiseDb: -72 })).toEqual([-80, 5]);
	});

	it('keys curves by band', () => {
		expect(decayCurveKey({ centerHz: 125 })).toBe('125');
		expect(decayCurveKey({ centerHz: 'broadband' })).toBe('broadband');
	});
});
