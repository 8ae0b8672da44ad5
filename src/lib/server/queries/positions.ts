import type { Knex } from 'knex';
import type { Point, PositionRow } from '../../types/positions';
import { formatRoomLength, type UnitSystem } from '../../format/room';

export type { Point, PositionRow };

/** The loudspeaker or microphone point of a row with `source_x_m`… columns; null unless complete. */
export function pointOf(r: Record<string, unknown>, prefix: 'source' | 'mic'): Point | null {
	const x = r[`${prefix}_x_m`], y = r[`${prefix}_y_m`], z = r[`${prefix}_z_m`];
	return x == null || y == null || z == null ? null : { x: Number(x), y: Number(y), z: Number(z) };
}

function shape(r: Record<string, unknown>): PositionRow {
	return {
		id: r.id as number,
		sessionId: r.session_id as number,
		label: r.label as string,
		sourceLabel: (r.source_label as string) ?? null,
		micLabel: (r.mic_label as string) ?? null,
		source: pointOf(r, 'source'),
		mic: pointOf(r, 'mic')
	};
}

export async function listPositions(k: Knex, sessionId: number): Promise<PositionRow[]> {
	const rows = await k('positions').where({ session_id: sessionId }).orderBy('label');
	return rows.map(shape);
}

export async function getPosition(k: Knex, id: number): Promise<PositionRow | undefined> {
	const r = await k('positions').where({ id }).first();
	return r ? shape(r) : undefined;
}

/** Whether the position is one of this visit's. */
export async function isPositionOfSession(k: Knex, sessionId: number, positionId: number): Promise<boolean> {
	return Boolean(await k('positions').where({ id: positionId, session_id: sessionId }).first('id'));
}

/**
 * The visit's position with this label, made when missing. Two files of a batch may name the
 * same new position at once: insert-or-ignore, then a locking read, which sees the row whichever
 * transaction created it. A position made for an upload is marked so (`made_by_upload`) until it
 * is kept — see `keepPosition` and `removeUnkeptPosition`.
 */
export async function ensurePosition(trx: Knex.Transaction, sessionId: number, label: string, opts: { forUpload?: boolean } = {}): Promise<{ id: number; created: boolean }> {
	const [insertedId] = await trx('positions').insert({ session_id: sessionId, label, made_by_upload: opts.forUpload ?? false }).onConflict(['session_id', 'label']).ignore();
	const row = await trx('positions').where({ session_id: sessionId, label }).forUpdate().first('id');
	return { id: row.id, created: insertedId === row.id };
}

/** Whether the position is still marked as made for an upload (a plain read: it takes no lock). */
export async function isUnkeptPosition(k: Knex, id: number): Promise<boolean> {
	return Boolean((await k('positions').where({ id }).first('made_by_upload'))?.made_by_upload);
}

/** A capture of the position has arrived (or a person edited it): it stays, whatever its uploads do. */
export async function keepPosition(k: Knex, id: number): Promise<void> {
	await k('positions').where({ id, made_by_upload: true }).update({ made_by_upload: false });
}

/** Lock the position's row (the visit first, then its positions, then captures). */
export async function lockPosition(trx: Knex.Transaction, id: number): Promise<void> {
	await trx('positions').where({ id }).forUpdate().first('id');
}

/**
 * Remove a position that an upload made, nothing has kept since, and that holds no capture:
 * after that upload was refused, withdrawn or abandoned. Whether it was removed.
 */
export async function removeUnkeptPosition(trx: Knex.Transaction, id: number): Promise<boolean> {
	const row = await trx('positions').where({ id }).forUpdate().first('made_by_upload');
	if (!row?.made_by_upload) return false;
	if (await trx('captures').where({ position_id: id }).first('id')) return false;
	return (await trx('positions').where({ id }).delete()) === 1;
}

export interface PositionInput {
	label: string;
	sourceLabel: string | null;
	micLabel: string | null;
	sourceX: number | null;
	sourceY: number | null;
	sourceZ: number | null;
	micX: number | null;
	micY: number | null;
	micZ: number | null;
}

function columnsOf(p: PositionInput) {
	return {
		label: p.label,
		source_label: p.sourceLabel,
		mic_label: p.micLabel,
		source_x_m: p.sourceX,
		source_y_m: p.sourceY,
		source_z_m: p.sourceZ,
		mic_x_m: p.micX,
		mic_y_m: p.micY,
		mic_z_m: p.micZ
	};
}

export async function createPosition(k: Knex, sessionId: number, p: PositionInput): Promise<number> {
	const [id] = await k('positions').insert({ session_id: sessionId, ...columnsOf(p) });
	return id;
}

/** A person's edit: the position is kept from then on, even if the upload that made it fails. */
export async function updatePosition(k: Knex, id: number, p: PositionInput): Promise<void> {
	await k('positions').where({ id }).update({ ...columnsOf(p), made_by_upload: false });
}

/** Remove a position that holds no capture, locking it so an upload cannot land in it meanwhile. */
export async function deleteEmptyPosition(trx: Knex.Transaction, id: number): Promise<'deleted' | 'has-captures'> {
	await trx('positions').where({ id }).forUpdate().first('id');
	const held = await trx('captures').where({ position_id: id }).first('id');
	if (held) return 'has-captures';
	await trx('positions').where({ id }).delete();
	return 'deleted';
}

/** Coordinates are optional, but a given point must be complete and inside the room. */
export function checkPositionInRoom(
	p: PositionInput,
	room: { lengthM: number; widthM: number; heightM: number },
	system: UnitSystem = 'metric'
): Record<string, string> {
	const errors: Record<string, string> = {};
	for (const who of ['source', 'mic'] as const) {
		const xs = [p[`${who}X`], p[`${who}Y`], p[`${who}Z`]];
		const given = xs.filter((v) => v !== null).length;
		if (given > 0 && given < 3) errors[`${who}X`] = 'Give all three coordinates or none.';
		const limits = [room.lengthM, room.widthM, room.heightM];
		const axes = ['X', 'Y', 'Z'] as const;
		xs.forEach((v, i) => {
			if (v !== null && (v < 0 || v > limits[i]))
				errors[`${who}${axes[i]}`] = `Must lie inside the room (0 – ${system === 'imperial' ? formatRoomLength(limits[i], system) : `${limits[i]} m`}).`;
		});
	}
	return errors;
}
