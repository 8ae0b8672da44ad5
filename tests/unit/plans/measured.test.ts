import { describe, expect, it } from 'vitest';
import type { AveragedBand } from '../../../src/lib/analysis/compare';
import { measuredTimes } from '../../../src/lib/plans/measured';

const avg = (mean: number | null) => ({ mean, count: mean === null ? 0 : 3, std: null });
const band = (centerHz: number, t30: number | null, t20: number | null): AveragedBand => ({ centerHz, values: { t30S: avg(t30), t20S: avg(t20) } });

describe('measured T on the planning bands (T30, else T20: a shorter range of the same decay, ISO 3382-1)', () => {
	it('takes T30 where there is one, T20 otherwise, null where neither is a positive number', () => {
		const r = measuredTimes([
			band(63, null, 0.9),
			band(125, 0.8, 0.75),
			band(250, Number.NaN, 0.7),
			band(500, 0, 0.6),
			band(1000, null, null),
			band(2000, -0.1, -0.2),
			// exact IEC 61260-1 centres are the same bands as the nominal ones
			band(1000 * 10 ** 0.6, 0.45, null),
			band(1000 * 10 ** 0.9, 0.4, 0.38)
		]);
		expect(r.valuesS).toEqual([0.9, 0.8, 0.7, 0.6, null, null, 0.45, 0.4]);
		expect(r.metrics).toEqual(['T20', 'T30', 'T20', 'T20', null, null, 'T30', 'T30']);
	});

	it('bands the visit did not analyse are null; other bands are ignored', () => {
		const r = measuredTimes([band(500, 0.6, null), band(315, 0.9, null)]);
		expect(r.valuesS).toEqual([null, null, null, 0.6, null, null, null, null]);
		expect(r.metrics.filter((m) => m !== null)).toEqual(['T30']);
	});
});
