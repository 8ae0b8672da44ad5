import { describe, expect, it } from 'vitest';
import {
	averageBands,
	bandDifferences,
	isTimeMetric,
	outlierPositions,
	powerAverageCurves,
	type MetricRow
} from '../../../src/lib/analysis/compare';

// Three positions, octave bands 125…500 Hz; nulls where a metric could not be evaluated.
const positions: MetricRow[][] = [
	[
		{ centerHz: 125, T30: 0.6, C80: 2 },
		{ centerHz: 250, T30: 0.5, C80: 4 },
		{ centerHz: 500, T30: 0.4, C80: null }
	],
	[
		{ centerHz: 125, T30: 0.8, C80: 1 },
		{ centerHz: 250, T30: null, C80: 5 },
		{ centerHz: 500, T30: 0.44, C80: 6 }
	],
	[
		{ centerHz: 125.893, T30: 0.7, C80: 3 }, // exact centre of the same octave
		{ centerHz: 250, T30: 0.6, C80: null }
	]
];

describe('averageBands', () => {
	// Arithmetic mean of the values per band (ISO 3382-2:2008 spatial averaging of reverberation
	// times, clause from memory; C80 averaged in dB the same way, a stated choice). Sample
	// standard deviation with n − 1 (definition). 1e-12 for round-off.
	const averaged = averageBands(positions, ['T30', 'C80']);

	it('has one row per band across positions, ascending', () => {
		expect(averaged.map((band) => band.centerHz)).toEqual([125, 250, 500]);
	});

	it.each([
		{ band: 0, metric: 'T30', mean: 0.7, count: 3, std: 0.1 },
		{ band: 0, metric: 'C80', mean: 2, count: 3, std: 1 },
		{ band: 1, metric: 'T30', mean: 0.55, count: 2, std: Math.sqrt(0.005) },
		{ band: 1, metric: 'C80', mean: 4.5, count: 2, std: Math.sqrt(0.5) },
		{ band: 2, metric: 'T30', mean: 0.42, count: 2, std: Math.sqrt(0.0008) },
		{ band: 2, metric: 'C80', mean: 6, count: 1, std: null }
	])('band $band $metric: mean $mean over $count positions', ({ band, metric, mean, count, std }) => {
		const value = averaged[band].values[metric];
		expect(value.count).toBe(count);
		expect(Math.abs((value.mean as number) - mean)).toBeLessThan(1e-12);
		if (std === null) expect(value.std).toBeNull();
		else expect(Math.abs((value.std as number) - std)).toBeLessThan(1e-12);
	});

	it('reads engine-shaped rows, counting only finite numbers', () => {
		// Rows shaped as the engine writes them (an interface, no index signature): other fields
		// (objects, booleans) are not metrics.
		interface EngineBand {
			centerHz: number;
			exactHz: number;
			t30S: number | null;
			c80Db: number | null;
			r: { t30: number | null };
			biased: boolean;
		}
		const engineRows: EngineBand[][] = [
			[{ centerHz: 1000, exactHz: 1000, t30S: 0.5, c80Db: 3, r: { t30: -0.99 }, biased: false }],
			[{ centerHz: 1000, exactHz: 1000, t30S: 0.7, c80Db: null, r: { t30: -0.98 }, biased: true }]
		];
		const [band] = averageBands(engineRows, ['t30S', 'c80Db', 'biased']);
		expect(band.values.t30S.count).toBe(2);
		expect(Math.abs((band.values.t30S.mean as number) - 0.6)).toBeLessThan(1e-12);
		expect(band.values.c80Db).toEqual({ mean: 3, count: 1, std: null });
		expect(band.values.biased.count).toBe(0);
	});

	it('reports null and count 0 for a metric nobody measured', () => {
		const value = averageBands(positions, ['EDT'])[0].values.EDT;
		expect(value).toEqual({ mean: null, count: 0, std: null });
	});
});

describe('powerAverageCurves', () => {
	const freqHz = [100, 200, 400];

	it('averages power, not dB: 0 dB and a near-silent curve give 10·lg(0.5) = −3.01 dB', () => {
		// Closed form 10·lg((1 + 10^(−20))/2); 1e-9 dB round-off.
		const result = powerAverageCurves([
			{ freqHz, db: [0, 0, 0] },
			{ freqHz, db: [-200, -200, -200] }
		]);
		expect(result.freqHz).toEqual(freqHz);
		for (const level of result.db) expect(Math.abs(level - 10 * Math.log10(0.5))).toBeLessThan(1e-9);
	});

	it.each([
		{ levels: [-10, -10], expected: -10 }, // equal curves: unchanged
		{ levels: [0, -10], expected: 10 * Math.log10((1 + 0.1) / 2) }, // closed form, −2.596 dB
		{ levels: [3, 3, -Infinity], expected: 3 + 10 * Math.log10(2 / 3) } // −∞ is zero power
	])('levels $levels → $expected dB', ({ levels, expected }) => {
		const result = powerAverageCurves(levels.map((level) => ({ freqHz, db: [level, level, level] })));
		expect(Math.abs(result.db[1] - expected)).toBeLessThan(1e-9);
		// negative case: the power average is not the dB average whenever the levels differ
		const dbMean = levels.reduce((a, b) => a + b, 0) / levels.length;
		if (new Set(levels).size > 1) expect(result.db[1]).not.toBeCloseTo(dbMean, 1);
	});

	it.each([
		{ name: 'grids of different length', curves: [{ freqHz, db: [0, 0, 0] }, { freqHz: [100, 200], db: [0, 0] }] },
		{ name: 'grids with different points', curves: [{ freqHz, db: [0, 0, 0] }, { freqHz: [100, 250, 400], db: [0, 0, 0] }] }
	])('throws for $name', ({ curves }) => {
		expect(() => powerAverageCurves(curves)).toThrow(/grids differ/);
	});

	it('throws for no curves and for NaN levels', () => {
		expect(() => powerAverageCurves([])).toThrow(/no curves/);
		expect(() => powerAverageCurves([{ freqHz, db: [0, Number.NaN, 0] }])).toThrow(/NaN/);
	});
});

