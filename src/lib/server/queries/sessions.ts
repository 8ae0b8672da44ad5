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

const toIsoDate = (d: Date | string) => (d instanceof Date ? d.toISOString().slice(0, 10) : String(d).slice(0, 10));

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
