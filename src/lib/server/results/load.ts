// Stored analyses → the results model: a visit's positions and average, a room's comparison.
import type { Knex } from 'knex';
import { positionFromAnalysis } from '../../results/position';
import { summariseSession } from '../../results/session';
import { compareSessions } from '../../results/comparison';
import type { ComparisonModel, PositionResult, RoomFacts, SessionSummary } from '../../results/types';
import { analysedCapturesOfSession } from '../queries/analyses';
import { getRoom } from '../queries/rooms';
import { getSession } from '../queries/sessions';
import type { ComparisonRow } from '../queries/reviews';

/** The latest analysed capture of each position of a visit, as results. */
export async function loadPositionResults(k: Knex, sessionId: number): Promise<PositionResult[]> {
	const seen = new Set<string>();
	const results: PositionResult[] = [];
	for (const a of await analysedCapturesOfSession(k, sessionId)) {
		if (seen.has(a.positionLabel)) continue; // an older capture of the same position
		seen.add(a.positionLabel);
		results.push(positionFromAnalysis(a.captureId, a.positionLabel, a.metrics, a.curves, { sourceLabel: a.sourceLabel, micLabel: a.micLabel }));
	}
	return results;
}

export async function loadSessionSummary(k: Knex, sessionId: number): Promise<SessionSummary> {
	const s = (await getSession(k, sessionId))!;
	return summariseSession({ sessionId, conditionLabel: s.conditionLabel, measuredOn: s.measuredOn }, await loadPositionResults(k, sessionId));
}

export async function roomFacts(k: Knex, roomId: number): Promise<RoomFacts> {
	const r = (await getRoom(k, roomId))!;
	return { name: r.name, lengthM: r.lengthM, widthM: r.widthM, heightM: r.heightM, volumeM3: r.volumeM3, roomUse: r.roomUse };
}

export async function loadComparisonModel(k: Knex, c: ComparisonRow): Promise<ComparisonModel> {
	const [room, baseline, treated] = await Promise.all([roomFacts(k, c.roomId), loadSessionSummary(k, c.baselineSessionId), loadSessionSummary(k, c.treatedSessionId)]);
	return compareSessions(room, baseline, treated);
}
