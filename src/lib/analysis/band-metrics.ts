/**
 * Everything measured on one band's squared impulse response (or the broadband one): noise floor
 * and truncation (Lundeby), Schroeder decay with the tail compensated, EDT/T20/T30 with their
 * linearity, energy parameters — and, for every value not trusted, null plus the reason.
 */
import { curvaturePercent, EVALUATION_RANGES, fitDecayRange, type DecayFit, type DecayMetric } from './decay-fit';
import { energyParameters, type EnergyParameters } from './energy';
import { estimateNoiseFloor, noiseStillFalling, type NoiseFloorEstimate } from './lundeby';
import {
	curvatureProblem,
	CURVATURE_LIMIT_PERCENT,
	energyProblem,
	FILTER_BIAS_MIN_BT,
	filterBiasProblem,
	inrProblem,
	isFilterBiased,
	MIN_BANDWIDTH_FOR_ENERGY_HZ,
	MIN_INR_FOR_ENERGY_DB,
	rangeNotReachedProblem,
	timeResolutionProblem
} from './quality';
import { decayLevelDb, exponentialTailEnergy, schroederDecay } from './schroeder';

export const DECAY_METRICS: readonly DecayMetric[] = ['edt', 't20', 't30'];

export interface BandProblem {
	code: 'insufficient_dynamic_range' | 'decay_range_not_reached' | 'no_decay_found' | 'filter_bias' | 'filter_time_resolution' | 'curvature';
	message: string;
}

export interface DecayAnalysis {
	noise: NoiseFloorEstimate;
	/** Impulse response-to-noise ratio, −decayDepthDb (see quality.ts); null when no decay was found. */
	inrDb: number | null;
	/** The response ended before its decay met the background: the INR is a lower bound. */
	recordEndsInDecay: boolean;
	/** Schroeder decay from the start point to the truncation point, linear energy re its start. */
	decay: Float64Array;
	/** Level of the compensated decay curve at the truncation point, dB re its start (≈ where the decay meets the noise). */
	decayDepthDb: number;
	/** Fits of the values that are trusted; the others are null. */
	fits: Record<DecayMetric, DecayFit | null>;
	energy: EnergyParameters | null;
	/** 10·lg(direct / rest) of the energy, when the direct sound's end was given and the energy is trusted. */
	directToReverberantDb: number | null;
	curvaturePct: number | null;
	biased: boolean;
	problems: BandProblem[];
}

export interface DecayAnalysisOptions {
	/** Index of the start point in `squared` (default 0); earlier samples count only as early energy. */
	startIndex?: number;
	/** Band filter bandwidth for the B·T criterion; omitted for the broadband response. */
	bandwidthHz?: number;
	biasCriterion?: number;
	/** End of the direct sound, in samples after the start point: its energy against the rest is reported. */
	directEnd?: number;
	/** Bandwidth of the signal, for how steady its noise can look (default: the band's, else half the sample rate). */
	signalBandwidthHz?: number;
	/**
	 * Buffer the decay curve is written into (the result's `decay` is then a view of it, valid
	 * until the buffer is used again), so the bands of one analysis share one; default a new array.
	 */
	decayBuffer?: Float64Array;
}

/** Squares a signal from `start` on, into a new array. */
export function squaredFrom(x: Float64Array, start: number): Float64Array {
	const out = new Float64Array(x.length - start);
	for (let i = start; i < x.length; i++) out[i - start] = x[i] * x[i];
	return out;
}

/** Squares a signal in place (the band signals are scratch buffers). */
export function squareInPlace(x: Float64Array): Float64Array {
	for (let i = 0; i < x.length; i++) x[i] *= x[i];
	return x;
}

