/** The engine's entry points: an impulse response (or a recorded sweep) in, one JSON-ready result out. */
import { analyseDecay, DECAY_METRICS, type DecayAnalysis } from './band-metrics';
import { bandLabel, type BandKind } from './bands';
import { decimateEvenly, decimateKeepingPeaks, roundTo } from './curves';
import type { DecayFit } from './decay-fit';
import { completeLengthAt, deconvolveSweep } from './deconvolve';
import { energyTimeCurveDb } from './envelope';
import { AnalysisInputError } from './errors';
import { extraOctaves } from './extra-octaves';
import { createBandFilterBank } from './filters';
import { findDirectSoundPeak, findImpulseStart } from './onset';
import { REQUIRED_INR_DB } from './quality';
import { decayLevelDb } from './schroeder';
import { attributeReflections, detectReflections, firstOrderImages, type DetectedReflection } from './reflections';
import { frequencyResponse, logSpacedCurve, smoothedLogSpacedCurves, SMOOTHING_FRACTIONS } from './response';
import { cumulativeSpectralDecay } from './timefrequency';
import type {
	AnalysisCurves,
	AnalysisOptions,
	AnalysisResult,
	AnalysisStage,
	AnalysisWarning,
	BandMetrics,
	DecayCurve,
	DecayLineFit,
	DeconvolutionSummary,
	RecordingAnalysisOptions,
	SmoothingKey
} from './types';
import { ENGINE_VERSION } from './version';
import { decodeWav, MAX_SAMPLE_RATE, MIN_SAMPLE_RATE, type ClippingSummary, type DecodedWav } from './wav';

/** Shortest impulse response analysed, from its start point. */
const MIN_DECAY_S = 0.05;
/** Points of all decay curves together, so a third-octave result stays well under ~200 kB of JSON. */
const DECAY_POINT_BUDGET = 4000;
const MAX_DECAY_POINTS = 400;
const ETC_SPAN_MS = 80;
const ETC_MAX_POINTS = 800;
/** Margin analysed around the ETC span so the envelope's edges do not distort it. */
const ETC_MARGIN_MS = 10;
const FREQUENCY_POINTS_PER_OCTAVE = 48;
const WATERFALL_DURATION_MS = 300;
const BROADBAND = 'broadband';
/** The direct sound, for the direct-to-reverberant ratio: up to 2.5 ms after its peak (common practice, no source). */
const DIRECT_SOUND_WINDOW_S = 0.0025;
/** A band is analysed while the response holds everything up to an octave above its upper edge, where its filter is > 60 dB down. */
const COMPLETE_ABOVE_UPPER_EDGE = 2;

/** Adds up the time spent per stage and reports the totals once. */
function createStageClock(onStage: AnalysisOptions['onStage']) {
	const totals = new Map<AnalysisStage, number>();
	return {
		time<T>(stage: AnalysisStage, work: () => T): T {
			if (!onStage) return work();
			const started = performance.now();
			try {
				return work();
			} finally {
				totals.set(stage, (totals.get(stage) ?? 0) + performance.now() - started);
			}
		},
		report(): void {
			if (onStage) for (const [stage, ms] of totals) onStage(stage, ms);
		}
	};
}

function checkOptions(options: AnalysisOptions): BandKind {
	const kind = options.bands ?? 'octave';
	if (kind !== 'octave' && kind !== 'third') {
		throw new AnalysisInputError('invalid_option', `bands must be "octave" or "third", got "${String(kind)}"`);
	}
	if (options.temperatureC !== undefined && !(Number.isFinite(options.temperatureC) && options.temperatureC > -50 && options.temperatureC < 60)) {
		throw new AnalysisInputError('invalid_option', `temperature ${options.temperatureC} °C is outside −50…60 °C`);
	}
	if (options.reflectionThresholdDb !== undefined && !(options.reflectionThresholdDb <= 0)) {
		throw new AnalysisInputError('invalid_option', `the reflection threshold must be ≤ 0 dB re the direct sound, got ${options.reflectionThresholdDb}`);
	}
	return kind;
}

function checkSamples(samples: Float64Array, sampleRate: number): void {
	if (!(sampleRate >= MIN_SAMPLE_RATE && sampleRate <= MAX_SAMPLE_RATE)) {
		throw new AnalysisInputError('unsupported_sample_rate', `unsupported sample rate ${sampleRate} Hz: use ${MIN_SAMPLE_RATE} to ${MAX_SAMPLE_RATE} Hz`);
	}
	if (samples.length === 0) throw new AnalysisInputError('no_samples', 'the impulse response has no samples');
	for (let i = 0; i < samples.length; i++) {
		if (!Number.isFinite(samples[i])) throw new AnalysisInputError('non_finite_samples', `sample ${i} is not a finite number`);
	}
}

