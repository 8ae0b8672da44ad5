// Early reflections: peaks of the energy–time curve, first-order image sources, and the
// pairing of the two so a peak can be named after the surface that produced it.
import { AnalysisInputError } from './errors';
import { analyticEnvelope } from './envelope';
import { validateRoom, type RoomBox } from './room';

export type { RoomBox } from './room';

export type Surface = 'floor' | 'ceiling' | 'front' | 'back' | 'left' | 'right';

export interface DetectedReflection {
	/** Arrival after the direct-sound peak. */
	delayMs: number;
	/** Envelope level re the direct-sound peak, 20·lg(e/e_direct). */
	levelDb: number;
	/** Path length beyond the direct path, c·delay. */
	extraPathM: number;
	surface: Surface | null;
	predictedDelayMs: number | null;
	/** How far the peak stands above the local diffuse level, dB (absent in results before engine 2.0). */
	aboveDiffuseDb?: number;
}

/** x along the length from the front wall, y along the width from the left wall, z up from the floor. */
export interface Point3 {
	x: number;
	y: number;
	z: number;
}

export interface PredictedReflection {
	surface: Surface;
	delayMs: number;
	extraPathM: number;
	pathM: number;
	/** Spherical spreading re the direct sound, 20·lg(direct/path); walls taken as rigid. */
	levelDb: number;
}

export interface DetectReflectionsOptions {
	/** End of the search after the direct peak (default 50 ms). */
	windowMs?: number;
	/** Lowest level kept, dB re the direct peak (default −20 dB). */
	thresholdDb?: number;
	/** Air temperature for converting delay to path length (default 20 °C). */
	temperatureC?: number;
	/** Peaks closer than this keep only the strongest (default 0.5 ms). */
	minSeparationMs?: number;
	/** Time after the direct peak that belongs to the direct sound itself (default 0.5 ms). */
	directGuardMs?: number;
	/** Span after directIndex searched for the direct-sound peak (default 1 ms; an onset precedes the peak). */
	directSearchMs?: number;
	/** Length of the running median that gives the local diffuse level (default 5 ms). */
	diffuseWindowMs?: number;
	/** Height above the local diffuse level a peak needs; default from the false-alarm rule (diffuseMarginDb). */
	marginDb?: number;
}

/** Running-median window for the local diffuse level: long against a reflection, short against the decay (common practice, no source). */
const DIFFUSE_WINDOW_MS = 5;
/** Diffuse-field peaks the detector may take for reflections, per response searched (common practice, no source). */
const FALSE_ALARMS_PER_RESPONSE = 0.05;

/**
 * Height above the local diffuse level that a random peak of a diffuse field reaches only with
 * `falseAlarms` probability over a search of `searchMs`, the level estimated by a running median
 * of `windowSamples` values.
 *
 * After the first reflections a room's response is a Gaussian noise under an exponential envelope
 * (Polack, "Playing billiards in the concert hall", Applied Acoustics 38, 1993; and Kuttruff, Room
 * Acoustics, on the statistics of reverberant sound fields — both from memory). The squared
 * envelope of such a signal (real and Hilbert parts independent Gaussians) is exponentially
 * distributed: P(e² > m·mean) = e^(−m). A search over N independent values — about one per
 * sample at the Nyquist bandwidth, which overstates N and so errs towards a larger margin — stays
 * below `falseAlarms` expected false peaks with m = ln(N / falseAlarms). The mean itself comes from
 * a median of M values, whose relative standard error is about 1/(ln 2·√M) for an exponential
 * distribution (a sample median's variance is 1/(4M·f(median)²); from memory): twice that is added.
 */
export function diffuseMarginDb(searchMs: number, sampleRate: number, windowSamples: number, falseAlarms = FALSE_ALARMS_PER_RESPONSE): number {
	const independent = Math.max(1, (searchMs / 1000) * sampleRate);
	const medianError = 1 / (Math.LN2 * Math.sqrt(Math.max(1, windowSamples)));
	return 10 * Math.log10(Math.log(independent / falseAlarms)) + 10 * Math.log10(1 + 2 * medianError);
}

