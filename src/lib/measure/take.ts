// One take in the browser: the test signal played `repetitions` times back to back, the input
// recorded throughout. The timing comes from the deconvolution of the recording against the
// played sweep (or of a loopback channel, which hears the output without the room): the lag of
// its peak says where each repetition arrived. The repetitions are cut at their arrivals and
// averaged sample by sample, so what is uploaded is one recorded sweep — the test signal's
// length, the sweep arriving LEAD_S after its start — with the noise of one repetition divided
// by the number of repetitions; the server deconvolves it like any other recorded sweep.
import { deconvolveFull } from '../analysis/deconvolve';
import { isAnalysisInputError } from '../analysis/errors';
import { CLIP_LEVEL, CLIP_MIN_RUN, detectClipping } from '../analysis/wav';
import { dbfsFromRms } from '../analysis/calibration';

/** Recorded before the sweep's arrival in the uploaded file (common practice, no source). */
export const LEAD_S = 0.05;
/** Longest delay from output to input looked for: interfaces, Bluetooth and the room's path (common practice, no source). */
export const MAX_DELAY_S = 1;
/** How far a later repetition may arrive from one period after the one before (clock drift; common practice, no source). */
export const DRIFT_WINDOW_S = 0.002;
/** The deconvolution's peak must stand this far above its mean square, or the sweep was not heard (common practice, no source). */
export const MIN_PROMINENCE_DB = 20;
/** Silence the test signal needs after its sweep: more than LEAD_S and the drift window, so a repetition's cut never reaches the next one's sweep. */
export const MIN_SILENCE_S = 0.2;
/** Shortest stretch before the first arrival that is read as the background (common practice, no source). */
const MIN_BACKGROUND_S = 0.1;

export interface SweepLawInput {
	f1Hz: number;
	f2Hz: number;
	durationS: number;
}

export interface TakePlan {
	sampleRate: number;
	/** The test signal as played: the sweep, then its silence. One repetition lasts its whole length. */
	signal: Float64Array;
	/** Samples of the sweep itself, before the silence. */
	sweepSamples: number;
	sweep: SweepLawInput;
	repetitions: number;
	/** Recording index at which the first repetition was sent to the output. */
	firstStart: number;
}

export interface TakeInput {
	/** The measurement microphone's channel. */
	measured: Float64Array;
	/** A loopback channel (the output wired back to an input), when there is one. */
	loopback?: Float64Array;
}

export interface TakeResult {
	/** The aligned repetitions averaged: a recorded sweep of the signal's length. */
	average: Float64Array;
	/** Recording index at which each repetition arrived (the deconvolution's peak). */
	arrivals: number[];
	/** From sending the first repetition to its arrival, s (the output and input latency, and without loopback the sound's path). */
	delayS: number;
	/** Largest distance of a repetition's arrival from one period after the one before, samples. */
	driftSamples: number;
	/** Deconvolution peak over its mean square in the search window, dB. */
	prominenceDb: number;
	/** Timing taken from the loopback channel. */
	timedByLoopback: boolean;
	/** Largest |sample| of the measured channel over the repetitions, dBFS. */
	peakDbfs: number;
	/** Runs at full scale in the measured channel over the repetitions (engine's rule). */
	clipRuns: number;
	/** RMS of the input before the first arrival, dBFS (AES17); null if too short to read. */
	backgroundDbfs: number | null;
	/** What differs between repetitions (noise), RMS dBFS: in one repetition and in the average; null for a single repetition. */
	noise: { perRepetitionDbfs: number; averagedDbfs: number } | null;
}

export type TakeErrorCode = 'not_heard' | 'recording_short' | 'bad_plan';

export class TakeError extends Error {
	constructor(
		readonly code: TakeErrorCode,
		message: string
	) {
		super(message);
	}
}

export function periodSamples(plan: Pick<TakePlan, 'signal'>): number {
	return plan.signal.length;
}

