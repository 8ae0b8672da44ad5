import { describe, expect, it } from 'vitest';
import { cellEdges, checkWaterfall, waterfallCsvRows, waterfallTable, type Waterfall } from '../../../src/lib/charts/waterfall-data';

/** Synthetic decay, linear in time and in log frequency: L(t, f) = −0.2·t − 3·log2(f/100) dB. */
function syntheticWaterfall(timesMs: number[]): Waterfall {
	const freqHz = Array.from({ length: 6 * 24 + 1 }, (_, i) => 20 * 2 ** (i / 24)); // 20 Hz … 1.28 kHz, 24 per octave
	const level = (t: number, f: number) => -0.2 * t - 3 * Math.log2(f / 100);
	return { timesMs, freqHz, levelsDb: timesMs.map((t) => freqHz.map((f) => level(t, f))) };
}

describe('cellEdges', () => {
	it('puts edges at geometric means on a log axis and at midpoints on a linear one', () => {
		// √(100·200) = 141.42, √(200·400) = 282.84; outer edges one half-spacing (ratio √2) beyond.
		const log = cellEdges([100, 200, 400], true);
		[70.7107, 141.4214, 282.8427, 565.6854].forEach((e, i) => expect(log[i]).toBeCloseTo(e, 3));
		expect(cellEdges([0, 10, 30], false)).toEqual([-5, 5, 20, 40]);
		expect(cellEdges([50], true)).toEqual([50 / Math.SQRT2, 50 * Math.SQRT2]);
		expect(cellEdges([], false)).toEqual([]);
	});
});

describe('waterfallTable', () => {
	it('reads the octave frequencies every 50 ms', () => {
		const w = syntheticWaterfall(Array.from({ length: 31 }, (_, i) => i * 10));
		const table = waterfallTable(w);
		expect(table.headers).toEqual(['Time (ms)', '31.5 Hz (dB)', '63 Hz (dB)', '125 Hz (dB)', '250 Hz (dB)', '500 Hz (dB)', '1 kHz (dB)']);
		expect(table.rows.map((r) => r[0])).toEqual([0, 50, 100, 150, 200, 250, 300]);
		const octaves = [31.5, 63, 125, 250, 500, 1000];
		for (const row of table.rows) {
			const t = row[0] as number;
			// The synthetic level is a straight line in log f, so interpolation is exact; 0.05 dB is the table's rounding.
			octaves.forEach((f, j) => expect(row[j + 1] as number).toBeCloseTo(-0.2 * t - 3 * Math.log2(f / 100), 1));
		}
	});

	it('takes the slice nearest each 50 ms, at its own time, once, and skips times with no slice near', () => {
		const w = syntheticWaterfall([10, 30, 50, 70, 90, 110, 130]);
		// 0 → 10, 50 → 50, 100 → 90 (a tie with 110; the first wins), 150 → 130: all within 25 ms.
		expect(waterfallTable(w).rows.map((r) => r[0])).toEqual([10, 50, 90, 130]);
		expect(waterfallTable(w).rows[0][3]).toBeCloseTo(-0.2 * 10 - 3 * Math.log2(125 / 100), 1);
		// Slices 200 ms apart: 50, 100 and 150 ms have no slice within 25 ms, and no slice is listed twice.
		expect(waterfallTable(syntheticWaterfall([0, 200])).rows.map((r) => r[0])).toEqual([0, 200]);
		// Slices every 10 ms but 20 ms step: each slice at most once.
		expect(waterfallTable(syntheticWaterfall([0, 10, 20, 30, 40]), 20).rows.map((r) => r[0])).toEqual([0, 20, 40]);
	});

	it('rejects inconsistent data', () => {
		const w = syntheticWaterfall([0, 10]);
		expect(() => checkWaterfall({ ...w, levelsDb: [w.levelsDb[0]] })).toThrow(/2 slice times but 1 slices/);
		expect(() => checkWaterfall({ ...w, levelsDb: [w.levelsDb[0], [1]] })).toThrow(/slice 1 has 1 levels/);
		expect(() => checkWaterfall({ ...w, freqHz: [...w.freqHz].reverse() })).toThrow(/increasing/);
		expect(() => waterfallTable(w, 0)).toThrow(/stepMs/);
	});
});

describe('waterfallCsvRows', () => {
	it('has one row per slice and frequency', () => {
		const w = syntheticWaterfall([0, 10, 20]);
		const csv = waterfallCsvRows(w);
		expect(csv.rows).toHaveLength(3 * w.freqHz.length);
		expect(csv.rows[w.freqHz.length]).toEqual([10, 20, w.levelsDb[1][0]]);
	});
});
