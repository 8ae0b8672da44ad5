// Stored analyses → the results model: a visit's positions and average, a room's comparison.
// Pages ask for these on every request while the analyses rarely change, so the parsed inputs of
// each analysis, each visit's summary and each comparison are kept in small caches keyed by the
// analysis rows they came from (see cache.ts).
import type { Knex } from 'knex';
import { positionFromAnalysis, type PositionCurvesInput, type PositionMetricsInput } from '../../results/position';
import { summariseSession } from '../../results/session';
import { compareSessions } from '../../results/comparison';
import type { ComparisonModel, PositionResult, RoomFacts, SessionMeta, SessionSummary } from '../../results/types';
import { comparisonView, visitResultsView, type ComparisonView, type VisitResultsView } from '../../results/drawn';
import { createHash, randomUUID } from 'node:crypto';
import { pack } from '../../packed';
import type { AnalysisWarning } from '../../analysis/types';
import { analysedCaptureRowsOfSession, analysedCaptureRowsOfSessions, responseInputsOfAnalyses, type AnalysedCaptureRow } from '../queries/analyses';
import { getRoom, type RoomRow } from '../queries/rooms';
import type { ListedCapture } from '../queries/captures';
import { sessionMetas } from '../queries/sessions';
import type { ComparisonRow } from '../queries/reviews';
import { deepFreeze, Lru } from './cache';

type ResponseInputs = { metrics: PositionMetricsInput; curves: PositionCurvesInput };

const inputsCache = new Lru<ResponseInputs>(256);
const summaryCache = new Lru<SessionSummary>(64);
const comparisonCache = new Lru<ComparisonModel>(32);

/** Drop every cached result (tests that change rows behind the service's back). */
export function clearResultCaches(): void {
	inputsCache.clear();
	summaryCache.clear();
	comparisonCache.clear();
}

const analysisKey = (a: Pick<AnalysedCaptureRow, 'analysisId' | 'analysedAt' | 'engineVersion'>) => `${a.analysisId}|${a.analysedAt}|${a.engineVersion}`;

/** The latest analysed capture of each position of a visit (older captures of a position left out). */
function latestPerPosition(rows: AnalysedCaptureRow[]): AnalysedCaptureRow[] {
	const seen = new Set<string>();
	return rows.filter((a) => !seen.has(a.positionLabel) && seen.add(a.positionLabel));
}

async function positionResults(k: Knex, rows: AnalysedCaptureRow[]): Promise<PositionResult[]> {
	const missing = rows.filter((a) => inputsCache.get(analysisKey(a)) === undefined);
	if (missing.length > 0) {
		const loaded = await responseInputsOfAnalyses(k, missing.map((a) => a.analysisId));
		for (const a of missing) {
			const inputs = loaded.get(a.analysisId);
			// Replaced meanwhile: the next request finds the new row.
			if (inputs) await inputsCache.through(analysisKey(a), () => inputs);
		}
	}
	return rows.flatMap((a) => {
		const inputs = inputsCache.get(analysisKey(a));
		return inputs ? [positionFromAnalysis(a.captureId, a.positionLabel, inputs.metrics, inputs.curves, { sourceLabel: a.sourceLabel, micLabel: a.micLabel })] : [];
	});
}

/** The latest analysed capture of each position of a visit, as results. */
export async function loadPositionResults(k: Knex, sessionId: number): Promise<PositionResult[]> {
	return positionResults(k, latestPerPosition(await analysedCaptureRowsOfSession(k, sessionId)));
}

type KeyedSummary = { key: string | null; summary: SessionSummary; latest: AnalysedCaptureRow[] };

async function summaryOf(k: Knex, meta: SessionMeta, rows: AnalysedCaptureRow[]): Promise<KeyedSummary> {
	const latest = latestPerPosition(rows);
	// The summary is worked out from these alone.
	const key = JSON.stringify([meta, latest.map((a) => [a.captureId, a.positionLabel, a.sourceLabel, a.micLabel, analysisKey(a)])]);
	const hit = summaryCache.get(key);
	if (hit) return { key, summary: hit, latest };
	const positions = await positionResults(k, latest);
	const summary = summariseSession(meta, positions);
	// An analysis replaced between the two queries: answer what was read, keep nothing.
	return positions.length === latest.length ? { key, summary: await summaryCache.through(key, () => summary), latest } : { key: null, summary, latest };
}

/** Visits' summaries with their cache keys, in the order asked, from two queries for them all; `known` skips reading their condition and date. */
async function sessionSummaries(k: Knex, sessionIds: number[], known: SessionMeta[] = []): Promise<KeyedSummary[]> {
	const unknown = sessionIds.filter((id) => !known.some((m) => m.sessionId === id));
	const [metas, rows] = await Promise.all([sessionMetas(k, unknown), analysedCaptureRowsOfSessions(k, sessionIds)]);
	return Promise.all(
		sessionIds.map((id) => {
			const meta = [...known, ...metas].find((m) => m.sessionId === id)!;
			return summaryOf(k, { sessionId: id, conditionLabel: meta.conditionLabel, measuredOn: meta.measuredOn }, rows.filter((r) => r.sessionId === id));
		})
	);
}

/** What a visit's results are read from, when its page has read it already. */
export interface KnownVisit {
	meta: SessionMeta;
	/** Its analysed captures (analysedRowsOf a listing of its captures). */
	rows?: AnalysedCaptureRow[];
}

