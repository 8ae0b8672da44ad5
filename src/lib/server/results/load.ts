// Stored analyses → the results model: a visit's positions and average, a room's comparison.
// Pages ask for these on every request while the analyses rarely change, so the parsed inputs of
// each analysis, each visit's summary and each comparison are kept in small caches keyed by the
// analysis rows they came from (see cache.ts).
import type { Knex } from 'knex';
import { positionFromAnalysis, type PositionCurvesInput, type PositionMetricsInput } from '../../results/position';
import { summariseSession } from '../../results/session';
import { compareSessions } from '../../results/comparison';
import type { ComparisonModel, PositionResult, RoomFacts, SessionSummary } from '../../results/types';
import { analysedCaptureRowsOfSession, responseInputsOfAnalyses, type AnalysedCaptureRow } from '../queries/analyses';
import { getRoom } from '../queries/rooms';
import { getSession } from '../queries/sessions';
import type { ComparisonRow } from '../queries/reviews';
import { Lru } from './cache';

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

async function sessionSummary(k: Knex, sessionId: number): Promise<{ key: string | null; summary: SessionSummary }> {
	const [s, rows] = await Promise.all([getSession(k, sessionId), analysedCaptureRowsOfSession(k, sessionId)]);
	const latest = latestPerPosition(rows);
	const meta = { sessionId, conditionLabel: s!.conditionLabel, measuredOn: s!.measuredOn };
	// The summary is worked out from these alone.
	const key = JSON.stringify([meta, latest.map((a) => [a.captureId, a.positionLabel, a.sourceLabel, a.micLabel, analysisKey(a)])]);
	const hit = summaryCache.get(key);
	if (hit) return { key, summary: hit };
	const positions = await positionResults(k, latest);
	const summary = summariseSession(meta, positions);
	// An analysis replaced between the two queries: answer what was read, keep nothing.
	return positions.length === latest.length ? { key, summary: await summaryCache.through(key, () => summary) } : { key: null, summary };
}

/** A visit's results; the same object for as long as its analyses and labels stay the same (frozen). */
export async function loadSessionSummary(k: Knex, sessionId: number): Promise<SessionSummary> {
	return (await sessionSummary(k, sessionId)).summary;
}

export async function roomFacts(k: Knex, roomId: number): Promise<RoomFacts> {
	const r = (await getRoom(k, roomId))!;
	return { name: r.name, lengthM: r.lengthM, widthM: r.widthM, heightM: r.heightM, volumeM3: r.volumeM3, roomUse: r.roomUse };
}

export async function loadComparisonModel(k: Knex, c: ComparisonRow): Promise<ComparisonModel> {
	const [room, baseline, treated] = await Promise.all([roomFacts(k, c.roomId), sessionSummary(k, c.baselineSessionId), sessionSummary(k, c.treatedSessionId)]);
	if (baseline.key === null || treated.key === null) return compareSessions(room, baseline.summary, treated.summary);
	return comparisonCache.through(JSON.stringify([room, baseline.key, treated.key]), () => compareSessions(room, baseline.summary, treated.summary));
}

/**
 * A visit's summary as pages draw it: the response charts plot only the smoothed curves, so the
 * unsmoothed levels (a seventh of each response) are not sent, and responses on the same
 * frequencies share one array, which the page data then carries once; exports use the whole summary.
 */
export function withoutRawLevels(s: SessionSummary): SessionSummary {
	const grids: number[][] = [];
	const shared = (freqHz: number[]) => {
		const same = grids.find((g) => g.length === freqHz.length && g.every((f, i) => f === freqHz[i]));
		if (same) return same;
		grids.push(freqHz);
		return freqHz;
	};
	return {
		...s,
		positions: s.positions.map((p) => ({ ...p, response: { ...p.response, freqHz: shared(p.response.freqHz), db: [] } })),
		averageResponse: s.averageResponse && { ...s.averageResponse, freqHz: shared(s.averageResponse.freqHz), db: [] }
	};
}
