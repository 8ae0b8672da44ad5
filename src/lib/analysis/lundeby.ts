/**
 * Background noise level and truncation point of a decay, after Lundeby, Vigran, Bietz &
 * Vorländer, "Uncertainties of measurements in room acoustics", Acustica 81:344–355, 1995.
 * The step numbers in the comments are theirs.
 */

export interface NoiseFloorEstimate {
	/** Peak of the squared signal and the background's mean square, in the same units. */
	peakPower: number;
	noisePower: number;
	/** 10·lg(noise / peak): the negative of the peak-to-noise ratio. */
	noiseDbRePeak: number;
	/** Truncation point (the crosspoint of the late decay line with the noise), an index into the signal. */
	crosspointIndex: number;
	/** Slope of the late decay near the crosspoint, for the tail compensation; null when no decay was found. */
	lateSlopeDbPerS: number | null;
	/** Power of the late decay line at the crosspoint (equals the noise unless the record ends first). */
	powerAtCrosspoint: number;
	/** First index of the stretch the noise was averaged over (to the end of the record). */
	noiseStartIndex: number;
	iterations: number;
	converged: boolean;
}

export interface NoiseFloorOptions {
	/** Step 1 interval, 10–50 ms in the paper. */
	initialIntervalS?: number;
	maxIterations?: number;
}

const DEFAULT_INITIAL_INTERVAL_S = 0.02;
const DEFAULT_MAX_ITERATIONS = 5;
/** Step 3: the first fit ends where the level comes within this much of the noise (paper: 5–10 dB). */
const FIRST_FIT_MARGIN_DB = 10;
/** Step 5: intervals per 10 dB of decay (paper: 3–10). */
const INTERVALS_PER_10_DB = 5;
/** Step 7: the noise is taken this far (in decay) past the crosspoint (paper: 5–10 dB), at least the last 10 %. */
const NOISE_START_PAST_CROSSPOINT_DB = 10;
const MIN_NOISE_FRACTION = 0.1;
/** Step 8: the late fit spans this range, ending this far above the noise (paper: 10–20 dB, 5–10 dB). */
const LATE_FIT_RANGE_DB = 15;
const LATE_FIT_MARGIN_DB = 10;
const TINY_POWER = 1e-300;

interface Line {
	interceptDb: number;
	slopeDbPerS: number;
}

interface Intervals {
	timesS: Float64Array;
	levelsDb: Float64Array;
}

/**
 * Sums of the squared signal over any range from one pass over it: the sums of blocks of
 * BLOCK samples, plus the samples of the partial blocks at the range's ends. Every term is ≥ 0,
 * so the sums carry no cancellation; they differ from a running sum only by round-off.
 */
const BLOCK = 64;

class RangeSums {
	private readonly blockSums: Float64Array;
	/** Largest value, and one past the last value > 0 (0 if none). */
	readonly peakPower: number;
	readonly lastNonZero: number;

	constructor(private readonly squared: Float64Array) {
		const blocks = Math.ceil(squared.length / BLOCK);
		this.blockSums = new Float64Array(blocks);
		let peak = 0;
		let last = 0;
		for (let b = 0; b < blocks; b++) {
			let sum = 0;
			const end = Math.min(squared.length, (b + 1) * BLOCK);
			for (let i = b * BLOCK; i < end; i++) {
				const value = squared[i];
				sum += value;
				if (value > peak) peak = value;
				if (value > 0) last = i + 1;
			}
			this.blockSums[b] = sum;
		}
		this.peakPower = peak;
		this.lastNonZero = last;
	}

	/** Σ squared[from…to). */
	sum(from: number, to: number): number {
		const squared = this.squared;
		const firstFull = Math.ceil(from / BLOCK);
		const lastFull = Math.floor(to / BLOCK);
		let sum = 0;
		if (firstFull >= lastFull) {
			for (let i = from; i < to; i++) sum += squared[i];
			return sum;
		}
		for (let i = from; i < firstFull * BLOCK; i++) sum += squared[i];
		for (let b = firstFull; b < lastFull; b++) sum += this.blockSums[b];
		for (let i = lastFull * BLOCK; i < to; i++) sum += squared[i];
		return sum;
	}
}