/**
 * Mean diffuse power around each index: the running median of the squared envelope over `window`
 * samples, divided by ln 2 (the median of an exponential distribution is ln 2 times its mean). A
 * median, unlike a mean, is not raised by the few discrete reflections inside the window. Samples
 * before `first` (the direct sound and the silence before it) are not diffuse field: the window is
 * kept after them.
 */
function diffuseMeanPower(power: Float64Array, index: number, first: number, window: number): number {
	const half = Math.floor(window / 2);
	let from = Math.max(first, index - half);
	const to = Math.min(power.length, from + window);
	from = Math.max(first, to - window);
	const values = power.slice(from, to).sort();
	if (values.length === 0) return 0;
	const middle = values.length >> 1;
	const median = values.length % 2 ? values[middle] : 0.5 * (values[middle - 1] + values[middle]);
	return median / Math.LN2;
}

/** Extra samples kept around the analysed span so the envelope is not distorted at its edges. */
const ENVELOPE_MARGIN_MS = 10;

/** Speed of sound in dry air, m/s. */
export function speedOfSound(temperatureC = 20): number {
	if (!Number.isFinite(temperatureC) || temperatureC <= -273.15) {
		throw new AnalysisInputError('invalid_option', `temperature must be a finite number above −273.15 °C, got ${temperatureC}`);
	}
	// Ideal gas: c = 331.3·√(1 + θ/273.15) m/s, 331.3 m/s at 0 °C (Kinsler et al., Fundamentals of Acoustics; from memory)
	return 331.3 * Math.sqrt(1 + temperatureC / 273.15);
}

function requirePositive(name: string, value: number): void {
	if (!Number.isFinite(value) || value <= 0) throw new AnalysisInputError('invalid_option', `${name} must be a finite number > 0, got ${value}`);
}

/**
 * Finds early reflections as local maxima of the analytic envelope (the energy–time curve)
 * between direct peak + directGuardMs and direct peak + windowMs that stand clearly above the
 * local diffuse level: a diffuse field's own random peaks are not reflections.
 *
 * Choices: delays and levels are taken re the direct-sound peak, the largest envelope value
 * within directSearchMs (1 ms) after directIndex (an onset index precedes the peak). A peak is kept
 * if it is at or above thresholdDb re the direct sound and at least marginDb above the local mean
 * diffuse power (running median, diffuseMeanPower; margin from diffuseMarginDb). Among peaks closer
 * than minSeparationMs only the strongest survives, which also removes the ripple the Hilbert
 * transform puts beside a sharp peak. Positions are whole samples. The result is sorted by delay.
 */
