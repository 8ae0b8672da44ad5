// The shapes of measurement results as the pages, exports and reports use them: one position's
// stored analysis, a visit's spatial average, and the comparison of two visits of a room.
import type { BandMetrics, SmoothingKey } from '../analysis/types';
import type { DetectedReflection } from '../analysis/reflections';
import type { AveragedBand, BandDifference } from '../analysis/compare';
import type { BandVerdict, TargetBand } from '../analysis/targets';
import type { DifferenceJudgement } from './spread';
import type { VisitStatistics } from './statistics';

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
	/** Loudspeaker and microphone labels of the position row, for the measurement grade (absent: unlabelled). */
	sourceLabel?: string | null;
	micLabel?: string | null;
	/** One-third-octave bands of the same capture, when the engine computed them (2.1 and later). */
	thirdBands?: BandMetrics[] | null;
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
	/** Spread per band, ISO 3382-2 uncertainty of T20/T30, T_mid and the measurement grade. */
	statistics: VisitStatistics;
	/** The same over the positions' one-third-octave bands; null when no position has them. */
	thirds: { average: AveragedBand[]; statistics: VisitStatistics } | null;
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

/** Per band, each metric's before/after difference judged against the spread and the JND. */
export interface BandJudgement {
	centerHz: number;
	metrics: Record<string, DifferenceJudgement>;
}

/** One matched position, before and after, band by band. */
export interface PositionComparison {
	positionLabel: string;
	differences: BandDifference[];
	broadband: BandDifference['metrics'];
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
	/** Each band's differences judged against the spread of the matched positions. */
	judgements: BandJudgement[];
	/** The matched positions one by one. */
	positionDifferences: PositionComparison[];
	/** The grade of each visit over the matched positions, and each visit's statistics over them. */
	matchedStatistics: { baseline: VisitStatistics; treated: VisitStatistics };
	/** The same comparison in one-third-octave bands, when both visits have them. */
	thirds: { differences: BandDifference[]; judgements: BandJudgement[] } | null;
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

