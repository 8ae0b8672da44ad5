// How much a visit's numbers can be trusted: per band the mean over positions with its sample
// standard deviation and Student-t 95 % confidence interval, ISO 3382-2's uncertainty of T20/T30
// from bandwidth and number of decays, and whether a before/after difference stands out from both
// the spread and what a listener would notice.
import type { BandKind } from '../analysis/bands';
import { isTimeMetric } from '../analysis/compare';
import { sameBand } from '../analysis/targets';

// ---------------------------------------------------------------------------------------------
// Student's t

/**
 * P(|T| ≤ t) for Student's t with an integer number of degrees of freedom ν, in closed form
 * (Abramowitz & Stegun, Handbook of Mathematical Functions, 26.7.3 for odd ν and 26.7.4 for even
 * ν), with θ = arctan(t/√ν).
 */
export function studentTTwoSidedProbability(t: number, degreesOfFreedom: number): number {
	checkDegreesOfFreedom(degreesOfFreedom);
	const theta = Math.atan(Math.abs(t) / Math.sqrt(degreesOfFreedom));
	return twoSided(theta, degreesOfFreedom);
}

function twoSided(theta: number, df: number): number {
	const c = Math.cos(theta);
	const s = Math.sin(theta);
	if (df % 2 === 1) {
		if (df === 1) return (2 * theta) / Math.PI;
		// θ + sinθ·(cosθ + (2/3)cos³θ + … + (2·4…(ν−3))/(1·3…(ν−2))·cos^(ν−2)θ)
		let term = c;
		let sum = c;
		for (let k = 3; k <= df - 2; k += 2) {
			term *= (c * c * (k - 1)) / k;
			sum += term;
		}
		return (2 / Math.PI) * (theta + s * sum);
	}
	// sinθ·(1 + (1/2)cos²θ + (1·3)/(2·4)cos⁴θ + … + (1·3…(ν−3))/(2·4…(ν−2))·cos^(ν−2)θ)
	let term = 1;
	let sum = 1;
	for (let k = 2; k <= df - 2; k += 2) {
		term *= (c * c * (k - 1)) / k;
		sum += term;
	}
	return s * sum;
}

function checkDegreesOfFreedom(df: number): void {
	if (!Number.isInteger(df) || df < 1 || df > 1_000_000) throw new RangeError(`degrees of freedom must be an integer 1…10⁶, got ${df}`);
}

/**
 * The p-quantile of Student's t with ν degrees of freedom (t(0.975, ν) for a two-sided 95 %
 * interval): the closed-form distribution above inverted by bisection on θ to double precision.
 */
export function studentTQuantile(p: number, degreesOfFreedom: number): number {
	checkDegreesOfFreedom(degreesOfFreedom);
	if (!(p > 0 && p < 1)) throw new RangeError(`probability must lie strictly between 0 and 1, got ${p}`);
	if (p === 0.5) return 0;
	if (p < 0.5) return -studentTQuantile(1 - p, degreesOfFreedom);
	const target = 2 * p - 1;
	let lo = 0;
	let hi = Math.PI / 2;
	for (let i = 0; i < 200 && hi - lo > 1e-16; i++) {
		const mid = (lo + hi) / 2;
		if (twoSided(mid, degreesOfFreedom) < target) lo = mid;
		else hi = mid;
	}
	return Math.sqrt(degreesOfFreedom) * Math.tan((lo + hi) / 2);
}

// ---------------------------------------------------------------------------------------------
// Spread across positions

export const DEFAULT_CONFIDENCE = 0.95;

export interface Spread {
	/** Finite values behind the numbers. */
	count: number;
	mean: number | null;
	/** Sample standard deviation (n − 1); null below two values. */
	std: number | null;
	/** std/√n, the standard error of the mean. */
	standardError: number | null;
	confidence: number;
	/** t((1 + confidence)/2, n − 1). */
	tQuantile: number | null;
	/** Half-width of the confidence interval of the mean: t·s/√n. */
	halfWidth: number | null;
	low: number | null;
	high: number | null;
}

/**
 * Mean, sample standard deviation and the Student-t confidence interval of the mean,
 * mean ± t((1 + c)/2, n − 1)·s/√n (any statistics text, e.g. NIST/SEMATECH e-Handbook of
 * Statistical Methods, 1.3.5.2). Nulls and non-finite values are skipped (not measurable).
 */
export function spreadOf(values: readonly (number | null)[], confidence = DEFAULT_CONFIDENCE): Spread {
	if (!(confidence > 0 && confidence < 1)) throw new RangeError(`confidence must lie strictly between 0 and 1, got ${confidence}`);
	const finite = values.filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
	const count = finite.length;
	const empty = { std: null, standardError: null, tQuantile: null, halfWidth: null, low: null, high: null };
	if (count === 0) return { count, mean: null, confidence, ...empty };
	const mean = finite.reduce((sum, v) => sum + v, 0) / count;
	if (count < 2) return { count, mean, confidence, ...empty };
	const std = Math.sqrt(finite.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (count - 1));
	const standardError = std / Math.sqrt(count);
	const tQuantile = studentTQuantile((1 + confidence) / 2, count - 1);
	const halfWidth = tQuantile * standardError;
	return { count, mean, std, standardError, confidence, tQuantile, halfWidth, low: mean - halfWidth, high: mean + halfWidth };
}

