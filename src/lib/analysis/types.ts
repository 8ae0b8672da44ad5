/**
 * The analysis result and its options. A result is plain JSON (numbers, strings, arrays, null):
 * it is stored as is and sent to the browser.
 */
import type { BandKind } from './bands';
import type { DeconvolutionOptions, HarmonicProduct } from './deconvolve';
import type { DetectedReflection, Point3, RoomBox } from './reflections';
import type { ClippingSummary } from './wav';

export interface AnalysisOptions {
	bands?: BandKind;
	/** Air temperature, for delays ↔ path lengths of reflections (default 20 °C). */
	temperatureC?: number;
	/** With source and mic, detected reflections are named after the first-order images. */
	room?: RoomBox & { source?: Point3; mic?: Point3 };
	/** Lowest reflection level reported, dB re the direct sound (default −20). */
	reflectionThresholdDb?: number;
	/** With octave bands, also the 31.5 Hz and 16 kHz octaves where the record allows them (extra-octaves.ts); default false. */
	extraOctaves?: boolean;
	/**
	 * Chart curves (frequency responses, decay curves, ETC, waterfall): default true. With false
	 * they are left out, and `curves` holds empty ones — for callers that only want the figures.
	 */
	curves?: boolean;
	/** Called with the time each stage took (for benchmarks); not part of the result. */
	onStage?: (stage: AnalysisStage, milliseconds: number) => void;
}

export type AnalysisStage = 'decode' | 'deconvolution' | 'filtering' | 'decay' | 'curves' | 'reflections';

export interface RecordingAnalysisOptions extends AnalysisOptions {
	/** 0-based channel of the file to analyse. */
	channel?: number;
	maxDurationS?: number;
	/** The sweep that was played: the recording is deconvolved with it first. */
	reference?: Float64Array;
	/** Sample rate of the reference when it was read from a file: it must match the recording's. */
	referenceSampleRate?: number;
	/** The sweep's parameters when known (otherwise estimated from the reference). */
	sweep?: Pick<DeconvolutionOptions, 'f1Hz' | 'f2Hz' | 'durationS'>;
}

export interface DecayMetricValues<T> {
	edt: T;
	t20: T;
	t30: T;
}

export interface BandMetrics {
	/** Nominal mid-band frequency (ISO 266). */
	centerHz: number;
	/** Exact mid-band frequency (IEC 61260-1). */
	exactHz: number;
	edtS: number | null;
	t20S: number | null;
	t30S: number | null;
	c50Db: number | null;
	c80Db: number | null;
	d50: number | null;
	tsMs: number | null;
	/**
	 * Impulse response-to-noise ratio INR (Huszty & Sakamoto 2012): the depth of the Schroeder decay
	 * where it meets the background — the figure the T20/T30 requirements are checked against.
	 * Absent in results of engines before 2.0.
	 */
	inrDb?: number | null;
	/** The INR under its earlier name (engines before 2.0 stored a peak-to-noise ratio here). */
	peakToNoiseDb: number | null;
	/** Correlation coefficient of each fit (≈ −1 for a clean decay). */
	r: DecayMetricValues<number | null>;
	/** Non-linearity ξ = 1000·(1 − r²), ‰ (ISO 3382-2 Annex B). */
	xi: DecayMetricValues<number | null>;
	/** C = 100·(T30/T20 − 1), % (ISO 3382-2 Annex B). */
	curvaturePct: number | null;
	/** B·T too small for the band filter not to lengthen the decay (Jacobsen & Rindel 1987), or B < 20 Hz for the energy parameters. */
	biased: boolean;
}

export interface AnalysisWarning {
	code: string;
	/** Nominal band centre the warning is about, null for broadband or the whole capture. */
	band: number | null;
	message: string;
}

export interface DecayLineFit {
	startS: number;
	endS: number;
	interceptDb: number;
	slopeDbPerS: number;
}

export interface DecayCurve {
	centerHz: number | 'broadband';
	/** Time re the start point. */
	timesS: number[];
	/** Schroeder decay, dB re the total energy. */
	levelDb: number[];
	/** Background level re the band's squared peak. */
	noiseDb: number | null;
	/** Truncation point re the start point. */
	crosspointS: number | null;
	fits: Partial<DecayMetricValues<DecayLineFit>>;
}

export type SmoothingKey = '1' | '3' | '6' | '12' | '24';

export interface AnalysisCurves {
	/** Unsmoothed power response, 48 points per octave. */
	frequencyResponse: { freqHz: number[]; db: number[] };
	/** 1/N-octave smoothed versions on the same frequencies. */
	frequencyResponseSmoothed: Record<SmoothingKey, number[]>;
	decay: DecayCurve[];
	/** Energy–time curve, times re the direct sound, the first 80 ms, peak-preserving decimation. */
	etc: { timesMs: number[]; levelDb: number[] };
	waterfall: { timesMs: number[]; freqHz: number[]; levelsDb: number[][] };
}

export interface AnalysisQuality {
	clipping: ClippingSummary | null;
	/** Broadband INR (see BandMetrics.inrDb); absent before engine 2.0. */
	inrDb?: number | null;
	/** The broadband INR under its earlier name. */
	peakToNoiseDb: number | null;
	/** Broadband INR below what T30 needs. */
	lowDynamicRange: boolean;
	/**
	 * Broadband direct-to-reverberant energy ratio, dB: the first 2.5 ms after the direct-sound peak
	 * against the rest. Above 0 dB the direct sound dominates EDT and the energy parameters. Absent before 2.0.
	 */
	directToReverberantDb?: number | null;
	/** Nominal centres of the bands whose values are marked biased. */
	biasedBands: number[];
}

export interface DeconvolutionSummary {
	/** Delay of the linear response's peak in the recording. */
	peakLagS: number;
	f1Hz: number;
	f2Hz: number;
	harmonics: HarmonicProduct[];
}

export interface AnalysisResult {
	engineVersion: string;
	sampleRate: number;
	channels: number;
	durationS: number;
	bandKind: BandKind;
	/** Start point (ISO 3382-1 A.3.4) of the analysed impulse response. */
	directSoundS: number;
	/** Broadband INR (see BandMetrics.inrDb); absent before engine 2.0. */
	inrDb?: number | null;
	/** The broadband INR under its earlier name. */
	peakToNoiseDb: number | null;
	/**
	 * The broadband values are those of the span of the analysis bands (lowest band's lower edge to
	 * the highest's upper edge), so a broadband energy ratio is a ratio of the bands' summed energies.
	 */
	broadband: BandMetrics;
	bands: BandMetrics[];
	/** With octave bands, the one-third-octave bands of the same response (engine 2.1 and later). */
	thirdOctaveBands?: BandMetrics[];
	reflections: DetectedReflection[];
	warnings: AnalysisWarning[];
	curves: AnalysisCurves;
	quality: AnalysisQuality;
	deconvolution: DeconvolutionSummary | null;
}