export function detectReflections(
	ir: Float64Array,
	sampleRate: number,
	directIndex: number,
	options: DetectReflectionsOptions = {}
): DetectedReflection[] {
	if (ir.length === 0) throw new AnalysisInputError('no_samples', 'impulse response is empty');
	requirePositive('sampleRate', sampleRate);
	if (!Number.isInteger(directIndex) || directIndex < 0 || directIndex >= ir.length) {
		throw new AnalysisInputError('invalid_option', `directIndex must be an integer in 0…${ir.length - 1}, got ${directIndex}`);
	}
	const windowMs = options.windowMs ?? 50;
	const thresholdDb = options.thresholdDb ?? -20;
	const minSeparationMs = options.minSeparationMs ?? 0.5;
	const directGuardMs = options.directGuardMs ?? 0.5;
	const directSearchMs = options.directSearchMs ?? 1;
	const diffuseWindowMs = options.diffuseWindowMs ?? DIFFUSE_WINDOW_MS;
	requirePositive('diffuseWindowMs', diffuseWindowMs);
	const diffuseWindow = Math.max(3, Math.round((diffuseWindowMs * sampleRate) / 1000));
	const marginDb = options.marginDb ?? diffuseMarginDb(windowMs - directGuardMs, sampleRate, diffuseWindow);
	if (!Number.isFinite(marginDb) || marginDb < 0) {
		throw new AnalysisInputError('invalid_option', `marginDb must be a finite number ≥ 0 dB, got ${marginDb}`);
	}
	requirePositive('windowMs', windowMs);
	if (!Number.isFinite(directSearchMs) || directSearchMs < 0) {
		throw new AnalysisInputError('invalid_option', `directSearchMs must be a finite number ≥ 0, got ${directSearchMs}`);
	}
	requirePositive('minSeparationMs', minSeparationMs);
	if (!Number.isFinite(directGuardMs) || directGuardMs < 0 || directGuardMs >= windowMs) {
		throw new AnalysisInputError('invalid_option', `directGuardMs must be ≥ 0 and below windowMs, got ${directGuardMs}`);
	}
	if (!Number.isFinite(thresholdDb) || thresholdDb > 0) {
		throw new AnalysisInputError('invalid_option', `thresholdDb must be a finite level ≤ 0 dB re the direct sound, got ${thresholdDb}`);
	}
	const c = speedOfSound(options.temperatureC ?? 20);
	const samples = (ms: number) => Math.round((ms * sampleRate) / 1000);

	// Envelope of the analysed span only: a long reverberant tail need not be transformed.
	const spanStart = Math.max(0, directIndex - samples(ENVELOPE_MARGIN_MS));
	const spanEnd = Math.min(
		ir.length,
		directIndex + samples(directSearchMs + windowMs + ENVELOPE_MARGIN_MS) + 2
	);
	const envelope = analyticEnvelope(ir.subarray(spanStart, spanEnd));
	const at = (index: number) => envelope[index - spanStart];

	let directPeak = directIndex;
	const directSearchEnd = Math.min(spanEnd - 1, directIndex + samples(directSearchMs));
	for (let i = directIndex; i <= directSearchEnd; i++) if (at(i) > at(directPeak)) directPeak = i;
	const directLevel = at(directPeak);
	if (!(directLevel > 0)) throw new AnalysisInputError('silent_signal', `no direct sound found near sample ${directIndex}`);

	const first = directPeak + Math.max(1, samples(directGuardMs));
	const last = Math.min(directPeak + samples(windowMs), spanEnd - 2);
	const power = new Float64Array(envelope.length);
	for (let i = 0; i < envelope.length; i++) power[i] = envelope[i] * envelope[i];
	const margin = 10 ** (marginDb / 10);
	const candidates: { index: number; levelDb: number; aboveDiffuseDb: number }[] = [];
	for (let i = first; i <= last; i++) {
		const value = at(i);
		if (!(value >= at(i - 1) && value > at(i + 1))) continue;
		const levelDb = 20 * Math.log10(value / directLevel);
		if (levelDb < thresholdDb) continue;
		const diffuse = diffuseMeanPower(power, i - spanStart, first - spanStart, diffuseWindow);
		const aboveDiffuseDb = diffuse > 0 ? 10 * Math.log10((value * value) / diffuse) : Infinity;
		if (value * value >= margin * diffuse) candidates.push({ index: i, levelDb, aboveDiffuseDb });
	}

	const separation = Math.max(1, samples(minSeparationMs));
	const kept: typeof candidates = [];
	for (const candidate of candidates.sort((a, b) => b.levelDb - a.levelDb)) {
		if (kept.every((peak) => Math.abs(peak.index - candidate.index) >= separation)) kept.push(candidate);
	}

	return kept
		.sort((a, b) => a.index - b.index)
		.map(({ index, levelDb, aboveDiffuseDb }) => {
			const delayS = (index - directPeak) / sampleRate;
			return {
				delayMs: delayS * 1000,
				levelDb,
				extraPathM: delayS * c,
				surface: null,
				predictedDelayMs: null,
				// Capped so the result stays plain JSON where no diffuse field is there to measure against.
				aboveDiffuseDb: Math.min(aboveDiffuseDb, 200)
			};
		});
}

