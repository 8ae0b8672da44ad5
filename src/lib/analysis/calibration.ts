// SPL calibration of one input chain (microphone, preamplifier, converter at one gain) from a
// recording of an acoustic calibrator: the steady 1 kHz tone's level in dBFS against the
// calibrator's stated level gives the offset, dB SPL = dBFS + offset.
import { analysisBands, bandAt, bandLabel } from './bands';
import { designButterworthBandpass, filterBackwardInPlace, filterForwardInPlace, zeroPhasePassEdges, BAND_FILTER_ORDER } from './filters';
import { detectClipping, MIN_SAMPLE_RATE } from './wav';

/**
 * dBFS convention (AES17): 0 dBFS is the RMS of a sine whose peak just reaches full scale (±1),
 * so level = 20·lg(√2·RMS) and a sine of amplitude A reads 20·lg(A) dBFS. A full-scale square
 * wave reads +3.01 dBFS.
 */
export function dbfsFromRms(rms: number): number {
	if (!(rms >= 0) || !Number.isFinite(rms)) throw new RangeError(`RMS must be a finite number ≥ 0, got ${rms}`);
	return 20 * Math.log10(Math.SQRT2 * rms);
}

/** Inverse of dbfsFromRms. */
export function rmsFromDbfs(dbfs: number): number {
	return 10 ** (dbfs / 20) / Math.SQRT2;
}

/** Nominal calibrator frequency, IEC 60942 (sound calibrators at 1 kHz). */
export const CALIBRATOR_FREQUENCY_HZ = 1000;
/** Levels of the common calibrators, IEC 60942: 94 dB SPL = 1 Pa RMS, 114 dB SPL = 10 Pa RMS. */
export const COMMON_CALIBRATOR_LEVELS_DB_SPL = [94, 114] as const;
/** Stated levels accepted; anything outside is a typing error, not a calibrator (common practice, no source). */
export const CALIBRATOR_LEVEL_RANGE_DB_SPL = { min: 60, max: 150 } as const;
/** Short-term level blocks for the steadiness test (common practice, no source). */
export const CALIBRATION_BLOCK_S = 0.1;
/** Steady tone needed for an offset (common practice, no source). */
export const MIN_STEADY_S = 1;
/** A steady tone stays within ± this of its median block level (common practice, no source). */
export const STEADY_TOLERANCE_DB = 0.25;
/** Blocks this far below the loudest are the background before and after the tone (common practice, no source). */
export const TONE_PRESENT_BELOW_MAX_DB = 10;
/** Share of the tone's energy in the 1 kHz third-octave band (common practice, no source): the rest ≤ −10 dB. */
export const MIN_BAND_ENERGY_FRACTION = 0.9;
/** Crest factor below this means flattened peaks; a sine has √2 = 3.01 dB (common practice, no source). */
export const MIN_SINE_CREST_FACTOR = 1.35;
/** Below this the recording holds no signal at all. */
const SILENCE_DBFS = -100;

export type CalibrationProblem =
	| 'invalid_input'
	| 'too_short'
	| 'silent'
	| 'clipped'
	| 'not_1khz_tone'
	| 'unstable_level';

/** Why a calibrator recording cannot give an offset; `code` is stable, `message` is for people. */
export class CalibrationError extends Error {
	readonly code: CalibrationProblem;

	constructor(code: CalibrationProblem, message: string) {
		super(message);
		this.name = 'CalibrationError';
		this.code = code;
	}
}

export function isCalibrationError(value: unknown): value is CalibrationError {
	return value instanceof CalibrationError;
}

export interface CalibratorOptions {
	/** Steady tone needed, in seconds (default MIN_STEADY_S). */
	minSteadyS?: number;
	/** Allowed wander around the median level, ± dB (default STEADY_TOLERANCE_DB). */
	steadyToleranceDb?: number;
}

/** One input chain's calibration: dB SPL = dBFS + offsetDb, for signals recorded through the same chain at the same gain. */
export interface ChainCalibration {
	/** The calibrator's stated level, dB SPL re 20 µPa. */
	statedLevelDbSpl: number;
	/** RMS of the tone in the 1 kHz third-octave band over the steady part, dBFS (AES17). */
	toneDbfs: number;
	/** dB SPL = dBFS + offsetDb. */
	offsetDb: number;
	/** RMS of the whole signal (DC removed) over the same part, dBFS: hum and noise included. */
	broadbandDbfs: number;
	/** Share of the steady part's energy in the 1 kHz third-octave band, 0…1. */
	bandEnergyFraction: number;
	/** Tone frequency from the zero crossings of the band signal. */
	toneFrequencyHz: number;
	/** The part used, seconds from the start of the recording. */
	steady: { startS: number; endS: number; durationS: number };
	/** Highest minus lowest 100 ms block level over the steady part, dB. */
	levelSpreadDb: number;
	sampleRate: number;
}

