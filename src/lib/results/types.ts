// The shapes of measurement results as the pages, exports and reports use them: one position's
// stored analysis, a visit's spatial average, and the comparison of two visits of a room.
import type { BandMetrics, SmoothingKey } from '../analysis/types';
import type { DetectedReflection } from '../analysis/reflections';
import type { AveragedBand, BandDifference } from '../analysis/compare';
import type { BandVerdict, TargetBand } from '../analysis/targets';

/** The metrics averaged over positions and compared between visits. */
export const AVERAGED_METRICS = ['edtS', 't20S', 't30S', 'c50Db', 'c80Db', 'd50', 'tsMs'] as const;
export type AveragedMetric = (typeof AVERAGED_METRICS)[number];

/** One analysed capture, as stored (metrics + the curves the comparison needs). */
export interface PositionResult {
	captureId: number;
	positionLabel: string;
	broadband: BandMetrics;
	bands: BandMetrics[];
	peakToNoiseDb: number | null;
	/** 48 points per octave; `smoothed` holds the 1/N-octave versions on the same grid. */
	response: { freqHz: number[]; db: number[]; smoothed: Record<SmoothingKey, number[]> };
	reflections: DetectedReflection[];
}

export interface SessionMeta {
	sessionId: number;
	conditionLabel: string;
	measuredOn: string; // YYYY-MM-DD
}

export interface PositionOutlier {
	positionLabel: string;
	centerHz: number;
	metric: AveragedMetric;
	value: number;
	referenceMean: number;
	/** (value − referenceMean) / referenceMean */
	deviation: number;
}

export interface SessionSummary extends SessionMeta {
	positions: PositionResult[];
	/** Arithmetic mean per band over positions (ISO 3382-2), with the count behind each number. */
	average: AveragedBand[];
	broadbandAverage: AveragedBand['values'];
	/** Power average of the positions' responses, with the same smoothings. */
	averageResponse: { freqHz: number[]; db: number[]; smoothed: Record<SmoothingKey, number[]> } | null;
	outliers: PositionOutlier[];
}

export interface RoomFacts {
	name: string;
	lengthM: number;
	widthM: number;
	heightM: number;
	volumeM3: number;
	roomUse: string;
}

export interface ProblemBandView {
	id: number;
	fLoHz: number;
	fHiHz: number;
	tLoMs: number | null;
	tHiMs: number | null;
	severity: 'minor' | 'moderate' | 'severe';
	note: string;
	status: 'open' | 'addressed';
}

export interface ComparisonModel {
	room: RoomFacts;
	baseline: SessionSummary;
	treated: SessionSummary;
	/** Position labels measured in both visits: only these are compared. */
	matchedPositions: string[];
	baselineOnly: string[];
	treatedOnly: string[];
	/** Band-by-band before/after of the matched positions' averages. */
	differences: BandDifference[];
	target: TargetBand[];
	verdicts: { before: BandVerdict[]; after: BandVerdict[] };
	/** Plain-words sentences for people without acoustics training. */
	summary: string[];
}

/** T30 when it could be measured, T20 in its place otherwise. */
export type ReverberationMetric = 't30S' | 't20S';

export interface ReverberationValue {
	valueS: number | null;
	/** The metric behind valueS; null when neither could be measured. */
	metric: ReverberationMetric | null;
}

/** A verdict that also says which metric it was judged on. */
export interface SourcedVerdict extends BandVerdict {
	metric: ReverberationMetric | null;
}

/** The comparison with the verdicts' metrics and the matched-position averages it was computed from. */
export interface ComparisonResult extends ComparisonModel {
	verdicts: { before: SourcedVerdict[]; after: SourcedVerdict[] };
	/** Both visits averaged over the matched positions only (what differences and verdicts use). */
	matchedAverage: { baseline: AveragedBand[]; treated: AveragedBand[] };
}
