// What the results pages draw, cut out of the results model: the data of the visit page and of
// the comparison and report pages. A page is sent its responses at the default smoothing and its
// octave-band tables; another smoothing and the one-third-octave tables are fetched when a person
// asks for them, from the visit's and the comparison's `responses` and `bands` API routes, which
// answer in the shapes below. Pure, so the server and the browser share it.
import type { BandKind } from '../analysis/bands';
import type { AveragedBand, BandDifference } from '../analysis/compare';
import type { BandMetrics, SmoothingKey } from '../analysis/types';
import type { GradeAssessment } from './grade';
import { midFrequencyReverberation, type MidFrequencyReverberation } from './reverberation';
import type { VisitStatistics } from './statistics';
import { matchedStrongReflections } from './summary';
import type { BandJudgement, ComparisonModel, PositionOutlier, SessionSummary } from './types';

/** The smoothing a results page's response chart opens with. */
export const DEFAULT_SMOOTHING: SmoothingKey = '6';
/** The smoothing of a matched position's own responses on the comparison page (that overlay has no picker). */
export const POSITION_OVERLAY_SMOOTHING: SmoothingKey = '6';
/** The metrics the results tables offer, per band and position. */
export const TABLE_METRICS = ['t30S', 't20S', 'edtS', 'c80Db', 'c50Db'] as const;
export type TableMetric = (typeof TABLE_METRICS)[number];

/** One response at one smoothing. */
export interface SmoothedCurve {
	freqHz: number[];
	db: number[];
}

/** A visit's responses at one smoothing: each position's and their average (GET /api/sessions/:id/responses). */
export interface VisitResponses {
	smoothing: SmoothingKey;
	positions: ({ captureId: number; positionLabel: string } & SmoothedCurve)[];
	average: SmoothedCurve | null;
}

export type PositionBandValues = Pick<BandMetrics, 'centerHz' | TableMetric>;

/** A visit's band tables of one kind (GET /api/sessions/:id/bands): each position's values, their average and spread. */
export interface VisitBands {
	bandKind: BandKind;
	/** Every analysed position, in the visit's order; `bands` is empty for one without bands of this kind. */
	positions: { captureId: number; positionLabel: string; bands: PositionBandValues[] }[];
	average: AveragedBand[];
	statistics: VisitStatistics;
}

/** What the visit page draws of a visit's results. */
export interface VisitResultsView {
	sessionId: number;
	/** Names this state of the results: the entity tag of the routes that answer the rest. */
	tag: string;
	responses: VisitResponses;
	outliers: PositionOutlier[];
	/** The measurement grade (from the octave bands). */
	grade: GradeAssessment;
	octaves: VisitBands;
	/** Whether the visit has one-third-octave tables to ask for. */
	hasThirds: boolean;
}

/** A comparison's averaged responses at one smoothing (GET /api/comparisons/:id/responses). */
export interface ComparisonResponses {
	smoothing: SmoothingKey;
	before: SmoothedCurve | null;
	after: SmoothedCurve | null;
}

/** A comparison's band-by-band tables of one kind (GET /api/comparisons/:id/bands). */
export interface ComparisonBands {
	bandKind: BandKind;
	differences: BandDifference[];
	judgements: BandJudgement[];
}

/** One visit of a comparison, as its pages name it. */
export interface ComparisonSide {
	sessionId: number;
	conditionLabel: string;
	measuredOn: string;
}

/** What the comparison and report pages draw of a comparison. */
export interface ComparisonView {
	/** Names this state of the comparison: the entity tag of the routes that answer the rest. */
	tag: string;
	room: ComparisonModel['room'];
	baseline: ComparisonSide;
	treated: ComparisonSide;
	matchedPositions: string[];
	baselineOnly: string[];
	treatedOnly: string[];
	responses: ComparisonResponses;
	/** The octave tables, with the metrics the pages show (and the judgements of T30 and T20, which they quote). */
	octaves: ComparisonBands;
	hasThirds: boolean;
	/**
	 * T_mid of the treated visit's average over all its positions: where the room-mode marks stop
	 * (the Schroeder frequency takes it).
	 */
	treatedMid: MidFrequencyReverberation | null;
	target: ComparisonModel['target'];
	/** The treated visit's verdict per band against the target. */
	verdictsAfter: ComparisonModel['verdicts']['after'];
	summary: string[];
	/** The matched positions one by one, with the metrics the table offers. */
	positionDifferences: { positionLabel: string; differences: BandDifference[] }[];
	/** Each matched position's own responses at POSITION_OVERLAY_SMOOTHING. */
	positionResponses: { positionLabel: string; before: SmoothedCurve | null; after: SmoothedCurve | null }[];
	matchedStatistics: Record<'baseline' | 'treated', { grade: GradeAssessment; midFrequency: MidFrequencyReverberation | null }>;
	/** Strong early reflections per matched position, before and after. */
	strongReflections: { before: number | null; after: number | null };
}

type Response = { freqHz: number[]; smoothed: Record<SmoothingKey, number[]> };

/** The same frequency grid as one array, so page data carries each distinct grid once. */
function gridSharer(): (freqHz: number[]) => number[] {
	const grids: number[][] = [];
	return (freqHz) => {
		const same = grids.find((g) => g.length === freqHz.length && g.every((f, i) => f === freqHz[i]));
		if (same) return same;
		grids.push(freqHz);
		return freqHz;
	};
}