function check(condition: boolean, message: string): asserts condition {
	if (!condition) throw new CalibrationError('invalid_input', message);
}

function meanSquare(data: Float64Array, start: number, end: number, mean = 0): number {
	let sum = 0;
	for (let i = start; i < end; i++) sum += (data[i] - mean) ** 2;
	return sum / Math.max(1, end - start);
}

function mean(data: Float64Array, start: number, end: number): number {
	let sum = 0;
	for (let i = start; i < end; i++) sum += data[i];
	return sum / Math.max(1, end - start);
}

/** Zero-phase band signal (forward then backward), the engine's band filter design. */
function bandSignal(samples: Float64Array, lowerHz: number, upperHz: number, sampleRate: number): Float64Array {
	const edges = zeroPhasePassEdges(lowerHz, upperHz, sampleRate, BAND_FILTER_ORDER);
	const sections = designButterworthBandpass(BAND_FILTER_ORDER, edges.lowHz, edges.highHz, sampleRate);
	const out = Float64Array.from(samples);
	filterForwardInPlace(sections, out);
	filterBackwardInPlace(sections, out);
	return out;
}

function blockLevelsDb(data: Float64Array, blockLength: number, blocks: number): number[] {
	const levels: number[] = [];
	for (let b = 0; b < blocks; b++) {
		const ms = meanSquare(data, b * blockLength, (b + 1) * blockLength);
		levels.push(ms > 0 ? 10 * Math.log10(2 * ms) : -Infinity);
	}
	return levels;
}

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const mid = sorted.length >> 1;
	return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** Frequency from the positive-going zero crossings, linearly interpolated between samples. */
function zeroCrossingFrequencyHz(data: Float64Array, start: number, end: number, sampleRate: number): number {
	let first = -1;
	let last = -1;
	let count = 0;
	for (let i = start + 1; i < end; i++) {
		if (data[i - 1] < 0 && data[i] >= 0) {
			const t = i - 1 + data[i - 1] / (data[i - 1] - data[i]);
			if (first < 0) first = t;
			last = t;
			count++;
		}
	}
	return count > 1 ? ((count - 1) * sampleRate) / (last - first) : NaN;
}

/** Third-octave bands (50 Hz–10 kHz) by energy, strongest first, for the message about a wrong tone. */
function bandsByEnergy(samples: Float64Array, start: number, end: number, sampleRate: number): number[] {
	const segment = samples.subarray(start, end);
	return analysisBands('third')
		.filter((band) => band.upperHz * 1.2 < sampleRate / 2)
		.map((band) => ({ nominalHz: band.nominalHz, energy: meanSquare(bandSignal(segment, band.lowerHz, band.upperHz, sampleRate), 0, segment.length) }))
		.sort((a, b) => b.energy - a.energy)
		.map((band) => band.nominalHz);
}

const seconds = (s: number) => `${s.toFixed(1)} s`;
const percent = (fraction: number) => `${Math.round(fraction * 100)} %`;

/**
 * The offset of an input chain from a calibrator recording (a microphone in an IEC 60942 sound
 * calibrator at 1 kHz, 94 or 114 dB SPL). Steps: 100 ms block levels; the tone is where the
 * blocks are within 10 dB of the loudest (before and after is the background); at least 90 % of
 * its energy must lie in the 1 kHz third-octave band (IEC 61260-1 band, the engine's filter); the
 * steady part is the longest run of band-level blocks within ±0.25 dB of the tone's median, less
 * one block at each end (the calibrator switching on and off); it must last 1 s, hold no clipped
 * samples and keep a sine's crest factor. The level is the RMS of the band signal over the steady
 * part (hum, wind and DC do not count), in dBFS by AES17. Errors name the problem.
 */
