import type { Knex } from 'knex';
import type { SessionRow } from '../../types/sessions';

export type { SessionRow };

const columns = {
	id: 's.id',
	roomId: 's.room_id',
	conditionLabel: 's.condition_label',
	measuredOn: 's.measured_on',
	notes: 's.notes',
	acousticianId: 's.acoustician_id',
	acousticianName: 'u.name'
};

function counts(k: Knex) {
	return [
		k.raw('(SELECT COUNT(*) FROM positions po WHERE po.session_id = s.id) AS positionCount'),
		k.raw('(SELECT COUNT(*) FROM captures c WHERE c.session_id = s.id) AS captureCount')
	];
}

/** A DATE column as YYYY-MM-DD. */
export const toIsoDate = (d: Date | string) => (d instanceof Date ? d.toISOString().slice(0, 10) : String(d).slice(0, 10));

function shape(r: Record<string, unknown>): SessionRow {
	return {
		...(r as unknown as SessionRow),
		measuredOn: toIsoDate(r.measuredOn as Date),
		positionCount: Number(r.positionCount),
		captureCount: Number(r.captureCount)
	};
}

export async function listSessions(k: Knex, roomId: number): Promise<SessionRow[]> {
	const rows = await k('sessions as s')
		.leftJoin('users as u', 'u.id', 's.acoustician_id')
		.where('s.room_id', roomId)
		.select(columns)
		.select(counts(k))
		.orderBy('s.measured_on', 'asc')
		.orderBy('s.id', 'asc');
	return rows.map(shape);
}

export async function getSession(k: Knex, id: number): Promise<SessionRow | undefined> {
	const r = await k('sessions as s')
		.leftJoin('users as u', 'u.id', 's.acoustician_id')
		.where('s.id', id)
		.first(columns)
		.select(counts(k));
	return r ? shape(r) : undefined;
}

/** A visit with its room and project, as the visit page heads itself, in one query. */
export async function getVisitHeader(
	k: Knex,
	id: number
): Promise<{ session: SessionRow; room: { id: number; projectId: number; name: string; lengthM: number; widthM: number; heightM: number }; project: { id: number; name: string } } | undefined> {
	const r = await k('sessions as s')
		.leftJoin('users as u', 'u.id', 's.acoustician_id')
		.join('rooms as r', 'r.id', 's.room_id')
		.join('projects as p', 'p.id', 'r.project_id')
		.where('s.id', id)
		.first(columns)
		.select(counts(k))
		.select({ roomProjectId: 'r.project_id', roomName: 'r.name', roomLengthM: 'r.length_m', roomWidthM: 'r.width_m', roomHeightM: 'r.height_m', projectName: 'p.name' });
	if (!r) return undefined;
	const { roomProjectId, roomName, roomLengthM, roomWidthM, roomHeightM, projectName, ...session } = r;
	return {
		session: shape(session),
		room: { id: r.roomId, projectId: roomProjectId, name: roomName, lengthM: roomLengthM, widthM: roomWidthM, heightM: roomHeightM },
		project: { id: roomProjectId, name: projectName }
	};
}

/** The condition and date of these visits, for their results. */
export async function sessionMetas(k: Knex, ids: number[]): Promise<{ sessionId: number; conditionLabel: string; measuredOn: string }[]> {
	if (ids.length === 0) return [];
	const rows = await k('sessions').whereIn('id', ids).select('id', 'condition_label', 'measured_on');
	return rows.map((r) => ({ sessionId: r.id, conditionLabel: r.condition_label, measuredOn: toIsoDate(r.measured_on) }));
}

export async function createSession(
	k: Knex,
	roomId: number,
	s: { conditionLabel: string; measuredOn: string; notes: string | null; acousticianId: number | null }
): Promise<number> {
	const [id] = await k('sessions').insert({
		room_id: roomId,
		condition_label: s.conditionLabel,
		measured_on: s.measuredOn,
		notes: s.notes,
		acoustician_id: s.acousticianId
	});
	return id;
}

/** A new capture means the visit is not finished: its "analysed" notice may go out again. */
export async function clearAnalysedNotice(k: Knex, sessionId: number): Promise<void> {
	// Only when set: most announcements find it clear and need not write the visit's row.
	await k('sessions').where({ id: sessionId }).whereNotNull('analysed_notice_at').update({ analysed_notice_at: null });
}

/**
 * Take the visit's one "analysed" notice: marks it sent (under a row lock, so two workers cannot
 * both take it) and returns what the mail says, or undefined when it has been taken already.
 */
export async function takeAnalysedNotice(
	trx: Knex.Transaction,
	sessionId: number
): Promise<{ conditionLabel: string; roomName: string; acousticianEmail: string | null } | undefined> {
	// Lock the visit's row only (a locking read of the join would lock its room and user too).
	const open = await trx('sessions').where({ id: sessionId }).whereNull('analysed_notice_at').forUpdate().first('id');
	if (!open) return undefined;
	const s = await trx('sessions as s')
		.join('rooms as r', 'r.id', 's.room_id')
		.leftJoin('users as u', 'u.id', 's.acoustician_id')
		.where('s.id', sessionId)
		.first('s.condition_label', 'r.name as room_name', 'u.email');
	await trx('sessions').where({ id: sessionId }).update({ analysed_notice_at: trx.raw('CURRENT_TIMESTAMP(3)') });
	return { conditionLabel: s.condition_label, roomName: s.room_name, acousticianEmail: s.email ?? null };
}