const toLineFit = (fit: DecayFit): DecayLineFit => ({
	startS: roundTo(fit.startS, 5),
	endS: roundTo(fit.endS, 5),
	interceptDb: roundTo(fit.interceptDb, 3),
	slopeDbPerS: roundTo(fit.slopeDbPerS, 3)
});

function bandMetrics(centerHz: number, exactHz: number, analysis: DecayAnalysis): BandMetrics {
	const { fits, energy } = analysis;
	const finiteOrNull = (value: number | undefined) => (value !== undefined && Number.isFinite(value) ? value : null);
	return {
		centerHz,
		exactHz,
		edtS: fits.edt?.reverberationTimeS ?? null,
		t20S: fits.t20?.reverberationTimeS ?? null,
		t30S: fits.t30?.reverberationTimeS ?? null,
		c50Db: finiteOrNull(energy?.c50Db),
		c80Db: finiteOrNull(energy?.c80Db),
		d50: finiteOrNull(energy?.d50),
		tsMs: finiteOrNull(energy?.centreTimeMs),
		inrDb: finiteOrNull(analysis.inrDb ?? undefined),
		peakToNoiseDb: finiteOrNull(analysis.inrDb ?? undefined),
		r: { edt: fits.edt?.r ?? null, t20: fits.t20?.r ?? null, t30: fits.t30?.r ?? null },
		xi: {
			edt: fits.edt?.nonLinearityPermille ?? null,
			t20: fits.t20?.nonLinearityPermille ?? null,
			t30: fits.t30?.nonLinearityPermille ?? null
		},
		curvaturePct: analysis.curvaturePct,
		biased: analysis.biased
	};
}

function decayCurve(centerHz: number | typeof BROADBAND, analysis: DecayAnalysis, sampleRate: number, maxPoints: number): DecayCurve {
	const { timesS, values } = decimateEvenly(analysis.decay, sampleRate, maxPoints);
	const fits: DecayCurve['fits'] = {};
	for (const metric of DECAY_METRICS) {
		const fit = analysis.fits[metric];
		if (fit) fits[metric] = toLineFit(fit);
	}
	return {
		centerHz,
		timesS: timesS.map((t) => roundTo(t, 5)),
		levelDb: values.map((v) => roundTo(decayLevelDb(v), 2)),
		noiseDb: Number.isFinite(analysis.noise.noiseDbRePeak) ? roundTo(analysis.noise.noiseDbRePeak, 2) : null,
		crosspointS: analysis.noise.lateSlopeDbPerS === null ? null : roundTo(analysis.noise.crosspointIndex / sampleRate, 5),
		fits
	};
}

function frequencyCurves(samples: Float64Array, sampleRate: number, start: number): Pick<AnalysisCurves, 'frequencyResponse' | 'frequencyResponseSmoothed'> {
	// Start 1 ms early so the rise of the direct sound is inside the window.
	const spectrum = frequencyResponse(samples, sampleRate, { startIndex: Math.max(0, start - Math.round(0.001 * sampleRate)) });
	const grid = { pointsPerOctave: FREQUENCY_POINTS_PER_OCTAVE };
	const raw = logSpacedCurve(spectrum.freqHz, spectrum.powerDb, grid);
	const smoothed = {} as Record<SmoothingKey, number[]>;
	const curves = smoothedLogSpacedCurves(spectrum.freqHz, spectrum.powerDb, SMOOTHING_FRACTIONS, grid);
	SMOOTHING_FRACTIONS.forEach((fraction, i) => (smoothed[String(fraction) as SmoothingKey] = curves[i]));
	return { frequencyResponse: raw, frequencyResponseSmoothed: smoothed };
}

