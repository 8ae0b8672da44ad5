// The reverberation time a verdict or a sentence rests on: T30, or T20 where T30 could not be measured.
import type { BandDifference } from '../analysis/compare';
import type { ReverberationValue } from './extra-types';

export type Side = 'before' | 'after';

/** T30 of one side of a band difference, falling back to T20 (a shorter evaluation range, ISO 3382-1). */
export function reverberationOf(band: BandDifference, side: Side): ReverberationValue {
	const t30 = band.metrics.t30S?.[side] ?? null;
	if (t30 !== null) return { valueS: t30, metric: 't30S' };
	const t20 = band.metrics.t20S?.[side] ?? null;
	if (t20 !== null) return { valueS: t20, metric: 't20S' };
	return { valueS: null, metric: null };
}
