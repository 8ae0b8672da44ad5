import type { Knex } from 'knex';
import type { ProblemBandView } from '../../results/types';
import type { ProjectRow } from '../../types/projects';
import { roomColumns, sessionCount, type RoomRow } from './rooms';
import { toIsoDate } from './sessions';
import { sharedPlanColumn } from './plans';

export interface ComparisonRow {
	id: number;
	roomId: number;
	baselineSessionId: number;
	treatedSessionId: number;
	title: string;
	advice: string | null;
	shareQualityNotes: boolean;
	publishedAt: Date | null;
	createdAt: Date;
}

const comparisonColumns = {
	id: 'id',
	roomId: 'room_id',
	baselineSessionId: 'baseline_session_id',
	treatedSessionId: 'treated_session_id',
	title: 'title',
	advice: 'advice',
	shareQualityNotes: 'share_quality_notes',
	publishedAt: 'published_at',
	createdAt: 'created_at'
};

const shapeComparison = (r: Record<string, unknown>): ComparisonRow => ({ ...(r as unknown as ComparisonRow), shareQualityNotes: Boolean(r.shareQualityNotes) });

export async function listComparisons(k: Knex, roomId: number, onlyPublished = false): Promise<ComparisonRow[]> {
	const q = k('comparisons').where({ room_id: roomId }).select(comparisonColumns).orderBy('created_at', 'desc');
	if (onlyPublished) q.whereNotNull('published_at');
	return (await q).map(shapeComparison);
}

export async function getComparison(k: Knex, id: number): Promise<ComparisonRow | undefined> {
	const r = await k('comparisons').where({ id }).first(comparisonColumns);
	return r ? shapeComparison(r) : undefined;
}

const prefixed = (prefix: string, columns: Record<string, string>, table = '') =>
	Object.fromEntries(Object.entries(columns).map(([key, column]) => [`${prefix}${key}`, `${table}${column}`]));
const unprefixed = (prefix: string, r: Record<string, unknown>) =>
	Object.fromEntries(Object.entries(r).filter(([key]) => key.startsWith(prefix)).map(([key, v]) => [key.slice(prefix.length), v]));

/** A comparison with its room, project and the condition and date of its two visits, as its pages head themselves, in one query. */
export async function getComparisonHeader(k: Knex, id: number): Promise<
	| {
			comparison: ComparisonRow;
			room: RoomRow;
			project: Pick<ProjectRow, 'id' | 'organizationId' | 'organizationName' | 'name' | 'clientName'>;
			visits: { sessionId: number; conditionLabel: string; measuredOn: string }[];
			/** Whether the room's plan is to be shown in its report (hasSharedPlan). */
			sharedPlan: boolean;
	  }
	| undefined
> {
	const r = await k('comparisons as cm')
		.join('rooms as r', 'r.id', 'cm.room_id')
		.join('projects as p', 'p.id', 'r.project_id')
		.join('organizations as o', 'o.id', 'p.organization_id')
		.join('sessions as sb', 'sb.id', 'cm.baseline_session_id')
		.join('sessions as st', 'st.id', 'cm.treated_session_id')
		.where('cm.id', id)
		.first(prefixed('cm_', comparisonColumns, 'cm.'))
		.select(prefixed('r_', roomColumns))
		.select(sessionCount(k))
		.select({ p_id: 'p.id', p_organizationId: 'p.organization_id', p_organizationName: 'o.name', p_name: 'p.name', p_clientName: 'p.client_name' })
		.select({ sb_condition: 'sb.condition_label', sb_measuredOn: 'sb.measured_on', st_condition: 'st.condition_label', st_measuredOn: 'st.measured_on' })
		.select(sharedPlanColumn(k, 'r.id', 'sharedPlan'));
	if (!r) return undefined;
	const comparison = shapeComparison(unprefixed('cm_', r));
	return {
		comparison,
		room: { ...(unprefixed('r_', r) as unknown as RoomRow), sessionCount: Number(r.sessionCount) },
		project: unprefixed('p_', r) as unknown as Pick<ProjectRow, 'id' | 'organizationId' | 'organizationName' | 'name' | 'clientName'>,
		visits: [
			{ sessionId: comparison.baselineSessionId, conditionLabel: r.sb_condition, measuredOn: toIsoDate(r.sb_measuredOn) },
			{ sessionId: comparison.treatedSessionId, conditionLabel: r.st_condition, measuredOn: toIsoDate(r.st_measuredOn) }
		],
		sharedPlan: Boolean(Number(r.sharedPlan))
	};
}

