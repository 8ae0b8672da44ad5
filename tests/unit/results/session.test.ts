import { describe, expect, it } from 'vitest';
import { averageResponses, summariseSession } from '../../../src/lib/results/session';
import { makePosition, makeSession } from './factories';

// Round-off only: the means are of a handful of numbers.
const ROUND_OFF = 1e-12;

describe('summariseSession: spatial averages per band', () => {
	// Arithmetic mean over positions of the values that could be measured (ISO 3382-2:2008, 5.3,
	// from memory: reverberation times averaged arithmetically; the energy parameters the same
	// way, C80 in dB, as the module states). Expected values worked by hand.
	const summary = makeSession([
		{ label: 'P1', bands: [{ centerHz: 125, t30S: 0.5, c80Db: 2, d50: 0.4 }, { centerHz: 250, t30S: 0.4, edtS: 0.3 }], broadband: { t30S: 0.45 } },
		{ label: 'P2', bands: [{ centerHz: 125, t30S: 0.55, c80Db: 4, d50: null }, { centerHz: 250, t30S: null, edtS: 0.5 }], broadband: { t30S: 0.5 } },
		{ label: 'P3', bands: [{ centerHz: 125, t30S: 0.6, c80Db: null, d50: 0.5 }, { centerHz: 250, t30S: 0.5, edtS: null }], broadband: { t30S: 0.55 } }
	]);

	it.each([
		{ centerHz: 125, metric: 't30S', mean: 0.55, count: 3, std: 0.05 }, // 0.50, 0.55, 0.60
		{ centerHz: 250, metric: 't30S', mean: 0.45, count: 2, std: Math.SQRT1_2 * 0.1 }, // 0.40, null, 0.50
		{ centerHz: 125, metric: 'c80Db', mean: 3, count: 2, std: Math.SQRT2 }, // 2, 4, null dB
		{ centerHz: 125, metric: 'd50', mean: 0.45, count: 2, std: Math.SQRT1_2 * 0.1 },
		{ centerHz: 250, metric: 'edtS', mean: 0.4, count: 2, std: Math.SQRT1_2 * 0.2 },
		{ centerHz: 125, metric: 'tsMs', mean: null, count: 0, std: null } // never measured
	])('$metric at $centerHz Hz: mean $mean over $count positions', ({ centerHz, metric, mean, count, std }) => {
		const band = summary.average.find((b) => b.centerHz === centerHz);
		const average = band?.values[metric];
		expect(average?.count).toBe(count);
		if (mean === null) expect(average?.mean).toBeNull();
		else expect(average?.mean).toBeCloseTo(mean, 12);
		if (std === null) expect(average?.std).toBeNull();
		else expect(Math.abs((average?.std ?? NaN) - std)).toBeLessThan(ROUND_OFF);
	});

	it('averages every metric of AVERAGED_METRICS, and nothing else', () => {
		expect(Object.keys(summary.average[0].values).sort()).toEqual(['c50Db', 'c80Db', 'd50', 'edtS', 't20S', 't30S', 'tsMs']);
	});

	it('averages the broadband values the same way: 0.45, 0.50, 0.55 s → 0.50 s', () => {
		expect(summary.broadbandAverage.t30S.mean).toBeCloseTo(0.5, 12);
		expect(summary.broadbandAverage.t30S.count).toBe(3);
		expect(summary.broadbandAverage.edtS).toEqual({ mean: null, count: 0, std: null });
	});

	it('keeps the meta and the positions as given', () => {
		expect(summary.sessionId).toBe(1);
		expect(summary.conditionLabel).toBe('untreated');
		expect(summary.positions.map((p) => p.positionLabel)).toEqual(['P1', 'P2', 'P3']);
	});

	it('an empty visit has no bands, empty broadband averages and no response', () => {
		const empty = summariseSession({ sessionId: 9, conditionLabel: 'x', measuredOn: '2026-01-01' }, []);
		expect(empty.average).toEqual([]);
		expect(empty.broadbandAverage.t30S).toEqual({ mean: null, count: 0, std: null });
		expect(empty.averageResponse).toBeNull();
		expect(empty.outliers).toEqual([]);
	});
});

