import type { DecayMetric } from './decay-fit';

/**
 * How far a response stands above its background is given as the impulse response-to-noise ratio
 * INR = 10·lg(E(0)/E(t_c)) (Huszty & Sakamoto, "A note on the definition of signal-to-noise ratio
 * of room impulse responses", Acoust. Sci. & Tech. 33(2):117, 2012): the depth of the Schroeder
 * decay at the Lundeby crosspoint t_c (Lundeby et al., Acustica 81:344, 1995), i.e. where the decay
 * meets the noise. With the tail compensated, E(t_c) is the decay's energy beyond t_c.
 *
 * A metric needs the bottom of its evaluation range at least 10 dB above the noise (ISO 3382-1:2009
 * and ISO 3382-2:2008, clause 5.3 on the decay range needed; from memory, not checked against the
 * text): INR ≥ 35 dB for T20 (−25 dB), ≥ 45 dB for T30 (−35 dB); EDT's −10 dB by the same rule
 * needs 20 dB (common practice, no source).
 */
export const REQUIRED_INR_DB: Record<DecayMetric, number> = { edt: 20, t20: 35, t30: 45 };
/** Earlier name of REQUIRED_INR_DB, kept for importers. */
export const REQUIRED_PEAK_TO_NOISE_DB = REQUIRED_INR_DB;

/** Below this INR no decay stands out of the background: energy parameters are not given (common practice, no source). */
export const MIN_INR_FOR_ENERGY_DB = 20;

export const METRIC_LABELS: Record<DecayMetric, string> = { edt: 'EDT', t20: 'T20', t30: 'T30' };

/**
 * Smallest bandwidth × reverberation time for which the band filter does not lengthen the decay
 * (Jacobsen & Rindel, J. Sound Vib. 117, 1987, from memory): B·T > 16 filtering forward, > 4 time-reversed.
 * Forward-backward filtering keeps the forward pass's ringing after every event, so we hold it to
 * the forward criterion.
 */
export const FILTER_BIAS_MIN_BT = { forward: 16, timeReversed: 4, zeroPhase: 16 } as const;

/**
 * A band filter spreads every event over about 1/B; when that is not shorter than the 50 ms early
 * window, C50, C80, D50 and Ts lose their meaning: B must exceed 1/50 ms = 20 Hz (common practice, no source).
 */
export const MIN_BANDWIDTH_FOR_ENERGY_HZ = 1 / 0.05;

export function timeResolutionProblem(bandwidthHz: number): string {
	return `the band filter smears over ≈ ${Math.round(1000 / bandwidthHz)} ms (1/B), not shorter than the 50 ms early window: C50, C80, D50 and Ts are marked biased`;
}

/** Curvature above 10 % marks a decay as suspect, e.g. double-sloped (ISO 3382-2:2008, Annex B). */
export const CURVATURE_LIMIT_PERCENT = 10;

/** A band value is considered filter-biased when B·T falls short of the criterion. */
export function isFilterBiased(bandwidthHz: number, reverberationTimeS: number, criterion: number = FILTER_BIAS_MIN_BT.zeroPhase): boolean {
	return bandwidthHz * reverberationTimeS <= criterion;
}

/** INR as shown in messages: one decimal, so a value just short of a requirement never reads as meeting it. */
export function formatInr(inrDb: number): string {
	return `${(Math.floor(inrDb * 10) / 10).toFixed(1)} dB`;
}

/**
 * Why a metric is not given when the INR is short of its requirement. `recordEnds`: the response
 * ended before its decay met the background, so the INR is only a lower bound.
 */
export function inrProblem(metric: DecayMetric, inrDb: number, recordEnds = false): string | null {
	const needed = REQUIRED_INR_DB[metric];
	if (inrDb >= needed) return null;
	const bottom = needed - 10;
	if (recordEnds) {
		return `the response ends ${formatInr(inrDb)} down its decay, before it meets the background — ${METRIC_LABELS[metric]} needs INR ${needed} dB (its −${bottom} dB 10 dB above the noise): record longer after the sweep or impulse`;
	}
	return `INR ${formatInr(inrDb)} — ${METRIC_LABELS[metric]} needs ${needed} dB (its −${bottom} dB 10 dB above the noise): measure louder or longer`;
}

export function energyProblem(inrDb: number): string {
	return `INR ${formatInr(inrDb)} — C50, C80, D50 and Ts need ${MIN_INR_FOR_ENERGY_DB} dB: measure louder or longer`;
}

export function rangeNotReachedProblem(metric: DecayMetric, bottomDb: number): string {
	return `the decay does not reach ${bottomDb} dB before the noise — ${METRIC_LABELS[metric]} cannot be evaluated: measure louder or longer`;
}

export function filterBiasProblem(bandwidthHz: number, reverberationTimeS: number, criterion: number): string {
	const product = bandwidthHz * reverberationTimeS;
	return `B·T = ${product.toFixed(1)} is below ${criterion}: the band filter's own ringing may lengthen this decay (values kept, marked biased)`;
}

export function curvatureProblem(curvaturePct: number): string {
	// ISO 3382-2 Annex B flags |C| > 10 %: a T30 shorter than T20 is as suspect as a longer one.
	const direction = curvaturePct >= 0 ? 'longer' : 'shorter';
	return `curvature ${curvaturePct.toFixed(0)} %: T30 is ${Math.abs(curvaturePct).toFixed(0)} % ${direction} than T20 (more than ${CURVATURE_LIMIT_PERCENT} %): the decay is not a single slope`;
}