export async function createComparison(k: Knex, c: { roomId: number; baselineSessionId: number; treatedSessionId: number; title: string; createdBy: number }): Promise<number> {
	const [id] = await k('comparisons').insert({
		room_id: c.roomId,
		baseline_session_id: c.baselineSessionId,
		treated_session_id: c.treatedSessionId,
		title: c.title,
		created_by: c.createdBy
	});
	return id;
}

const bandColumns = {
	id: 'id',
	fLoHz: 'f_lo_hz',
	fHiHz: 'f_hi_hz',
	tLoMs: 't_lo_ms',
	tHiMs: 't_hi_ms',
	severity: 'severity',
	note: 'note',
	status: 'status'
};

/** A room's problem bands, shown on every chart of that room. */
export async function listProblemBands(k: Knex, roomId: number): Promise<ProblemBandView[]> {
	return k('problem_bands').where({ room_id: roomId }).orderBy('f_lo_hz').select(bandColumns);
}

export async function getProblemBand(k: Knex, id: number): Promise<(ProblemBandView & { roomId: number }) | undefined> {
	return k('problem_bands').where({ id }).first({ ...bandColumns, roomId: 'room_id' });
}

export async function createProblemBand(
	k: Knex,
	roomId: number,
	b: { fLoHz: number; fHiHz: number; tLoMs: number | null; tHiMs: number | null; severity: string; note: string; comparisonId: number | null; authorId: number }
): Promise<number> {
	const [id] = await k('problem_bands').insert({
		room_id: roomId,
		comparison_id: b.comparisonId,
		f_lo_hz: b.fLoHz,
		f_hi_hz: b.fHiHz,
		t_lo_ms: b.tLoMs,
		t_hi_ms: b.tHiMs,
		severity: b.severity,
		note: b.note,
		author_id: b.authorId
	});
	return id;
}

export interface PublishedReport {
	id: number;
	title: string;
	roomId: number;
	roomName: string;
	projectName: string;
	publishedAt: Date;
}

/** Published reports of the projects a client belongs to, the latest first. */
export async function listReportsForClient(k: Knex, userId: number): Promise<PublishedReport[]> {
	return k('comparisons as c')
		.join('rooms as r', 'r.id', 'c.room_id')
		.join('projects as p', 'p.id', 'r.project_id')
		.join('project_members as pm', 'pm.project_id', 'p.id')
		.join('memberships as m', (j) => j.on('m.organization_id', '=', 'p.organization_id').andOn('m.user_id', '=', 'pm.user_id'))
		.where({ 'pm.user_id': userId, 'm.role': 'client' })
		.whereNotNull('c.published_at')
		.orderBy('c.published_at', 'desc')
		.select({ id: 'c.id', title: 'c.title', roomId: 'r.id', roomName: 'r.name', projectName: 'p.name', publishedAt: 'c.published_at' });
}

export async function isComparisonOfRoom(k: Knex, comparisonId: number, roomId: number): Promise<boolean> {
	return Boolean(await k('comparisons').where({ id: comparisonId, room_id: roomId }).first('id'));
}

export async function saveComparisonAdvice(k: Knex, id: number, advice: string, shareQualityNotes: boolean): Promise<void> {
	await k('comparisons').where({ id }).update({ advice, share_quality_notes: shareQualityNotes });
}

export interface ComparisonToPublish {
	title: string;
	publishedAt: Date | null;
	roomName: string;
	projectId: number;
}

/** The comparison with its room and project, locked so it is published (and mailed) once. */
export async function lockComparisonToPublish(trx: Knex.Transaction, id: number): Promise<ComparisonToPublish | undefined> {
	return trx('comparisons as cm')
		.join('rooms as r', 'r.id', 'cm.room_id')
		.where('cm.id', id)
		.forUpdate()
		.first({ title: 'cm.title', publishedAt: 'cm.published_at', roomName: 'r.name', projectId: 'r.project_id' });
}

export async function markPublished(k: Knex, id: number, userId: number): Promise<void> {
	await k('comparisons').where({ id }).update({ published_at: k.raw('CURRENT_TIMESTAMP(3)'), published_by: userId });
}

export async function isProblemBandOfRoom(k: Knex, bandId: number, roomId: number): Promise<boolean> {
	return Boolean(await k('problem_bands').where({ id: bandId, room_id: roomId }).first('id'));
}

export async function updateProblemBandStatus(k: Knex, id: number, status: 'open' | 'addressed'): Promise<void> {
	await k('problem_bands').where({ id }).update({ status });
}

export async function deleteProblemBand(k: Knex, id: number): Promise<void> {
	await k('problem_bands').where({ id }).del();
}
