// Shapes added beside types.ts: which reverberation metric a verdict rests on, and the
// comparison with the matched-position averages it was computed from.
import type { AveragedBand } from '../analysis/compare';
import type { BandVerdict } from '../analysis/targets';
import type { ComparisonModel } from './types';

/** T30 when it could be measured, T20 in its place otherwise. */
export type ReverberationMetric = 't30S' | 't20S';

export interface ReverberationValue {
	valueS: number | null;
	/** The metric behind valueS; null when neither could be measured. */
	metric: ReverberationMetric | null;
}

/** A verdict that also says which metric it was judged on. */
export interface SourcedVerdict extends BandVerdict {
	metric: ReverberationMetric | null;
}

export interface ComparisonResult extends ComparisonModel {
	verdicts: { before: SourcedVerdict[]; after: SourcedVerdict[] };
	/** Both visits averaged over the matched positions only (what differences and verdicts use). */
	matchedAverage: { baseline: AveragedBand[]; treated: AveragedBand[] };
}