/** Steps 1 and 6: mean square in consecutive intervals, in dB, stamped at each interval's centre. */
function averageIntervals(squared: Float64Array, length: number, sampleRate: number, sums: RangeSums): Intervals {
	const count = Math.floor(squared.length / length);
	const timesS = new Float64Array(count);
	const levelsDb = new Float64Array(count);
	for (let j = 0; j < count; j++) {
		const sum = sums.sum(j * length, (j + 1) * length);
		timesS[j] = (j * length + length / 2) / sampleRate;
		levelsDb[j] = 10 * Math.log10(Math.max(sum / length, TINY_POWER));
	}
	return { timesS, levelsDb };
}

function meanFrom(sums: RangeSums, n: number, start: number): number {
	return sums.sum(start, n) / (n - start);
}

function fitLine(intervals: Intervals, first: number, end: number): Line | null {
	const count = end - first;
	if (count < 2) return null;
	let meanT = 0;
	let meanL = 0;
	for (let j = first; j < end; j++) {
		meanT += intervals.timesS[j];
		meanL += intervals.levelsDb[j];
	}
	meanT /= count;
	meanL /= count;
	let sxx = 0;
	let sxy = 0;
	for (let j = first; j < end; j++) {
		sxx += (intervals.timesS[j] - meanT) ** 2;
		sxy += (intervals.timesS[j] - meanT) * (intervals.levelsDb[j] - meanL);
	}
	const slopeDbPerS = sxy / sxx;
	if (!(slopeDbPerS < 0)) return null;
	return { slopeDbPerS, interceptDb: meanL - slopeDbPerS * meanT };
}

function argMax(values: Float64Array): number {
	let best = 0;
	for (let i = 1; i < values.length; i++) if (values[i] > values[best]) best = i;
	return best;
}

/** First index ≥ from whose level is at or below `levelDb`; values.length if none. */
function firstAtOrBelow(values: Float64Array, from: number, levelDb: number): number {
	let i = from;
	while (i < values.length && values[i] > levelDb) i++;
	return i;
}

const crossingTimeS = (line: Line, levelDb: number): number => (levelDb - line.interceptDb) / line.slopeDbPerS;

/**
 * Noise level and crosspoint of a squared impulse response that starts at the start point.
 * When no decay into noise can be found (the record ends first, or noise dominates) the crosspoint
 * is the end of the record.
 */