function energyTimeCurve(samples: Float64Array, sampleRate: number, start: number, direct: number): AnalysisCurves['etc'] {
	const margin = Math.round((ETC_MARGIN_MS / 1000) * sampleRate);
	const spanEnd = Math.min(samples.length, direct + Math.round((ETC_SPAN_MS / 1000) * sampleRate) + 1);
	const segmentStart = Math.max(0, start - margin);
	const levels = energyTimeCurveDb(samples.subarray(segmentStart, Math.min(samples.length, spanEnd + margin)));
	const shown = levels.subarray(start - segmentStart, spanEnd - segmentStart);
	const { indices, values } = decimateKeepingPeaks(shown, ETC_MAX_POINTS);
	return {
		timesMs: indices.map((i) => roundTo(((start + i - direct) / sampleRate) * 1000, 3)),
		levelDb: values.map((v) => roundTo(v, 2))
	};
}

function waterfall(samples: Float64Array, sampleRate: number, start: number): AnalysisCurves['waterfall'] {
	const availableMs = ((samples.length - start) / sampleRate) * 1000;
	// The slices need room after the last one; short responses get a shorter waterfall.
	const durationMs = Math.min(WATERFALL_DURATION_MS, availableMs / 2);
	if (durationMs < 20) return { timesMs: [], freqHz: [], levelsDb: [] };
	return cumulativeSpectralDecay(samples, sampleRate, start, { durationMs, analysisEndMs: Math.min(availableMs, durationMs + 500) });
}

/** The curves of a result analysed without them: every list empty. */
function noCurves(): AnalysisCurves {
	return {
		frequencyResponse: { freqHz: [], db: [] },
		frequencyResponseSmoothed: Object.fromEntries(SMOOTHING_FRACTIONS.map((fraction) => [String(fraction), []])) as unknown as Record<SmoothingKey, number[]>,
		decay: [],
		etc: { timesMs: [], levelDb: [] },
		waterfall: { timesMs: [], freqHz: [], levelsDb: [] }
	};
}

function reflectionsOf(samples: Float64Array, sampleRate: number, start: number, options: AnalysisOptions): DetectedReflection[] {
	const detected = detectReflections(samples, sampleRate, start, {
		thresholdDb: options.reflectionThresholdDb,
		temperatureC: options.temperatureC
	});
	const room = options.room;
	if (!room?.source || !room.mic) return detected;
	let predicted;
	try {
		predicted = firstOrderImages(room, room.source, room.mic, options.temperatureC);
	} catch (error) {
		throw new AnalysisInputError('invalid_option', `room geometry: ${(error as Error).message}`);
	}
	return attributeReflections(detected, predicted);
}

function describe(center: number | null): string {
	return center === null ? 'broadband' : bandLabel(center);
}

function collectWarnings(center: number | null, analysis: DecayAnalysis, warnings: AnalysisWarning[]): void {
	for (const problem of analysis.problems) {
		warnings.push({ code: problem.code, band: center, message: `${describe(center)}: ${problem.message}` });
	}
}

interface Provenance {
	channels: number;
	durationS: number;
	clipping: ClippingSummary | null;
	warnings: AnalysisWarning[];
	deconvolution: DeconvolutionSummary | null;
	/** Samples holding the response at every frequency (a deconvolved sweep's low end is recorded for longer); default all. */
	fullBandLength?: number;
	/** Samples holding the response at frequencies up to fHz; default all. */
	completeLengthAt?: (frequencyHz: number) => number;
}

function directSoundNote(directToReverberantDb: number | null, warnings: AnalysisWarning[]): void {
	if (directToReverberantDb === null || directToReverberantDb <= 0) return;
	const share = Math.round(100 / (1 + 10 ** (-directToReverberantDb / 10)));
	warnings.push({
		code: 'direct_sound_dominates',
		band: null,
		message: `broadband: the direct sound carries ${share} % of the energy (direct-to-reverberant ratio +${directToReverberantDb.toFixed(1)} dB): EDT, C50, C80, D50 and Ts say mostly how near the source is, not how the room decays — T20 and T30 describe the room`
	});
}