export function analyseDecay(withPreOnset: Float64Array, sampleRate: number, options: DecayAnalysisOptions = {}): DecayAnalysis {
	const startIndex = options.startIndex ?? 0;
	const squared = withPreOnset.subarray(startIndex);
	const noise = estimateNoiseFloor(squared, sampleRate);
	const problems: BandProblem[] = [];
	const slope = noise.lateSlopeDbPerS;
	const tailEnergy = slope === null ? 0 : exponentialTailEnergy(noise.powerAtCrosspoint, slope, sampleRate);
	const decay = schroederDecay(squared, noise.crosspointIndex, tailEnergy, options.decayBuffer);

	// With the tail compensated, the curve ends at the decay's depth below its start where it meets the noise: the INR.
	const decayDepthDb = decayLevelDb(decay[decay.length - 1]);
	const inrDb = slope === null ? null : -decayDepthDb;
	const signalBandwidthHz = options.signalBandwidthHz ?? options.bandwidthHz ?? sampleRate / 2;
	const recordEndsInDecay =
		slope !== null && (noise.crosspointIndex >= squared.length || noiseStillFalling(squared, noise, sampleRate, signalBandwidthHz));
	const fits = { edt: null, t20: null, t30: null } as Record<DecayMetric, DecayFit | null>;
	if (slope === null || inrDb === null) {
		problems.push({ code: 'no_decay_found', message: 'no decay above the background was found: check the capture' });
	}
	for (const metric of DECAY_METRICS) {
		if (inrDb === null) continue;
		const shortOfRange = inrProblem(metric, inrDb, recordEndsInDecay);
		if (shortOfRange) {
			problems.push({ code: 'insufficient_dynamic_range', message: shortOfRange });
			continue;
		}
		const fit = fitDecayRange(decay, sampleRate, EVALUATION_RANGES[metric]);
		if (!fit) {
			problems.push({ code: 'decay_range_not_reached', message: rangeNotReachedProblem(metric, EVALUATION_RANGES[metric].bottomDb) });
			continue;
		}
		fits[metric] = fit;
	}

	const energyTrusted = inrDb !== null && inrDb >= MIN_INR_FOR_ENERGY_DB;
	if (inrDb !== null && !energyTrusted) problems.push({ code: 'insufficient_dynamic_range', message: energyProblem(inrDb) });
	const energy =
		slope !== null && energyTrusted
			? energyParameters(
					withPreOnset,
					sampleRate,
					startIndex + noise.crosspointIndex,
					{ powerAtTruncation: noise.powerAtCrosspoint, decayRatePerS: (-slope * Math.LN10) / 10 },
					startIndex
				)
			: null;
	let directToReverberantDb: number | null = null;
	if (energy && options.directEnd !== undefined) {
		// The direct sound: everything before its end, pre-ringing included, as for the early energies.
		const end = Math.min(startIndex + Math.max(1, options.directEnd), startIndex + noise.crosspointIndex);
		let direct = 0;
		for (let i = 0; i < end; i++) direct += withPreOnset[i];
		const rest = energy.totalEnergy - direct;
		if (direct > 0 && rest > 0) directToReverberantDb = 10 * Math.log10(direct / rest);
	}

	const t20 = fits.t20?.reverberationTimeS ?? null;
	const t30 = fits.t30?.reverberationTimeS ?? null;
	const curvaturePct = t20 !== null && t30 !== null ? curvaturePercent(t20, t30) : null;
	if (curvaturePct !== null && Math.abs(curvaturePct) > CURVATURE_LIMIT_PERCENT) {
		problems.push({ code: 'curvature', message: curvatureProblem(curvaturePct) });
	}

	let biased = false;
	const longestTrusted = t30 ?? t20 ?? fits.edt?.reverberationTimeS ?? null;
	if (options.bandwidthHz !== undefined && longestTrusted !== null) {
		const criterion = options.biasCriterion ?? FILTER_BIAS_MIN_BT.zeroPhase;
		biased = isFilterBiased(options.bandwidthHz, longestTrusted, criterion);
		if (biased) problems.push({ code: 'filter_bias', message: filterBiasProblem(options.bandwidthHz, longestTrusted, criterion) });
	}
	if (options.bandwidthHz !== undefined && energy !== null && options.bandwidthHz < MIN_BANDWIDTH_FOR_ENERGY_HZ) {
		biased = true;
		problems.push({ code: 'filter_time_resolution', message: timeResolutionProblem(options.bandwidthHz) });
	}
	return { noise, inrDb, recordEndsInDecay, decay, decayDepthDb, fits, energy, directToReverberantDb, curvaturePct, biased, problems };
}
