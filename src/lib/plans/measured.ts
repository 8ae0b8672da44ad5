// Measured reverberation time of a visit on the planning bands: the average over its positions,
// T30 where it could be evaluated, else T20 (a shorter range of the same decay, ISO 3382-1).
import type { AveragedBand } from '../analysis/compare';
import { sameBand } from '../analysis/targets';
import { PLANNING_BANDS_HZ } from '../treatment/bands';

export interface MeasuredTimes {
	valuesS: (number | null)[];
	/** Which decay range each value comes from. */
	metrics: ('T30' | 'T20' | null)[];
}

export function measuredTimes(average: readonly AveragedBand[]): MeasuredTimes {
	const metrics: MeasuredTimes['metrics'] = [];
	const valuesS = PLANNING_BANDS_HZ.map((f) => {
		const band = average.find((b) => sameBand(b.centerHz, f));
		const t30 = band?.values.t30S?.mean ?? null;
		const t20 = band?.values.t20S?.mean ?? null;
		if (t30 !== null && Number.isFinite(t30) && t30 > 0) {
			metrics.push('T30');
			return t30;
		}
		if (t20 !== null && Number.isFinite(t20) && t20 > 0) {
			metrics.push('T20');
			return t20;
		}
		metrics.push(null);
		return null;
	});
	return { valuesS, metrics };
}
