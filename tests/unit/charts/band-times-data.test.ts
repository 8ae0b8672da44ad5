import { describe, expect, it } from 'vitest';
import { bs1116Target } from '../../../src/lib/analysis/targets';
import {
	bandAxisRange,
	bandTimesCeiling,
	bandTimesPlotData,
	bandTimesTable,
	type BandMetricSpec,
	type BandTimes
} from '../../../src/lib/charts/band-times-data';

// Everest & Pohlmann, Master Handbook of Acoustics, reverberation chapter worked example
// (checked in two editions): untreated and tiled room, 125 Hz … 4 kHz.
const CENTRES = [125, 250, 500, 1000, 2000, 4000];
const UNTREATED = [0.54, 1.53, 2.87, 3.39, 2.06, 1.63];
const TREATED = [0.49, 0.85, 0.56, 0.54, 0.54, 0.55];

const METRICS: BandMetricSpec[] = [
	{ key: 'before', label: 'Untreated T30', tone: 'before' },
	{ key: 'after', label: 'Treated T30', tone: 'after' }
];

const BANDS: BandTimes[] = CENTRES.map((centerHz, i) => ({
	centerHz,
	values: { before: UNTREATED[i], after: i === 5 ? null : TREATED[i] } // 4 kHz treated value missing
}));

describe('bandTimesPlotData', () => {
	it('puts every metric on the band centres, missing values as gaps', () => {
		const data = bandTimesPlotData(BANDS, METRICS);
		expect(data.x).toEqual(CENTRES);
		expect(data.metrics[0]).toEqual(UNTREATED);
		expect(data.metrics[1]).toEqual([...TREATED.slice(0, 5), null]);
		expect(data.target).toBeNull();
	});

	it('carries a target whose bands reach beyond the measured ones', () => {
		// ITU-R BS.1116-3 for V = 100 m³: Tm = 0.25·(V/100 m³)^(1/3) = 0.250 s; upper limit +0.3 s at 63 Hz (formula and mask from memory).
		const target = bs1116Target(100, [63, ...CENTRES]);
		const data = bandTimesPlotData(BANDS, METRICS, target);
		expect(data.x).toEqual([63, ...CENTRES]);
		expect(data.metrics[0][0]).toBeNull(); // nothing measured at 63 Hz
		expect(data.target!.value.every((v) => Math.abs(v! - 0.25) < 1e-12)).toBe(true);
		expect(data.target!.upper[0]).toBeCloseTo(0.55, 12);
		expect(data.target!.lower[3]).toBeCloseTo(0.2, 12); // 500 Hz: −0.05 s
	});

	it('treats non-finite values as missing and rejects bad centres', () => {
		const data = bandTimesPlotData([{ centerHz: 500, values: { before: Number.NaN } }], METRICS);
		expect(data.metrics).toEqual([[null], [null]]);
		expect(() => bandTimesPlotData([{ centerHz: 0, values: {} }], METRICS)).toThrow(/centre must be a frequency/);
	});
});

describe('axis ranges', () => {
	it('reaches half an octave past the outer bands', () => {
		const [lo, hi] = bandAxisRange(CENTRES);
		expect(lo).toBeCloseTo(125 / Math.SQRT2, 9);
		expect(hi).toBeCloseTo(4000 * Math.SQRT2, 9);
		expect(bandAxisRange([])).toEqual([20, 20000]);
	});

	it('leaves 15 % headroom above the longest time or target limit', () => {
		expect(bandTimesCeiling(bandTimesPlotData(BANDS, METRICS))).toBeCloseTo(3.39 * 1.15, 12);
		expect(bandTimesCeiling(bandTimesPlotData([{ centerHz: 500, values: {} }], METRICS))).toBeCloseTo(0.1 * 1.15, 12);
	});
});

describe('bandTimesTable', () => {
	it('lists each band with its values and flags missing ones', () => {
		const table = bandTimesTable(BANDS, METRICS);
		expect(table.headers).toEqual(['Band', 'Centre (Hz)', 'Untreated T30 (s)', 'Treated T30 (s)']);
		expect(table.rows[0]).toEqual(['125 Hz', 125, 0.54, 0.49]);
		expect(table.rows[5]).toEqual(['4 kHz', 4000, 1.63, null]);
		expect(table.hasMissing).toBe(true);
		expect(bandTimesTable(BANDS.slice(0, 5), METRICS).hasMissing).toBe(false);
	});

	it('adds the target columns when there is a target, blank where a band has none', () => {
		const table = bandTimesTable([{ centerHz: 8000, label: '8k', values: { before: 0.4, after: 0.3 } }, ...BANDS], METRICS, bs1116Target(100, CENTRES));
		expect(table.headers.slice(-3)).toEqual(['Target (s)', 'Lower (s)', 'Upper (s)']);
		expect(table.rows[0]).toEqual(['8k', 8000, 0.4, 0.3, null, null, null]);
		expect(table.rows[3][4]).toBeCloseTo(0.25, 12);
	});
});
