import type { Knex } from 'knex';
import type { RoomRow } from '../../types/rooms';

export type { RoomRow };

/** The columns of a RoomRow, from `rooms as r` (with sessionCount). */
export const roomColumns = {
	id: 'r.id',
	projectId: 'r.project_id',
	name: 'r.name',
	lengthM: 'r.length_m',
	widthM: 'r.width_m',
	heightM: 'r.height_m',
	volumeM3: 'r.volume_m3',
	roomUse: 'r.room_use',
	notes: 'r.notes',
	updatedAt: 'r.updated_at'
};

export const sessionCount = (k: Knex) => k.raw('(SELECT COUNT(*) FROM sessions s WHERE s.room_id = r.id) AS sessionCount');

export async function listRooms(k: Knex, projectId: number): Promise<RoomRow[]> {
	const rows = await k('rooms as r').where('r.project_id', projectId).select(roomColumns).select(sessionCount(k)).orderBy('r.name');
	return rows.map((r) => ({ ...r, sessionCount: Number(r.sessionCount) }));
}

export async function getRoom(k: Knex, id: number): Promise<RoomRow | undefined> {
	const r = await k('rooms as r').where('r.id', id).first(roomColumns).select(sessionCount(k));
	return r ? { ...r, sessionCount: Number(r.sessionCount) } : undefined;
}

export interface RoomInput {
	name: string;
	lengthM: number;
	widthM: number;
	heightM: number;
	roomUse: string;
	notes: string | null;
}

const roomValues = (r: RoomInput) => ({
	name: r.name,
	length_m: r.lengthM,
	width_m: r.widthM,
	height_m: r.heightM,
	room_use: r.roomUse,
	notes: r.notes
});

export async function createRoom(k: Knex, projectId: number, r: RoomInput): Promise<number> {
	const [id] = await k('rooms').insert({ project_id: projectId, ...roomValues(r) });
	return id;
}

export async function updateRoom(k: Knex, id: number, r: RoomInput): Promise<void> {
	await k('rooms').where({ id }).update(roomValues(r));
}

/** Whether every one of these visits is of this room. */
export async function areVisitsOfRoom(k: Knex, roomId: number, sessionIds: readonly number[]): Promise<boolean> {
	const wanted = new Set(sessionIds);
	if (wanted.size === 0) return true;
	const found = await k('sessions').whereIn('id', [...wanted]).where({ room_id: roomId }).select('id');
	return found.length === wanted.size;
}