async function sessionSummary(k: Knex, sessionId: number, known?: KnownVisit): Promise<KeyedSummary> {
	if (known?.rows) return summaryOf(k, known.meta, known.rows);
	return (await sessionSummaries(k, [sessionId], known ? [known.meta] : []))[0];
}

/**
 * The analysed captures of a visit's capture listing (by position label, then id) as the summary
 * reads them from the database: those analysed with a stored result, the newest of each position first.
 */
export function analysedRowsOf(listing: readonly ListedCapture[]): AnalysedCaptureRow[] {
	const byPosition = new Map<number, AnalysedCaptureRow[]>();
	for (const { capture, analysis, sourceLabel, micLabel } of listing) {
		if (capture.status !== 'analysed' || !analysis) continue;
		const row: AnalysedCaptureRow = {
			captureId: capture.id,
			positionLabel: capture.positionLabel,
			sourceLabel,
			micLabel,
			analysisId: analysis.id,
			engineVersion: analysis.engineVersion,
			analysedAt: analysis.createdAt instanceof Date ? analysis.createdAt.toISOString() : String(analysis.createdAt)
		};
		byPosition.set(capture.positionId, [row, ...(byPosition.get(capture.positionId) ?? [])]);
	}
	return [...byPosition.values()].flat();
}

/** A visit's results; the same object for as long as its analyses and labels stay the same (frozen). */
export async function loadSessionSummary(k: Knex, sessionId: number): Promise<SessionSummary> {
	return (await sessionSummary(k, sessionId)).summary;
}

export async function roomFacts(k: Knex, roomId: number): Promise<RoomFacts> {
	return factsOf((await getRoom(k, roomId))!);
}

const factsOf = (r: RoomRow): RoomFacts => ({ name: r.name, lengthM: r.lengthM, widthM: r.widthM, heightM: r.heightM, volumeM3: r.volumeM3, roomUse: r.roomUse });

/** What a comparison's page has read already: its room, and the condition and date of its visits. */
export interface KnownComparison {
	room?: RoomRow;
	visits?: SessionMeta[];
}

async function comparison(k: Knex, c: ComparisonRow, known: KnownComparison = {}): Promise<{ key: string | null; model: ComparisonModel; warnings: Map<number, AnalysisWarning[]> }> {
	const [room, [baseline, treated]] = await Promise.all([
		known.room ? factsOf(known.room) : roomFacts(k, c.roomId),
		sessionSummaries(k, [c.baselineSessionId, c.treatedSessionId], known.visits)
	]);
	// The quality warnings of the captures compared, read with their rows.
	const warnings = new Map([...baseline.latest, ...treated.latest].map((a) => [a.captureId, a.warnings ?? []]));
	if (baseline.key === null || treated.key === null) return { key: null, model: compareSessions(room, baseline.summary, treated.summary), warnings };
	const key = JSON.stringify([room, baseline.key, treated.key]);
	return { key, model: await comparisonCache.through(key, () => compareSessions(room, baseline.summary, treated.summary)), warnings };
}

export async function loadComparisonModel(k: Knex, c: ComparisonRow): Promise<ComparisonModel> {
	return (await comparison(k, c)).model;
}

/**
 * A strong entity tag naming what a cache key was made from; a result read while an analysis
 * was being replaced (no key) gets a tag of its own that nothing matches.
 */
function resultsTag(kind: 'v' | 'c', key: string | null): string {
	return `"${kind}${key === null ? randomUUID() : createHash('sha256').update(key).digest('base64url').slice(0, 24)}"`;
}

// The views are worked out once per cached summary or comparison (frozen, so they can be shared),
// and serialized for the page data then too (lib/packed.ts).
const visitViews = new WeakMap<SessionSummary, VisitResultsView>();
const comparisonViews = new WeakMap<ComparisonModel, ComparisonView>();

/** A visit's results with their entity tag: the `responses` and `bands` routes answer from these. */
export async function loadSessionResults(k: Knex, sessionId: number, known?: KnownVisit): Promise<{ summary: SessionSummary; tag: string }> {
	const { key, summary } = await sessionSummary(k, sessionId, known);
	return { summary, tag: resultsTag('v', key) };
}

/** What the visit page draws of its results (see results/drawn.ts); `known`: what its page has read of the visit already. */
export async function loadVisitResultsView(k: Knex, sessionId: number, known?: KnownVisit): Promise<VisitResultsView> {
	const { summary, tag } = await loadSessionResults(k, sessionId, known);
	let view = visitViews.get(summary);
	if (!view) visitViews.set(summary, (view = pack(deepFreeze(visitResultsView(summary, tag)))));
	return view;
}

/** A comparison with its entity tag; `room`: its room, already read. */
export async function loadComparisonResults(k: Knex, c: ComparisonRow, known?: KnownComparison): Promise<{ model: ComparisonModel; tag: string; warnings: Map<number, AnalysisWarning[]> }> {
	const { key, model, warnings } = await comparison(k, c, known);
	return { model, tag: resultsTag('c', key), warnings };
}

/** What the comparison and report pages draw of a comparison, with its entity tag inside. */
export function comparisonViewOf(model: ComparisonModel, tag: string): ComparisonView {
	let view = comparisonViews.get(model);
	if (!view) comparisonViews.set(model, (view = pack(deepFreeze(comparisonView(model, tag)))));
	return view;
}