export interface BandSpread {
	centerHz: number;
	values: Record<string, Spread>;
}

/**
 * Per band (centres matched across positions, nominal or exact) and metric, the spread over
 * positions. `positions` holds each position's band rows, e.g. PositionResult.bands.
 */
export function bandSpreads<Row extends { centerHz: number }>(
	positions: readonly (readonly Row[])[],
	metrics: readonly (keyof Row & string)[],
	confidence = DEFAULT_CONFIDENCE
): BandSpread[] {
	const centres: number[] = [];
	for (const bands of positions) {
		for (const { centerHz } of bands) {
			if (!(Number.isFinite(centerHz) && centerHz > 0)) throw new RangeError(`band centre must be > 0 Hz, got ${centerHz}`);
			if (!centres.some((c) => sameBand(c, centerHz))) centres.push(centerHz);
		}
	}
	centres.sort((a, b) => a - b);
	return centres.map((centerHz) => {
		const rows = positions.map((bands) => bands.find((band) => sameBand(band.centerHz, centerHz)));
		const values: Record<string, Spread> = {};
		for (const metric of metrics) {
			values[metric] = spreadOf(
				rows.map((row) => {
					const value = row === undefined ? null : (row[metric] as unknown);
					return typeof value === 'number' ? value : null;
				}),
				confidence
			);
		}
		return { centerHz, values };
	});
}

// ---------------------------------------------------------------------------------------------
// ISO 3382-2 uncertainty of T20 and T30

/** B = 0.71·f_c for octaves, 0.23·f_c for thirds (ISO 3382-2:2008, with the uncertainty formulas; from memory). */
export const ISO_3382_2_BANDWIDTH_FACTOR: Record<BandKind, number> = { octave: 0.71, third: 0.23 };

/**
 * An integrated impulse response counts as about 10 averaged interrupted-noise decays for this
 * uncertainty (ISO 3382-2:2008; from memory). Pass it as `decaysPerPosition` for our captures.
 */
export const INTEGRATED_IMPULSE_EQUIVALENT_DECAYS = 10;

/**
 * σ(T) = k·T·√((1 + a/n)/(N·B·T)) with k = 0.88, a = 1.90 for T20 and k = 0.55, a = 1.52 for T30
 * (ISO 3382-2:2008, uncertainty of the interrupted-noise method; constants from memory, and the same
 * as in the ITA-Toolbox's ita_roomacoustics_uncertainty, RWTH Aachen).
 */
const UNCERTAINTY_CONSTANTS = { t20: { k: 0.88, a: 1.9 }, t30: { k: 0.55, a: 1.52 } } as const;

export interface ReverberationUncertaintyInput {
	metric: 't20' | 't30';
	/** The measured (averaged) T20 or T30, seconds. */
	reverberationTimeS: number;
	/** Band centre f_c, Hz. */
	centerHz: number;
	bandKind: BandKind;
	/** n: decays averaged at each position (INTEGRATED_IMPULSE_EQUIVALENT_DECAYS for an impulse response). */
	decaysPerPosition: number;
	/** N: independent source–microphone positions averaged. */
	positions: number;
}

export function iso3382BandwidthHz(centerHz: number, kind: BandKind): number {
	if (!(Number.isFinite(centerHz) && centerHz > 0)) throw new RangeError(`band centre must be > 0 Hz, got ${centerHz}`);
	return ISO_3382_2_BANDWIDTH_FACTOR[kind] * centerHz;
}

/** Standard deviation of the averaged T20 or T30, seconds, by ISO 3382-2's formula (see UNCERTAINTY_CONSTANTS). */
export function reverberationTimeUncertainty(input: ReverberationUncertaintyInput): number {
	const { metric, reverberationTimeS: t, decaysPerPosition: n, positions: count } = input;
	if (!(Number.isFinite(t) && t > 0)) throw new RangeError(`reverberation time must be > 0 s, got ${t}`);
	if (!(Number.isFinite(n) && n > 0)) throw new RangeError(`decays per position must be > 0, got ${n}`);
	if (!(Number.isInteger(count) && count >= 1)) throw new RangeError(`positions must be a whole number ≥ 1, got ${count}`);
	const { k, a } = UNCERTAINTY_CONSTANTS[metric];
	const b = iso3382BandwidthHz(input.centerHz, input.bandKind);
	return k * t * Math.sqrt((1 + a / n) / (count * b * t));
}

// ---------------------------------------------------------------------------------------------
// Before/after: is a difference within the spread?

/** A just-noticeable difference: absolute in the metric's unit, or relative to the before value. */
export interface JustNoticeable {
	value: number;
	relative: boolean;
}

/**
 * Just-noticeable differences, ISO 3382-1:2009 Annex A, Table A.1 (values from memory): EDT 5 %
 * (used for T20 and T30 as well — common practice), C80 1 dB, D50 0.05, Ts 10 ms. C50: 1.1 dB
 * (Bradley, Reich & Norcross, Applied Acoustics 58:99, 1999).
 */