describe('summariseSession: outlier positions (T30 more than 20 % from the others’ mean — common practice, no source)', () => {
	// P3's T30 against the mean of P1 and P2 (0.50 s): +25 % and −25 % are flagged, ±15 % are not.
	// P1 and P2 against the mean of the others move by at most 0.0625/0.5625 = 11 %, so are never flagged.
	it.each([
		{ p3: 0.625, flagged: true, deviation: 0.25 },
		{ p3: 0.375, flagged: true, deviation: -0.25 },
		{ p3: 0.575, flagged: false, deviation: 0.15 },
		{ p3: 0.425, flagged: false, deviation: -0.15 }
	])('P3 at $p3 s ($deviation of the others’ mean): flagged $flagged', ({ p3, flagged, deviation }) => {
		const summary = makeSession([
			{ label: 'P1', bands: [{ centerHz: 500, t30S: 0.5 }, { centerHz: 1000, t30S: 0.4 }] },
			{ label: 'P2', bands: [{ centerHz: 500, t30S: 0.5 }, { centerHz: 1000, t30S: 0.4 }] },
			{ label: 'P3', bands: [{ centerHz: 500, t30S: p3 }, { centerHz: 1000, t30S: 0.4 }] }
		]);
		if (!flagged) {
			expect(summary.outliers).toEqual([]);
			return;
		}
		expect(summary.outliers).toHaveLength(1);
		const [outlier] = summary.outliers;
		expect(outlier.positionLabel).toBe('P3');
		expect(outlier.centerHz).toBe(500);
		expect(outlier.metric).toBe('t30S');
		expect(outlier.value).toBe(p3);
		expect(outlier.referenceMean).toBeCloseTo(0.5, 12);
		expect(outlier.deviation).toBeCloseTo(deviation, 12);
	});
});

describe('averageResponses: power average 10·lg(mean 10^(L/10)) (definition of an energy mean)', () => {
	it.each([
		{ levels: [0, 10], expected: 10 * Math.log10((1 + 10) / 2) }, // 7.404 dB, not the 5 dB of an arithmetic mean
		{ levels: [-3, -3, -3], expected: -3 },
		{ levels: [20, 0, 0, 0], expected: 10 * Math.log10((100 + 3) / 4) }
	])('levels $levels dB → $expected dB, in the response and every smoothing', ({ levels, expected }) => {
		const positions = levels.map((level, i) => makePosition({ label: `P${i + 1}`, bands: [], responseDb: [level, level, level, level] }));
		const average = averageResponses(positions);
		expect(average?.freqHz).toEqual([100, 200, 400, 800]);
		for (const curve of [average?.db, ...Object.values(average?.smoothed ?? {})]) {
			expect(curve).toHaveLength(4);
			for (const value of curve ?? []) expect(Math.abs(value - expected)).toBeLessThan(1e-9);
		}
		expect(Object.keys(average?.smoothed ?? {}).sort()).toEqual(['1', '12', '24', '3', '6']);
	});

	it('averages over the frequencies all grids share when one grid is longer', () => {
		const short = makePosition({ label: 'A', bands: [], freqHz: [100, 200, 400], responseDb: [0, 0, 0] });
		const long = makePosition({ label: 'B', bands: [], freqHz: [100, 200, 400, 800], responseDb: [10, 10, 10, 10] });
		const average = averageResponses([short, long]);
		expect(average?.freqHz).toEqual([100, 200, 400]);
		expect(average?.db[2]).toBeCloseTo(10 * Math.log10(5.5), 9);
	});

	it('is null when the grids do not start alike', () => {
		const a = makePosition({ label: 'A', bands: [], freqHz: [100, 200], responseDb: [0, 0] });
		const b = makePosition({ label: 'B', bands: [], freqHz: [110, 220], responseDb: [0, 0] });
		expect(averageResponses([a, b])).toBeNull();
	});
});