export function estimateNoiseFloor(squared: Float64Array, sampleRate: number, options: NoiseFloorOptions = {}): NoiseFloorEstimate {
	const n = squared.length;
	if (n < 16) throw new RangeError(`need at least 16 samples to find the noise floor, got ${n}`);
	const durationS = n / sampleRate;
	// One pass over the signal finds its peak and last sound and serves every mean below.
	const sums = new RangeSums(squared);
	const { peakPower, lastNonZero } = sums;
	if (!(peakPower > 0)) throw new RangeError('the signal is silent');
	const latestNoiseStart = Math.floor((1 - MIN_NOISE_FRACTION) * n);
	const floorPower = peakPower * 1e-30;

	// Step 2: first noise estimate from the last 10 % of the record.
	let noisePower = Math.max(meanFrom(sums, n, latestNoiseStart), floorPower);
	const failed = (): NoiseFloorEstimate => ({
		peakPower,
		noisePower,
		noiseDbRePeak: 10 * Math.log10(noisePower / peakPower),
		crosspointIndex: Math.max(1, lastNonZero),
		lateSlopeDbPerS: null,
		powerAtCrosspoint: noisePower,
		noiseStartIndex: latestNoiseStart,
		iterations: 0,
		converged: false
	});

	// Steps 1, 3: coarse intervals, a line from the peak to where the level nears the noise.
	const initialLength = Math.max(1, Math.round((options.initialIntervalS ?? DEFAULT_INITIAL_INTERVAL_S) * sampleRate));
	let intervals = averageIntervals(squared, Math.min(initialLength, Math.floor(n / 4)), sampleRate, sums);
	let peakInterval = argMax(intervals.levelsDb);
	let noiseDb = 10 * Math.log10(noisePower);
	const firstFitEnd = firstAtOrBelow(intervals.levelsDb, peakInterval + 1, noiseDb + FIRST_FIT_MARGIN_DB);
	let line = fitLine(intervals, peakInterval, Math.max(firstFitEnd, Math.min(peakInterval + 2, intervals.levelsDb.length)));
	if (!line) return failed();

	// Step 4: preliminary crosspoint.
	let crosspointS = Math.min(durationS, Math.max(0, crossingTimeS(line, noiseDb)));

	// Steps 5, 6: new interval length giving a few intervals per 10 dB of decay.
	const lengthFromSlope = Math.round((10 / -line.slopeDbPerS / INTERVALS_PER_10_DB) * sampleRate);
	const intervalLength = Math.max(1, Math.min(lengthFromSlope, Math.floor(n / 8)));
	intervals = averageIntervals(squared, intervalLength, sampleRate, sums);
	peakInterval = argMax(intervals.levelsDb);

	// Steps 7–10: noise past the crosspoint, late decay line, new crosspoint, until it settles.
	const maxIterations = options.maxIterations ?? DEFAULT_MAX_ITERATIONS;
	let iterations = 0;
	let converged = false;
	let noiseStart = latestNoiseStart;
	while (iterations < maxIterations) {
		iterations++;
		const noiseStartS = crosspointS + NOISE_START_PAST_CROSSPOINT_DB / -line.slopeDbPerS;
		noiseStart = Math.min(latestNoiseStart, Math.round(noiseStartS * sampleRate));
		noisePower = Math.max(meanFrom(sums, n, noiseStart), floorPower);
		noiseDb = 10 * Math.log10(noisePower);

		const bottomDb = noiseDb + LATE_FIT_MARGIN_DB;
		const topDb = Math.min(bottomDb + LATE_FIT_RANGE_DB, intervals.levelsDb[peakInterval]);
		const first = firstAtOrBelow(intervals.levelsDb, peakInterval, topDb);
		const end = firstAtOrBelow(intervals.levelsDb, first + 1, bottomDb);
		const lateLine = fitLine(intervals, first, end);
		if (!lateLine) break;
		line = lateLine;
		const next = Math.min(durationS, Math.max(0, crossingTimeS(line, noiseDb)));
		const settled = Math.abs(next - crosspointS) < intervalLength / sampleRate;
		crosspointS = next;
		if (settled) {
			converged = true;
			break;
		}
	}

	const crosspointIndex = Math.max(1, Math.min(lastNonZero, Math.round(crosspointS * sampleRate)));
	const lineDbAtCrosspoint = line.interceptDb + line.slopeDbPerS * (crosspointIndex / sampleRate);
	return {
		peakPower,
		noisePower,
		noiseDbRePeak: 10 * Math.log10(noisePower / peakPower),
		crosspointIndex,
		lateSlopeDbPerS: line.slopeDbPerS,
		powerAtCrosspoint: 10 ** (lineDbAtCrosspoint / 10),
		noiseStartIndex: noiseStart,
		iterations,
		converged
	};
}

/**
 * Whether the stretch the noise was taken from is still falling: its second half below its first
 * by more than half of what the late decay line falls over that time, more than 3σ (σ the scatter
 * of a mean of B·t independent squared Gaussian values, 10·lg e·√(1/(B·t)) per half) and more than
 * 1 dB (common practice, no source). Then the record ended inside the decay and the "noise" is
 * decay: the INR found is only a lower bound.
 */
export function noiseStillFalling(squared: Float64Array, estimate: NoiseFloorEstimate, sampleRate: number, bandwidthHz: number): boolean {
	if (estimate.lateSlopeDbPerS === null) return false;
	const start = Math.max(0, Math.min(estimate.noiseStartIndex, squared.length - 2));
	const middle = Math.floor((start + squared.length) / 2);
	let first = 0;
	let second = 0;
	for (let i = start; i < middle; i++) first += squared[i];
	for (let i = middle; i < squared.length; i++) second += squared[i];
	first /= Math.max(1, middle - start);
	second /= Math.max(1, squared.length - middle);
	if (!(first > 0 && second > 0)) return false;
	const halfS = (squared.length - middle) / sampleRate;
	const sigmaDb = 10 * Math.LOG10E * Math.sqrt(1 / Math.max(1, bandwidthHz * halfS));
	const decayOverHalvesDb = -estimate.lateSlopeDbPerS * ((squared.length - start) / 2 / sampleRate);
	return 10 * Math.log10(first / second) > Math.max(1, 3 * sigmaDb, 0.5 * decayOverHalvesDb);
}
