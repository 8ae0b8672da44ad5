import type { DecayMetric } from './decay-fit';

/**
 * Peak-to-noise ratio a metric needs: the bottom of its evaluation range at least 10 dB above the
 * noise (ISO 3382-1:2009 and ISO 3382-2:2008, from memory) — 35 dB for T20 (−25 dB) and 45 dB for T30 (−35 dB);
 * EDT's −10 dB by the same rule needs 20 dB (common practice, no source).
 */
export const REQUIRED_PEAK_TO_NOISE_DB: Record<DecayMetric, number> = { edt: 20, t20: 35, t30: 45 };

/** Below this peak-to-noise ratio no decay stands out of the background: energy parameters are not given (common practice, no source). */
export const MIN_PEAK_TO_NOISE_FOR_ENERGY_DB = 20;

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

export function peakToNoiseProblem(metric: DecayMetric, peakToNoiseDb: number): string | null {
	const needed = REQUIRED_PEAK_TO_NOISE_DB[metric];
	if (peakToNoiseDb >= needed) return null;
	return `peak-to-noise ${Math.round(peakToNoiseDb)} dB — ${METRIC_LABELS[metric]} needs ${needed} dB: measure louder or longer`;
}

export function energyProblem(peakToNoiseDb: number): string {
	return `peak-to-noise ${Math.round(peakToNoiseDb)} dB — C50, C80, D50 and Ts need ${MIN_PEAK_TO_NOISE_FOR_ENERGY_DB} dB: measure louder or longer`;
}

/** The bottom of an evaluation range must lie this far above the level where the decay meets the noise (ISO 3382-1:2009, from memory). */
export const NOISE_MARGIN_DB = 10;

export function noiseMarginProblem(metric: DecayMetric, bottomDb: number, decayDepthDb: number): string {
	return `the decay meets the noise at ${Math.round(decayDepthDb)} dB — ${METRIC_LABELS[metric]} needs it below ${bottomDb - NOISE_MARGIN_DB} dB: measure louder or longer`;
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
