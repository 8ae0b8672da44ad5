/** Public API of the analysis engine: pure TypeScript, usable on the server, in workers and in the browser. */
export { analyseImpulseResponse, analyseRecording } from './analyse';
export type {
	AnalysisCurves,
	AnalysisOptions,
	AnalysisQuality,
	AnalysisResult,
	AnalysisStage,
	AnalysisWarning,
	BandMetrics,
	DecayCurve,
	DecayLineFit,
	DecayMetricValues,
	DeconvolutionSummary,
	RecordingAnalysisOptions,
	SmoothingKey
} from './types';
export { ENGINE_VERSION } from './version';
export { AnalysisInputError, isAnalysisInputError, type AnalysisInputErrorCode } from './errors';

export { decodeWav, encodeWav, detectClipping, type DecodedWav, type DecodeWavOptions, type EncodedBitDepth, type ClippingSummary } from './wav';
export { RealFftPlan, fftSizeFor } from './fft';
export {
	generateExponentialSweep,
	exponentialSweepPhase,
	harmonicLeadS,
	type ExponentialSweep,
	type ExponentialSweepOptions
} from './sweep';
export {
	deconvolveSweep,
	deconvolveFull,
	estimateSweepLaw,
	type DeconvolutionOptions,
	type DeconvolutionResult,
	type FullDeconvolution,
	type HarmonicProduct,
	type SweepLaw
} from './deconvolve';
export {
	analysisBands,
	bandAt,
	bandEdgesHz,
	exactMidbandHz,
	nominalFrequencyHz,
	OCTAVE_RATIO,
	type Band,
	type BandKind
} from './bands';
export {
	createBandFilterBank,
	designButterworthBandpass,
	zeroPhasePassEdges,
	sectionsPowerGain,
	filterForwardInPlace,
	filterBackwardInPlace,
	BAND_FILTER_ORDER,
	type BandFilter,
	type BandFilterBank,
	type SecondOrderSections
} from './filters';
export { findImpulseStart, findDirectSoundPeak, START_POINT_THRESHOLD_DB } from './onset';
export { schroederDecay, exponentialTailEnergy } from './schroeder';
export { estimateNoiseFloor, type NoiseFloorEstimate, type NoiseFloorOptions } from './lundeby';
export { fitDecayRange, curvaturePercent, EVALUATION_RANGES, type DecayFit, type DecayMetric, type EvaluationRange } from './decay-fit';
export { energyParameters, type EnergyParameters, type DecayTail } from './energy';
export { REQUIRED_PEAK_TO_NOISE_DB, FILTER_BIAS_MIN_BT, CURVATURE_LIMIT_PERCENT, isFilterBiased } from './quality';
export { analyseDecay, type DecayAnalysis, type BandProblem } from './band-metrics';

// Envelope, reflections, response, time–frequency, room, targets and comparison.
export * from './envelope';
export * from './reflections';
export * from './response';
export * from './timefrequency';
export * from './room';
export * from './targets';
export * from './compare';