/** Samples the recording must hold, from its start, for the take to be cut from it. */
export function requiredLength(plan: TakePlan): number {
	return plan.firstStart + plan.repetitions * periodSamples(plan) + Math.round(MAX_DELAY_S * plan.sampleRate);
}

function checkPlan(plan: TakePlan): void {
	const { sampleRate, signal, sweepSamples, repetitions, firstStart } = plan;
	if (!(sampleRate > 0)) throw new TakeError('bad_plan', `sample rate must be positive, got ${sampleRate}`);
	if (!Number.isInteger(repetitions) || repetitions < 1) throw new TakeError('bad_plan', `repetitions must be a whole number ≥ 1, got ${repetitions}`);
	if (!(sweepSamples > 0 && sweepSamples <= signal.length)) throw new TakeError('bad_plan', `the sweep (${sweepSamples} samples) must lie within the signal (${signal.length})`);
	if (signal.length - sweepSamples < MIN_SILENCE_S * sampleRate) {
		throw new TakeError('bad_plan', 'the test signal needs silence after its sweep (at least 0.2 s) for the room to decay');
	}
	if (!Number.isInteger(firstStart) || firstStart < 0) throw new TakeError('bad_plan', `the first repetition's start must be a recording index ≥ 0, got ${firstStart}`);
}

/** |x[i]| largest over [from, to), and its index. */
function peakIn(x: Float64Array, from: number, to: number): { index: number; value: number; meanSquare: number } {
	let index = from;
	let value = -1;
	let sum = 0;
	for (let i = from; i < to; i++) {
		const a = Math.abs(x[i]);
		sum += x[i] * x[i];
		if (a > value) {
			value = a;
			index = i;
		}
	}
	return { index, value, meanSquare: sum / Math.max(1, to - from) };
}

/** Deconvolve a stretch of the timing channel against the played sweep (circular: lag ℓ ≥ 0 at index ℓ). */
function deconvolveStretch(stretch: Float64Array, plan: TakePlan): Float64Array {
	const reference = plan.signal.subarray(0, plan.sweepSamples);
	try {
		return deconvolveFull(stretch, reference, plan.sampleRate, plan.sweep).response;
	} catch (e) {
		if (isAnalysisInputError(e) && e.code === 'silent_signal') throw new TakeError('not_heard', 'The input was silent: check the input device, its channel and the cable.');
		throw e;
	}
}

function notHeard(prominenceDb: number, loopback: boolean): TakeError {
	const where = loopback ? 'the loopback channel' : 'the input';
	return new TakeError(
		'not_heard',
		`The test signal was not found in ${where} (its deconvolution peaks only ${prominenceDb.toFixed(1)} dB above the rest, ${MIN_PROMINENCE_DB} dB needed): check the output device, that the loudspeaker plays, and the input's channel.`
	);
}