describe('bandDifferences', () => {
	const before = averageBands(positions, ['T30', 'C80']);
	const after = averageBands(
		[
			[
				{ centerHz: 125, T30: 0.35, C80: 6 },
				{ centerHz: 250, T30: 0.33, C80: 7 }
			],
			[{ centerHz: 125, T30: 0.45, C80: 8 }]
		],
		['T30', 'C80']
	);
	const diff = bandDifferences(before, after, ['T30', 'C80']);

	it('gives before, after, after − before and the relative change of times, with counts', () => {
		// 125 Hz: T30 0.7 → 0.4 s: −0.3 s, −42.86 % (definition (after − before)/before); 1e-12.
		const t30 = diff[0].metrics.T30;
		expect(t30.beforeCount).toBe(3);
		expect(t30.afterCount).toBe(2);
		expect(Math.abs((t30.difference as number) + 0.3)).toBeLessThan(1e-12);
		expect(Math.abs((t30.relativeChange as number) + 0.3 / 0.7)).toBeLessThan(1e-12);
		// C80 is a level: difference in dB, no relative change.
		const c80 = diff[0].metrics.C80;
		expect(Math.abs((c80.difference as number) - 5)).toBeLessThan(1e-12);
		expect(c80.relativeChange).toBeNull();
	});

	it('leaves the difference null where one side is missing', () => {
		const band500 = diff.find((band) => band.centerHz === 500)!;
		expect(band500.metrics.T30).toMatchObject({ after: null, difference: null, relativeChange: null, afterCount: 0 });
		expect(Math.abs((band500.metrics.T30.before as number) - 0.42)).toBeLessThan(1e-12);
	});

	it.each([
		{ metric: 'T30', time: true },
		{ metric: 'T20', time: true },
		{ metric: 'EDT', time: true },
		{ metric: 'Ts', time: true },
		{ metric: 't30S', time: true },
		{ metric: 'edtS', time: true },
		{ metric: 'tsMs', time: true },
		{ metric: 'C80', time: false },
		{ metric: 'c80Db', time: false },
		{ metric: 'D50', time: false }
	])('$metric is a time metric: $time', ({ metric, time }) => {
		expect(isTimeMetric(metric)).toBe(time);
	});
});

describe('outlierPositions', () => {
	// Threshold 20 % of the mean of the other positions (common practice, no source).
	// Default metric t30S, the engine's name for T30.
	const withFourth = (t30: number): MetricRow[][] => [
		[{ centerHz: 500, t30S: 0.5 }],
		[{ centerHz: 500, t30S: 0.5 }],
		[{ centerHz: 500, t30S: 0.5 }],
		[{ centerHz: 500, t30S: t30 }]
	];

	it.each([
		{ t30: 0.625, flagged: true }, // +25 %
		{ t30: 0.375, flagged: true }, // −25 %
		{ t30: 0.575, flagged: false }, // +15 %
		{ t30: 0.425, flagged: false } // −15 %
	])('a position at T30 = $t30 s against 0.5 s elsewhere: flagged $flagged', ({ t30, flagged }) => {
		const flags = outlierPositions(withFourth(t30));
		expect(flags.map((flag) => flag.positionIndex)).toEqual(flagged ? [3] : []);
		if (flagged) {
			expect(Math.abs(flags[0].deviation - (t30 - 0.5) / 0.5)).toBeLessThan(1e-12);
			expect(flags[0].referenceMean).toBeCloseTo(0.5, 12);
		}
	});

	it('follows the fraction and metric options and skips nulls', () => {
		expect(outlierPositions(withFourth(0.575), { fraction: 0.1 }).map((f) => f.positionIndex)).toEqual([3]);
		const c80: MetricRow[][] = [[{ centerHz: 1000, c80Db: 4, t30S: null }], [{ centerHz: 1000, c80Db: 8, t30S: 0.4 }]];
		expect(outlierPositions(c80)).toEqual([]); // only one T30 value
		expect(outlierPositions(c80, { metric: 'c80Db' }).map((f) => f.positionIndex)).toEqual([0, 1]);
		expect(() => outlierPositions(c80, { fraction: 0 })).toThrow(/fraction/);
	});
});