function requireInside(room: RoomBox, point: Point3, name: string): void {
	const axes: [keyof Point3, number, string][] = [
		['x', room.lengthM, 'length'],
		['y', room.widthM, 'width'],
		['z', room.heightM, 'height']
	];
	for (const [axis, size, along] of axes) {
		const value = point?.[axis];
		if (typeof value !== 'number' || !Number.isFinite(value)) {
			throw new AnalysisInputError('invalid_option', `${name} ${axis} must be a finite number of metres, got ${String(value)}`);
		}
		if (value <= 0 || value >= size) {
			throw new AnalysisInputError('invalid_option', `${name} ${axis} = ${value} m lies outside the room (0…${size} m along its ${along})`);
		}
	}
}

/**
 * The six first-order image sources of a rectangular room (Allen & Berkley, JASA 65:943, 1979):
 * mirroring the source in a wall at coordinate w gives the image 2w − s on that axis.
 * Delays are re the direct sound; results sorted by delay.
 */
export function firstOrderImages(
	room: RoomBox,
	source: Point3,
	mic: Point3,
	temperatureC = 20
): PredictedReflection[] {
	validateRoom(room);
	requireInside(room, source, 'source');
	requireInside(room, mic, 'mic');
	const c = speedOfSound(temperatureC);
	const distance = (p: Point3) => Math.hypot(p.x - mic.x, p.y - mic.y, p.z - mic.z);
	const directM = distance(source);
	if (directM < 1e-3) throw new AnalysisInputError('invalid_option', 'source and mic are at the same point; no direct path');
	const images: [Surface, Point3][] = [
		['front', { ...source, x: -source.x }],
		['back', { ...source, x: 2 * room.lengthM - source.x }],
		['left', { ...source, y: -source.y }],
		['right', { ...source, y: 2 * room.widthM - source.y }],
		['floor', { ...source, z: -source.z }],
		['ceiling', { ...source, z: 2 * room.heightM - source.z }]
	];
	return images
		.map(([surface, image]) => {
			const pathM = distance(image);
			const extraPathM = pathM - directM;
			return {
				surface,
				pathM,
				extraPathM,
				delayMs: (extraPathM / c) * 1000,
				levelDb: 20 * Math.log10(directM / pathM) // 1/r spreading of a point source
			};
		})
		.sort((a, b) => a.delayMs - b.delayMs);
}

/**
 * Names detected peaks after predicted reflections: all pairs within toleranceMs are taken
 * closest first, each detection and each prediction used at most once. Returns new objects
 * in the order of `detected`; unmatched ones carry surface = null.
 */
export function attributeReflections(
	detected: DetectedReflection[],
	predicted: PredictedReflection[],
	toleranceMs = 0.5
): DetectedReflection[] {
	if (!Number.isFinite(toleranceMs) || toleranceMs < 0) {
		throw new AnalysisInputError('invalid_option', `toleranceMs must be a finite number ≥ 0, got ${toleranceMs}`);
	}
	const pairs: { d: number; p: number; gap: number }[] = [];
	detected.forEach((reflection, d) => {
		predicted.forEach((prediction, p) => {
			const gap = Math.abs(reflection.delayMs - prediction.delayMs);
			if (gap <= toleranceMs) pairs.push({ d, p, gap });
		});
	});
	pairs.sort((a, b) => a.gap - b.gap);
	const matchOf = new Map<number, number>();
	const usedPredictions = new Set<number>();
	for (const { d, p } of pairs) {
		if (matchOf.has(d) || usedPredictions.has(p)) continue;
		matchOf.set(d, p);
		usedPredictions.add(p);
	}
	return detected.map((reflection, d) => {
		const p = matchOf.get(d);
		const prediction = p === undefined ? undefined : predicted[p];
		return {
			...reflection,
			surface: prediction?.surface ?? null,
			predictedDelayMs: prediction?.delayMs ?? null
		};
	});
}