export function calibrateFromCalibrator(
	samples: Float32Array | Float64Array,
	sampleRate: number,
	statedLevelDbSpl: number,
	options: CalibratorOptions = {}
): ChainCalibration {
	const minSteadyS = options.minSteadyS ?? MIN_STEADY_S;
	const tolerance = options.steadyToleranceDb ?? STEADY_TOLERANCE_DB;
	check(Number.isFinite(sampleRate) && sampleRate >= MIN_SAMPLE_RATE, `sample rate must be at least ${MIN_SAMPLE_RATE} Hz, got ${sampleRate}`);
	const { min, max } = CALIBRATOR_LEVEL_RANGE_DB_SPL;
	check(
		Number.isFinite(statedLevelDbSpl) && statedLevelDbSpl >= min && statedLevelDbSpl <= max,
		`the calibrator's stated level must be ${min}–${max} dB SPL (usually 94 or 114), got ${statedLevelDbSpl}`
	);
	check(Number.isFinite(minSteadyS) && minSteadyS > 0, `minimum steady duration must be > 0 s, got ${minSteadyS}`);
	check(Number.isFinite(tolerance) && tolerance > 0, `steadiness tolerance must be > 0 dB, got ${tolerance}`);
	const signal = Float64Array.from(samples);
	for (let i = 0; i < signal.length; i++) check(Number.isFinite(signal[i]), `sample ${i} is ${signal[i]}`);

	const blockLength = Math.round(CALIBRATION_BLOCK_S * sampleRate);
	const blocks = Math.floor(signal.length / blockLength);
	const neededS = minSteadyS + 2 * CALIBRATION_BLOCK_S;
	const durationS = signal.length / sampleRate;
	if (durationS < neededS) {
		throw new CalibrationError('too_short', `the recording lasts ${seconds(durationS)}; record at least ${seconds(neededS)} of steady calibrator tone`);
	}

	const broadband = blockLevelsDb(signal, blockLength, blocks);
	const loudest = Math.max(...broadband);
	if (!(loudest > SILENCE_DBFS)) throw new CalibrationError('silent', 'the recording is silent: no calibrator tone');
	// The tone: from the first to the last block within 10 dB of the loudest.
	const firstLoud = broadband.findIndex((level) => level >= loudest - TONE_PRESENT_BELOW_MAX_DB);
	const lastLoud = broadband.length - 1 - [...broadband].reverse().findIndex((level) => level >= loudest - TONE_PRESENT_BELOW_MAX_DB);
	const toneStart = firstLoud * blockLength;
	const toneEnd = (lastLoud + 1) * blockLength;
	const toneS = (toneEnd - toneStart) / sampleRate;
	if (toneS < neededS) {
		throw new CalibrationError('too_short', `the tone lasts ${seconds(toneS)}; record at least ${seconds(neededS)} of steady calibrator tone`);
	}

	// Clipping first: a tone clipped into a square wave would otherwise read as "not 1 kHz".
	const clippedBlocks = new Set<number>();
	for (let b = firstLoud; b <= lastLoud; b++) {
		if (detectClipping(signal.subarray(b * blockLength, (b + 1) * blockLength)).runs > 0) clippedBlocks.add(b);
	}
	const clippedShare = clippedBlocks.size / (lastLoud - firstLoud + 1);
	if (clippedShare > 0.5) {
		throw new CalibrationError('clipped', `the tone clips (full-scale samples in ${percent(clippedShare)} of it): lower the input gain and record again`);
	}

	const band = bandAt('third', 0);
	const toneBand = bandSignal(signal, band.lowerHz, band.upperHz, sampleRate);
	// Over the tone less a 4/B margin at each end, where the band filter starts and stops.
	const margin = Math.ceil((4 * sampleRate) / (band.upperHz - band.lowerHz));
	const innerStart = Math.min(toneStart + margin, toneEnd);
	const innerEnd = Math.max(toneEnd - margin, innerStart);
	const toneDc = mean(signal, innerStart, innerEnd);
	const toneFraction = meanSquare(toneBand, innerStart, innerEnd) / meanSquare(signal, innerStart, innerEnd, toneDc);
	if (!(toneFraction >= MIN_BAND_ENERGY_FRACTION)) {
		const [strongest, second] = bandsByEnergy(signal, innerStart, innerEnd, sampleRate);
		const share = `${percent(toneFraction)} of the energy is in the 1 kHz third-octave band (at least ${percent(MIN_BAND_ENERGY_FRACTION)} is needed)`;
		throw new CalibrationError(
			'not_1khz_tone',
			strongest === CALIBRATOR_FREQUENCY_HZ
				? `not a clean 1 kHz calibrator tone: only ${share}; there is too much noise or hum besides it, most at ${bandLabel(second)}`
				: `not a 1 kHz calibrator tone: only ${share}; the strongest band is ${bandLabel(strongest)}`
		);
	}

	// The steady part: the longest run of blocks near the tone's median band level.
	const levels = blockLevelsDb(toneBand, blockLength, blocks);
	const toneLevels = levels.slice(firstLoud, lastLoud + 1);
	const centre = median(toneLevels);
	let best = { start: 0, length: 0 };
	let runStart = -1;
	for (let b = firstLoud; b <= lastLoud + 1; b++) {
		const steady = b <= lastLoud && Math.abs(levels[b] - centre) <= tolerance;
		if (steady && runStart < 0) runStart = b;
		if (!steady && runStart >= 0) {
			if (b - runStart > best.length) best = { start: runStart, length: b - runStart };
			runStart = -1;
		}
	}
	const steadyFirst = best.start + 1;
	const steadyBlocks = best.length - 2;
	const steadyS = Math.max(0, steadyBlocks) * CALIBRATION_BLOCK_S;
	if (steadyS < minSteadyS - 1e-9) {
		const low = Math.min(...toneLevels);
		const high = Math.max(...toneLevels);
		throw new CalibrationError(
			'unstable_level',
			`the level is unstable: it wanders over ${(high - low).toFixed(1)} dB during the tone and stays within ±${tolerance} dB ` +
				`for only ${seconds(steadyS)} (${seconds(minSteadyS)} needed); hold the calibrator still, let it settle and record again`
		);
	}
	const start = steadyFirst * blockLength;
	const end = (steadyFirst + steadyBlocks) * blockLength;
	for (let b = steadyFirst; b < steadyFirst + steadyBlocks; b++) {
		if (clippedBlocks.has(b)) {
			throw new CalibrationError('clipped', `the tone clips at ${seconds(b * CALIBRATION_BLOCK_S)}: lower the input gain and record again`);
		}
	}
	const dc = mean(signal, start, end);
	const broadbandRms = Math.sqrt(meanSquare(signal, start, end, dc));
	let peak = 0;
	for (let i = start; i < end; i++) peak = Math.max(peak, Math.abs(signal[i] - dc));
	const crest = peak / broadbandRms;
	if (crest < MIN_SINE_CREST_FACTOR) {
		throw new CalibrationError(
			'clipped',
			`the tone's peaks are flattened (crest factor ${crest.toFixed(2)}, a sine has 1.41): something in the input chain clips; lower the gain and record again`
		);
	}

	const steadyLevels = levels.slice(steadyFirst, steadyFirst + steadyBlocks);
	const toneDbfs = dbfsFromRms(Math.sqrt(meanSquare(toneBand, start, end)));
	return {
		statedLevelDbSpl,
		toneDbfs,
		offsetDb: statedLevelDbSpl - toneDbfs,
		broadbandDbfs: dbfsFromRms(broadbandRms),
		bandEnergyFraction: meanSquare(toneBand, start, end) / meanSquare(signal, start, end, dc),
		toneFrequencyHz: zeroCrossingFrequencyHz(toneBand, start, end, sampleRate),
		steady: { startS: start / sampleRate, endS: end / sampleRate, durationS: (end - start) / sampleRate },
		levelSpreadDb: Math.max(...steadyLevels) - Math.min(...steadyLevels),
		sampleRate
	};
}

