/** Reverberation parameters from a decay curve by least squares (ISO 3382-1:2009 / ISO 3382-2:2008). */

export interface DecayFit {
	/** Time of the first and last point of the evaluation range, re the start point. */
	startS: number;
	endS: number;
	slopeDbPerS: number;
	/** Value of the fitted line at t = 0 (the start point). */
	interceptDb: number;
	/** T = −60 / slope. */
	reverberationTimeS: number;
	/** Pearson correlation of level against time (≈ −1 for a clean decay). */
	r: number;
	/** Non-linearity ξ = 1000·(1 − r²) ‰ (ISO 3382-2:2008, Annex B). */
	nonLinearityPermille: number;
}

export interface EvaluationRange {
	topDb: number;
	bottomDb: number;
}

/** EDT 0…−10 dB, T20 −5…−25 dB, T30 −5…−35 dB (ISO 3382-1:2009). */
export const EVALUATION_RANGES = {
	edt: { topDb: 0, bottomDb: -10 },
	t20: { topDb: -5, bottomDb: -25 },
	t30: { topDb: -5, bottomDb: -35 }
} as const satisfies Record<string, EvaluationRange>;

export type DecayMetric = keyof typeof EVALUATION_RANGES;

const MAX_FIT_POINTS = 4000;

/**
 * Least-squares line of 10·lg E against time through the decay curve E (linear, normalised to 1
 * at the start point) between the first points at or below `topDb` and `bottomDb`; null when the
 * curve never reaches `bottomDb` (the range is not available).
 */
export function fitDecayRange(decay: Float64Array, sampleRate: number, range: EvaluationRange): DecayFit | null {
	const { topDb, bottomDb } = range;
	if (!(bottomDb < topDb)) throw new RangeError(`evaluation range must go down: ${topDb} → ${bottomDb} dB`);
	const top = 10 ** (topDb / 10);
	const bottom = 10 ** (bottomDb / 10);
	let first = 0;
	while (first < decay.length && decay[first] > top) first++;
	let last = first;
	while (last < decay.length && decay[last] > bottom) last++;
	if (last >= decay.length || last - first < 2) return null;

	// One pass: with x centred, Σ(x − x̄)(y − ȳ) = Σ(x − x̄)·y, and Σ(y − ȳ)² = Σy² − n·ȳ².
	// Long ranges are sampled every `stride` points (at least ~4000 kept): the backward-integrated
	// curve is smooth at that scale, and the logarithms are the cost.
	const stride = Math.max(1, Math.floor((last - first) / MAX_FIT_POINTS));
	const meanX = first + (Math.floor((last - first) / stride) * stride) / 2;
	let count = 0;
	let sumY = 0;
	let sumYY = 0;
	let sxy = 0;
	let sxx = 0;
	for (let i = first; i <= last; i += stride) {
		const y = 10 * Math.log10(decay[i]);
		const dx = i - meanX;
		count++;
		sumY += y;
		sumYY += y * y;
		sxy += dx * y;
		sxx += dx * dx;
	}
	const meanY = sumY / count;
	const syy = Math.max(0, sumYY - count * meanY * meanY);
	const slopePerSample = sxy / sxx;
	const slopeDbPerS = slopePerSample * sampleRate;
	if (!(slopeDbPerS < 0)) return null;
	const r = syy > 0 ? Math.max(-1, Math.min(1, sxy / Math.sqrt(sxx * syy))) : -1;
	return {
		startS: first / sampleRate,
		endS: last / sampleRate,
		slopeDbPerS,
		interceptDb: meanY - slopePerSample * meanX,
		reverberationTimeS: -60 / slopeDbPerS,
		r,
		nonLinearityPermille: 1000 * (1 - r * r)
	};
}

/** Curvature C = 100·(T30/T20 − 1) % (ISO 3382-2:2008, Annex B). */
export function curvaturePercent(t20S: number, t30S: number): number {
	return 100 * (t30S / t20S - 1);
}