function analyse(
	samples: Float64Array,
	sampleRate: number,
	options: AnalysisOptions,
	provenance: Provenance,
	clock = createStageClock(options.onStage),
	/** false: no reflections (a pass of which only the bands are kept). */
	withReflections = true
): AnalysisResult {
	const kind = checkOptions(options);
	checkSamples(samples, sampleRate);
	// Everything but the bands uses the part that holds the response at every frequency.
	const fullLength = Math.min(samples.length, provenance.fullBandLength ?? samples.length);
	const full = samples.subarray(0, fullLength);
	const start = findImpulseStart(full);
	if (full.length - start < MIN_DECAY_S * sampleRate) {
		throw new AnalysisInputError(
			'too_short',
			`only ${(((full.length - start) / sampleRate) * 1000).toFixed(0)} ms follow the direct sound: at least ${MIN_DECAY_S * 1000} ms are needed`
		);
	}
	const direct = findDirectSoundPeak(full, start, sampleRate);
	const warnings = [...provenance.warnings];

	const bank = createBandFilterBank(sampleRate, kind, { extraBands: kind === 'octave' && options.extraOctaves ? extraOctaves(sampleRate, provenance.deconvolution) : [] });
	const maxLead = Math.max(bank.span.padding, ...bank.filters.map((filter) => filter.padding));
	// One scratch buffer serves every band, and one more its decay curve; each band's results are
	// kept (its decay curve as the chart's points), its signals dropped.
	const scratch = new Float64Array(bank.scratchLength(samples.length, maxLead));
	const decayBuffer = new Float64Array(samples.length);
	// Each filter runs from its lead before the start point (silence before the file if it starts
	// sooner), so the pre-ringing ahead of the direct sound is kept and counted as early energy.
	const filtered = (lead: number, end: number, run: (from: number, leadingZeros: number) => Float64Array) => {
		const from = Math.max(0, start - lead);
		return clock.time('filtering', () => run(from, lead - (start - from)).subarray(0, lead + end - start));
	};

	// Broadband: the span of the bands, analysed as a band is.
	const spanLead = bank.span.padding;
	const broadbandSquared = filtered(spanLead, full.length, (from, zeros) => bank.filterSpanZeroPhase(full, from, full.length, scratch, zeros, true));
	const broadbandAnalysis = clock.time('decay', () =>
		analyseDecay(broadbandSquared, sampleRate, {
			startIndex: spanLead,
			signalBandwidthHz: bank.span.bandwidthHz,
			directEnd: direct - start + Math.round(DIRECT_SOUND_WINDOW_S * sampleRate),
			decayBuffer
		})
	);
	collectWarnings(null, broadbandAnalysis, warnings);
	directSoundNote(broadbandAnalysis.directToReverberantDb, warnings);
	const broadband = bandMetrics(0, 0, broadbandAnalysis);

	const withCurves = options.curves ?? true;
	const decayPoints = Math.max(2, Math.min(MAX_DECAY_POINTS, Math.floor(DECAY_POINT_BUDGET / (bank.filters.length + 1))));
	const decayCurves = withCurves ? [decayCurve(BROADBAND, broadbandAnalysis, sampleRate, decayPoints)] : [];
	const bands = bank.filters.map((filter, i) => {
		const end = Math.max(fullLength, Math.min(samples.length, provenance.completeLengthAt?.(COMPLETE_ABOVE_UPPER_EDGE * filter.band.upperHz) ?? samples.length));
		const squared = filtered(filter.padding, end, (from, zeros) => bank.filterZeroPhase(i, samples, from, end, scratch, zeros, true));
		const analysis = clock.time('decay', () => analyseDecay(squared, sampleRate, { bandwidthHz: filter.bandwidthHz, startIndex: filter.padding, decayBuffer }));
		collectWarnings(filter.band.nominalHz, analysis, warnings);
		if (withCurves) decayCurves.push(decayCurve(filter.band.nominalHz, analysis, sampleRate, decayPoints));
		return bandMetrics(filter.band.nominalHz, filter.band.exactHz, analysis);
	});

	const curves: AnalysisCurves = withCurves
		? clock.time('curves', () => ({
				...frequencyCurves(full, sampleRate, start),
				decay: decayCurves,
				etc: energyTimeCurve(full, sampleRate, start, direct),
				waterfall: waterfall(full, sampleRate, start)
			}))
		: noCurves();
	const reflections = withReflections ? clock.time('reflections', () => reflectionsOf(full, sampleRate, start, options)) : [];
	clock.report();

	const inrDb = broadband.inrDb ?? null;
	return {
		engineVersion: ENGINE_VERSION,
		sampleRate,
		channels: provenance.channels,
		durationS: provenance.durationS,
		bandKind: kind,
		directSoundS: start / sampleRate,
		inrDb,
		peakToNoiseDb: inrDb,
		broadband,
		bands,
		reflections,
		warnings,
		curves,
		quality: {
			clipping: provenance.clipping,
			inrDb,
			peakToNoiseDb: inrDb,
			lowDynamicRange: inrDb === null || inrDb < REQUIRED_INR_DB.t30,
			directToReverberantDb: broadbandAnalysis.directToReverberantDb === null ? null : roundTo(broadbandAnalysis.directToReverberantDb, 2),
			biasedBands: bands.filter((band) => band.biased).map((band) => band.centerHz)
		},
		deconvolution: provenance.deconvolution
	};
}