export const JUST_NOTICEABLE: Readonly<Record<string, JustNoticeable>> = {
	edtS: { value: 0.05, relative: true },
	t20S: { value: 0.05, relative: true },
	t30S: { value: 0.05, relative: true },
	c80Db: { value: 1, relative: false },
	c50Db: { value: 1.1, relative: false },
	d50: { value: 0.05, relative: false },
	tsMs: { value: 10, relative: false }
};

export type DifferenceVerdict = 'within-spread' | 'within-jnd' | 'beyond' | 'unknown';

export interface DifferenceJudgement {
	metric: string;
	/** after − before of the means. */
	difference: number | null;
	/** (after − before)/before for time metrics. */
	relativeChange: number | null;
	/** Welch 95 % half-width of the difference of the means; null below two values on a side. */
	spreadLimit: number | null;
	/** The JND in the metric's unit (relative ones taken of the before mean). */
	jndLimit: number | null;
	withinSpread: boolean | null;
	withinJnd: boolean | null;
	/**
	 * 'within-spread': |Δ| does not exceed the spread, so positions scatter as much;
	 * 'within-jnd': beyond the spread but below what a listener notices; 'beyond': past every
	 * limit that could be computed; 'unknown': no difference, or no limit to judge it by.
	 */
	verdict: DifferenceVerdict;
}

/**
 * Half-width of the confidence interval of a difference of two means with unequal variances:
 * t((1 + c)/2, ν)·√(s₁²/n₁ + s₂²/n₂), ν by Welch–Satterthwaite, rounded down to an integer (the
 * conservative choice) — NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.5.3 (two-sample t-test).
 */
export function differenceHalfWidth(before: Spread, after: Spread): number | null {
	if (before.std === null || after.std === null || before.count < 2 || after.count < 2) return null;
	const v1 = before.std ** 2 / before.count;
	const v2 = after.std ** 2 / after.count;
	const se = Math.sqrt(v1 + v2);
	const welch = (v1 + v2) ** 2 / (v1 ** 2 / (before.count - 1) + v2 ** 2 / (after.count - 1));
	const df = Number.isFinite(welch) ? Math.max(1, Math.floor(welch)) : before.count + after.count - 2;
	const confidence = Math.min(before.confidence, after.confidence);
	return studentTQuantile((1 + confidence) / 2, df) * se;
}

/**
 * Judges a before/after difference of one metric in one band. The rule: a difference is within
 * the spread when |Δ| ≤ the 95 % half-width of the difference of the means (Welch, above); it is
 * within the JND when |Δ| < the metric's just-noticeable difference (ISO 3382-1:2009 Annex A).
 * Only a difference beyond both is reported as a real, audible change.
 */
export function judgeDifference(
	metric: string,
	before: Spread,
	after: Spread,
	options: { jnd?: JustNoticeable | null } = {}
): DifferenceJudgement {
	const jnd = options.jnd === undefined ? (JUST_NOTICEABLE[metric] ?? null) : options.jnd;
	const difference = before.mean !== null && after.mean !== null ? after.mean - before.mean : null;
	const relativeChange = difference !== null && isTimeMetric(metric) && before.mean ? difference / before.mean : null;
	const spreadLimit = differenceHalfWidth(before, after);
	const jndLimit = jnd === null || before.mean === null ? null : jnd.relative ? jnd.value * Math.abs(before.mean) : jnd.value;
	const withinSpread = difference === null || spreadLimit === null ? null : Math.abs(difference) <= spreadLimit;
	const withinJnd = difference === null || jndLimit === null ? null : Math.abs(difference) < jndLimit;
	let verdict: DifferenceVerdict;
	if (difference === null || (withinSpread === null && withinJnd === null)) verdict = 'unknown';
	else if (withinSpread) verdict = 'within-spread';
	else if (withinJnd) verdict = 'within-jnd';
	else verdict = 'beyond';
	return { metric, difference, relativeChange, spreadLimit, jndLimit, withinSpread, withinJnd, verdict };
}

/** Words to follow "the change in this band is …", saying which limits it was judged by. */
export function verdictPhrase(judgement: Pick<DifferenceJudgement, 'verdict' | 'withinSpread' | 'withinJnd'>): string {
	const spreadKnown = judgement.withinSpread !== null;
	const jndKnown = judgement.withinJnd !== null;
	switch (judgement.verdict) {
		case 'within-spread':
			return 'no larger than the spread between positions';
		case 'within-jnd':
			return spreadKnown
				? 'larger than the spread between positions but below what a listener would notice'
				: 'below what a listener would notice (too few positions to compare with their spread)';
		case 'beyond':
			if (spreadKnown && jndKnown) return 'larger than the spread between positions and than what a listener would notice';
			return spreadKnown
				? 'larger than the spread between positions'
				: 'larger than what a listener would notice (too few positions to compare with their spread)';
		case 'unknown':
			return 'not possible to judge from these measurements';
	}
}
