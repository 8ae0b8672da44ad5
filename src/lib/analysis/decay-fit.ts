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

/**
 * Least-squares line through the decay curve between the first points at or below `topDb` and
 * `bottomDb`; null when the curve never reaches `bottomDb` (the range is not available).
 */
export function fitDecayRange(curveDb: Float64Array, sampleRate: number, range: EvaluationRange): DecayFit | null {
	const { topDb, bottomDb } = range;
	if (!(bottomDb < topDb)) throw new RangeError(`evaluation range must go down: ${topDb} → ${bottomDb} dB`);
	let first = 0;
	while (first < curveDb.length && curveDb[first] > topDb) first++;
	let last = first;
	while (last < curveDb.length && curveDb[last] > bottomDb) last++;
	if (last >= curveDb.length || last - first < 2) return null;

	const count = last - first + 1;
	let meanT = 0;
	let meanL = 0;
	for (let i = first; i <= last; i++) {
		meanT += i;
		meanL += curveDb[i];
	}
	meanT /= count;
	meanL /= count;
	let sxx = 0;
	let sxy = 0;
	let syy = 0;
	for (let i = first; i <= last; i++) {
		const dt = i - meanT;
		const dl = curveDb[i] - meanL;
		sxx += dt * dt;
		sxy += dt * dl;
		syy += dl * dl;
	}
	const slopePerSample = sxy / sxx;
	const slopeDbPerS = slopePerSample * sampleRate;
	if (!(slopeDbPerS < 0)) return null;
	const r = syy > 0 ? sxy / Math.sqrt(sxx * syy) : -1;
	return {
		startS: first / sampleRate,
		endS: last / sampleRate,
		slopeDbPerS,
		interceptDb: meanL - slopePerSample * meanT,
		reverberationTimeS: -60 / slopeDbPerS,
		r,
		nonLinearityPermille: 1000 * (1 - r * r)
	};
}

/** Curvature C = 100·(T30/T20 − 1) % (ISO 3382-2:2008, Annex B). */
export function curvaturePercent(t20S: number, t30S: number): number {
	return 100 * (t30S / t20S - 1);
}