/** Analyses a mono impulse response (full scale ±1) at `sampleRate`. */
export function analyseImpulseResponse(samples: Float64Array, sampleRate: number, options: AnalysisOptions = {}): AnalysisResult {
	return analyse(samples, sampleRate, options, {
		channels: 1,
		durationS: samples.length / sampleRate,
		clipping: null,
		warnings: [],
		deconvolution: null
	});
}

/** Decodes a WAV file, deconvolves it when the played sweep is given, and analyses the impulse response. */
export function analyseRecording(bytes: Uint8Array, options: RecordingAnalysisOptions = {}): AnalysisResult {
	const clock = createStageClock(options.onStage);
	const decoded = clock.time('decode', () => decodeWav(bytes, { channel: options.channel, maxDurationS: options.maxDurationS }));
	return analyseDecodedRecording(decoded, options, clock);
}

/** analyseRecording of a file already decoded (its channel chosen). */
export function analyseDecodedRecording(
	decoded: DecodedWav,
	options: RecordingAnalysisOptions = {},
	clock = createStageClock(options.onStage)
): AnalysisResult {
	const { impulseResponse, provenance } = prepareRecording(decoded, options, clock);
	return analyse(impulseResponse, decoded.sampleRate, options, provenance, clock);
}

/**
 * analyseRecording in octaves (`octaveOptions` added) and in one-third octaves, from one decoding
 * and one deconvolution: the same two results as two separate calls, for the cost of one
 * preparation — but for the thirds' curves and reflections, which are not computed (they do not
 * depend on the bands: the octave result carries them).
 */
export function analyseRecordingInOctavesAndThirds(
	bytes: Uint8Array,
	options: Omit<RecordingAnalysisOptions, 'bands'> = {},
	octaveOptions: Omit<AnalysisOptions, 'bands'> = {}
): { octaves: AnalysisResult; thirds: AnalysisResult } {
	const decoded = decodeWav(bytes, { channel: options.channel, maxDurationS: options.maxDurationS });
	const clock = createStageClock(options.onStage);
	const { impulseResponse, provenance } = prepareRecording(decoded, options, clock);
	clock.report();
	const octaves = analyse(impulseResponse, decoded.sampleRate, { ...options, ...octaveOptions, bands: 'octave' }, provenance);
	const thirds = analyse(impulseResponse, decoded.sampleRate, { ...options, bands: 'third', curves: false }, provenance, undefined, false);
	return { octaves, thirds };
}

/** The impulse response of a decoded recording (deconvolved when the played sweep is given) and what is known of it. */
function prepareRecording(
	decoded: DecodedWav,
	options: RecordingAnalysisOptions,
	clock: ReturnType<typeof createStageClock>
): { impulseResponse: Float64Array; provenance: Provenance } {
	const warnings: AnalysisWarning[] = decoded.warnings.map((message) => ({ code: 'clipping', band: null, message }));
	let impulseResponse = decoded.samples;
	let deconvolution: DeconvolutionSummary | null = null;
	let lengths: Pick<Provenance, 'fullBandLength' | 'completeLengthAt'> = {};
	const reference = options.reference;
	if (reference && options.referenceSampleRate !== undefined && options.referenceSampleRate !== decoded.sampleRate) {
		throw new AnalysisInputError(
			'sample_rate_mismatch',
			`the reference sweep is at ${options.referenceSampleRate} Hz but the recording at ${decoded.sampleRate} Hz`
		);
	}
	if (reference) {
		const result = clock.time('deconvolution', () => deconvolveSweep(decoded.samples, reference, decoded.sampleRate, options.sweep ?? {}));
		impulseResponse = result.impulseResponse;
		lengths = { fullBandLength: result.fullBandLength, completeLengthAt: (frequencyHz) => completeLengthAt(result, frequencyHz) };
		deconvolution = {
			peakLagS: result.peakLagS,
			f1Hz: result.sweep.f1Hz,
			f2Hz: result.sweep.f2Hz,
			harmonics: result.harmonics
		};
	}
	return {
		impulseResponse,
		provenance: { channels: decoded.channels, durationS: decoded.durationS, clipping: decoded.clipping, warnings, deconvolution, ...lengths }
	};
}
