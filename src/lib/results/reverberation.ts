// The reverberation time a verdict or a sentence rests on: T30, or T20 where T30 could not be
// measured; and the mid-frequency reverberation time every page and sentence uses.
import type { BandDifference } from '../analysis/compare';
import { sameBand } from '../analysis/targets';
import type { ReverberationMetric, ReverberationValue } from './types';

export type Side = 'before' | 'after';

/** A band's two decay times, however they were obtained (one position, an average, one side of a comparison). */
export interface BandTimes {
	centerHz: number | 'broadband';
	t30S: number | null | undefined;
	t20S: number | null | undefined;
}

const finite = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/** T30, falling back to T20 (a shorter evaluation range of the same decay, ISO 3382-2:2008, 5.3, from memory). */
export function reverberationFrom(t30S: number | null | undefined, t20S: number | null | undefined): ReverberationValue {
	if (finite(t30S)) return { valueS: t30S, metric: 't30S' };
	if (finite(t20S)) return { valueS: t20S, metric: 't20S' };
	return { valueS: null, metric: null };
}

/** T30 of one side of a band difference, falling back to T20. */
export function reverberationOf(band: BandDifference, side: Side): ReverberationValue {
	return reverberationFrom(band.metrics.t30S?.[side], band.metrics.t20S?.[side]);
}

/**
 * Octaves averaged into the single-number reverberation time T_mid: 500 Hz and 1 kHz
 * (ISO 3382-1:2009, Annex A, Table A.1, single-number frequency averaging; from memory).
 */
export const MID_FREQUENCY_BANDS_HZ = [500, 1000] as const;

export interface MidFrequencyReverberation {
	valueS: number;
	/** The metric behind each of the two bands, in MID_FREQUENCY_BANDS_HZ order. */
	metrics: ReverberationMetric[];
}

/**
 * T_mid: the mean of the 500 Hz and 1 kHz octave values, each T30, else T20. Null when either
 * band is missing or has neither: one band alone is not the single number the standard defines.
 */
export function midFrequencyReverberation(bands: readonly BandTimes[]): MidFrequencyReverberation | null {
	const values = MID_FREQUENCY_BANDS_HZ.map((f) => {
		const band = bands.find((b) => b.centerHz !== 'broadband' && sameBand(b.centerHz, f));
		return band ? reverberationFrom(band.t30S, band.t20S) : null;
	});
	if (values.some((v) => v === null || v.valueS === null)) return null;
	const known = values as { valueS: number; metric: ReverberationMetric }[];
	return { valueS: known.reduce((sum, v) => sum + v.valueS, 0) / known.length, metrics: known.map((v) => v.metric) };
}

/** A visit's side of a comparison as band times, for midFrequencyReverberation. */
export function bandTimesOf(differences: readonly BandDifference[], side: Side): BandTimes[] {
	return differences.map((d) => ({ centerHz: d.centerHz, t30S: d.metrics.t30S?.[side], t20S: d.metrics.t20S?.[side] }));
}