/** Find where each repetition arrived, align them at their arrivals and average them. */
export function analyseTake(plan: TakePlan, input: TakeInput): TakeResult {
	checkPlan(plan);
	const { sampleRate, sweepSamples, repetitions, firstStart } = plan;
	const period = periodSamples(plan);
	const timing = input.loopback ?? input.measured;
	const lead = Math.round(LEAD_S * sampleRate);
	const maxDelay = Math.round(MAX_DELAY_S * sampleRate);
	const drift = Math.max(1, Math.round(DRIFT_WINDOW_S * sampleRate));
	if (input.loopback && input.loopback.length !== input.measured.length) throw new TakeError('bad_plan', 'the loopback and measured channels differ in length');

	// 1. The first arrival: the strongest peak from the recording's start to MAX_DELAY_S after
	// the first repetition was sent. Nothing was played before, so nothing else peaks there.
	const coarseEnd = Math.min(timing.length, firstStart + maxDelay + sweepSamples + lead);
	const searchTo = Math.min(firstStart + maxDelay, coarseEnd - sweepSamples);
	if (searchTo <= lead) throw new TakeError('recording_short', 'The recording ended before the first repetition could arrive.');
	const coarse = deconvolveStretch(timing.subarray(0, coarseEnd), plan);
	const found = peakIn(coarse, lead, searchTo);
	const prominenceDb = 10 * Math.log10((found.value * found.value) / Math.max(found.meanSquare, Number.MIN_VALUE));
	if (!(prominenceDb >= MIN_PROMINENCE_DB)) throw notHeard(prominenceDb, Boolean(input.loopback));

	// 2. Each repetition one period after the one before, refined within ±DRIFT_WINDOW_S.
	const arrivals: number[] = [];
	let expected = found.index;
	let driftSamples = 0;
	for (let k = 0; k < repetitions; k++) {
		const from = expected - lead - drift;
		const to = expected + drift + sweepSamples + lead;
		if (from < 0 || to > timing.length) {
			throw new TakeError('recording_short', `The recording ended before repetition ${k + 1} of ${repetitions} had arrived: measure again.`);
		}
		const response = deconvolveStretch(timing.subarray(from, to), plan);
		const refined = peakIn(response, lead, lead + 2 * drift + 1);
		const arrival = from + refined.index;
		if (k > 0) driftSamples = Math.max(driftSamples, Math.abs(arrival - (arrivals[k - 1] + period)));
		arrivals.push(arrival);
		expected = arrival + period;
	}

	// 3. Cut and average: each repetition from LEAD_S before its arrival, one period long.
	const measured = input.measured;
	const last = arrivals[repetitions - 1] - lead + period;
	if (last > measured.length) throw new TakeError('recording_short', 'The recording ended before the last repetition had decayed: measure again.');
	const average = new Float64Array(period);
	for (const a of arrivals) {
		const start = a - lead;
		for (let i = 0; i < period; i++) average[i] += measured[start + i];
	}
	for (let i = 0; i < period; i++) average[i] /= repetitions;

	// What differs between repetitions is noise: its mean square in one repetition is
	// Σ(x_k − x̄)² / ((N − 1)·samples), and in the mean of N independent repetitions 1/N of that
	// (the variance of a sample mean; Bendat & Piersol, Random Data, 4th ed., §4.1 — from memory).
	let noise: TakeResult['noise'] = null;
	if (repetitions > 1) {
		let sum = 0;
		for (const a of arrivals) {
			const start = a - lead;
			for (let i = 0; i < period; i++) sum += (measured[start + i] - average[i]) ** 2;
		}
		const perRepetition = sum / ((repetitions - 1) * period);
		noise = { perRepetitionDbfs: dbfsFromRms(Math.sqrt(perRepetition)), averagedDbfs: dbfsFromRms(Math.sqrt(perRepetition / repetitions)) };
	}

	const span = measured.subarray(arrivals[0] - lead, last);
	let peak = 0;
	for (let i = 0; i < span.length; i++) peak = Math.max(peak, Math.abs(span[i]));
	const clipRuns = detectClipping(span, CLIP_LEVEL, CLIP_MIN_RUN).runs;

	const before = arrivals[0] - lead;
	let backgroundDbfs: number | null = null;
	if (before >= MIN_BACKGROUND_S * sampleRate) {
		let sum = 0;
		for (let i = 0; i < before; i++) sum += measured[i] * measured[i];
		backgroundDbfs = dbfsFromRms(Math.sqrt(sum / before));
	}

	return {
		average,
		arrivals,
		delayS: (arrivals[0] - firstStart) / sampleRate,
		driftSamples,
		prominenceDb,
		timedByLoopback: Boolean(input.loopback),
		peakDbfs: peak > 0 ? 20 * Math.log10(peak) : -Infinity,
		clipRuns,
		backgroundDbfs,
		noise
	};
}

/** Why a take must not be uploaded, or null. */
export function takeRefusal(result: Pick<TakeResult, 'clipRuns'>): string | null {
	if (result.clipRuns > 0) {
		return `The input clipped during the measurement (${result.clipRuns} run${result.clipRuns === 1 ? '' : 's'} at full scale): turn the input gain or the playback volume down, check the level again and measure again. Nothing was uploaded.`;
	}
	return null;
}