/** What the level functions need of a calibration: the offset (a stored ChainCalibration will do). */
export interface CalibrationOffset {
	offsetDb: number;
}

function checkedOffset(calibration: CalibrationOffset): number {
	if (!Number.isFinite(calibration.offsetDb)) throw new RangeError(`calibration offset must be finite, got ${calibration.offsetDb}`);
	return calibration.offsetDb;
}

/** dB SPL of a level in dBFS (AES17) recorded through the calibrated chain. */
export function dbSplFromDbfs(dbfs: number, calibration: CalibrationOffset): number {
	return dbfs + checkedOffset(calibration);
}

/** dB SPL of a signal of the given RMS (full-scale units) recorded through the calibrated chain. */
export function dbSplFromRms(rms: number, calibration: CalibrationOffset): number {
	return dbfsFromRms(rms) + checkedOffset(calibration);
}

/** Levels in dBFS to dB SPL; null (not measured) stays null. Returns a new array. */
export function applyCalibration(levelsDbfs: readonly number[], calibration: CalibrationOffset): number[];
export function applyCalibration(levelsDbfs: readonly (number | null)[], calibration: CalibrationOffset): (number | null)[];
export function applyCalibration(levelsDbfs: readonly (number | null)[], calibration: CalibrationOffset): (number | null)[] {
	const offset = checkedOffset(calibration);
	return levelsDbfs.map((level) => (level === null ? null : level + offset));
}