function curveOf(r: Response, smoothing: SmoothingKey, share: (f: number[]) => number[]): SmoothedCurve {
	return { freqHz: share(r.freqHz), db: r.smoothed[smoothing] };
}

function bandValues(b: BandMetrics): PositionBandValues {
	return { centerHz: b.centerHz, t30S: b.t30S, t20S: b.t20S, edtS: b.edtS, c80Db: b.c80Db, c50Db: b.c50Db };
}

export function visitResponses(s: SessionSummary, smoothing: SmoothingKey): VisitResponses {
	const share = gridSharer();
	return {
		smoothing,
		positions: s.positions.map((p) => ({ captureId: p.captureId, positionLabel: p.positionLabel, ...curveOf(p.response, smoothing, share) })),
		average: s.averageResponse && curveOf(s.averageResponse, smoothing, share)
	};
}

/** The visit's band tables of one kind; null when no position has bands of that kind. */
export function visitBands(s: SessionSummary, bandKind: BandKind): VisitBands | null {
	const source = bandKind === 'octave' ? { average: s.average, statistics: s.statistics } : s.thirds;
	if (!source) return null;
	return {
		bandKind,
		positions: s.positions.map((p) => ({
			captureId: p.captureId,
			positionLabel: p.positionLabel,
			bands: ((bandKind === 'octave' ? p.bands : p.thirdBands) ?? []).map(bandValues)
		})),
		average: source.average,
		statistics: source.statistics
	};
}

export function visitResultsView(s: SessionSummary, tag: string): VisitResultsView {
	return {
		sessionId: s.sessionId,
		tag,
		responses: visitResponses(s, DEFAULT_SMOOTHING),
		outliers: s.outliers,
		grade: s.statistics.grade,
		octaves: visitBands(s, 'octave')!,
		hasThirds: s.thirds !== null
	};
}

export function comparisonResponses(model: ComparisonModel, smoothing: SmoothingKey): ComparisonResponses {
	const share = gridSharer();
	const of = (s: SessionSummary) => s.averageResponse && curveOf(s.averageResponse, smoothing, share);
	return { smoothing, before: of(model.baseline), after: of(model.treated) };
}

export function comparisonBands(model: ComparisonModel, bandKind: BandKind): ComparisonBands | null {
	const source = bandKind === 'octave' ? { differences: model.differences, judgements: model.judgements } : model.thirds;
	return source && { bandKind, differences: source.differences, judgements: source.judgements };
}

const only = <V>(metrics: Record<string, V>, keys: readonly string[]): Record<string, V> => Object.fromEntries(keys.filter((m) => m in metrics).map((m) => [m, metrics[m]]));
const withTableMetrics = (d: BandDifference): BandDifference => ({ centerHz: d.centerHz, metrics: only(d.metrics, TABLE_METRICS) });
/** The metrics whose judgements the pages quote: reverberation, T30 or T20 where T30 is missing (reverberationJudgement). */
const JUDGED_METRICS = ['t30S', 't20S'] as const;

/** Band tables with what the pages show of them. */
function drawnBands(b: ComparisonBands): ComparisonBands {
	return { bandKind: b.bandKind, differences: b.differences.map(withTableMetrics), judgements: b.judgements.map((j) => ({ centerHz: j.centerHz, metrics: only(j.metrics, JUDGED_METRICS) })) };
}

export function comparisonView(model: ComparisonModel, tag: string): ComparisonView {
	const responses = comparisonResponses(model, DEFAULT_SMOOTHING);
	// The overlay's curves share the averages' grid where they are on it.
	const share = gridSharer();
	for (const c of [responses.before, responses.after]) if (c) share(c.freqHz);
	const ownResponse = (s: SessionSummary, label: string) => {
		const p = s.positions.find((x) => x.positionLabel === label);
		return p ? curveOf(p.response, POSITION_OVERLAY_SMOOTHING, share) : null;
	};
	const side = (s: SessionSummary): ComparisonSide => ({ sessionId: s.sessionId, conditionLabel: s.conditionLabel, measuredOn: s.measuredOn });
	const stats = (v: VisitStatistics) => ({ grade: v.grade, midFrequency: v.midFrequency });
	return {
		tag,
		room: model.room,
		baseline: side(model.baseline),
		treated: side(model.treated),
		matchedPositions: model.matchedPositions,
		baselineOnly: model.baselineOnly,
		treatedOnly: model.treatedOnly,
		responses,
		octaves: drawnBands(comparisonBands(model, 'octave')!),
		hasThirds: model.thirds !== null,
		treatedMid: midFrequencyReverberation(model.treated.average.map((b) => ({ centerHz: b.centerHz, t30S: b.values.t30S?.mean, t20S: b.values.t20S?.mean }))),
		target: model.target,
		verdictsAfter: model.verdicts.after,
		summary: model.summary,
		positionDifferences: model.positionDifferences.map((p) => ({ positionLabel: p.positionLabel, differences: p.differences.map(withTableMetrics) })),
		positionResponses: model.matchedPositions.map((label) => ({ positionLabel: label, before: ownResponse(model.baseline, label), after: ownResponse(model.treated, label) })),
		matchedStatistics: { baseline: stats(model.matchedStatistics.baseline), treated: stats(model.matchedStatistics.treated) },
		strongReflections: matchedStrongReflections(model)
	};
}
