import type { Knex } from 'knex';
import type { PhotoView } from '../../types/photos';

export type { PhotoView };

/** A photo row with the keys of its two stored objects (these stay on the server). */
export interface PhotoRow extends PhotoView {
	displayKey: string;
	thumbKey: string;
	contentType: string;
}

const columns = {
	id: 'ph.id',
	sessionId: 'ph.session_id',
	positionId: 'ph.position_id',
	caption: 'ph.caption',
	width: 'ph.width',
	height: 'ph.height',
	thumbWidth: 'ph.thumb_width',
	thumbHeight: 'ph.thumb_height',
	originalFilename: 'ph.original_filename',
	createdByName: 'u.name',
	createdAt: 'ph.created_at',
	displayKey: 'ph.display_key',
	thumbKey: 'ph.thumb_key',
	contentType: 'ph.content_type'
};

const base = (k: Knex) => k('visit_photos as ph').leftJoin('users as u', 'u.id', 'ph.created_by');

function shape(r: Record<string, unknown>): PhotoRow {
	return {
		id: r.id as number,
		sessionId: r.sessionId as number,
		positionId: (r.positionId as number | null) ?? null,
		caption: r.caption as string,
		width: r.width as number,
		height: r.height as number,
		thumbWidth: r.thumbWidth as number,
		thumbHeight: r.thumbHeight as number,
		originalFilename: r.originalFilename as string,
		createdByName: (r.createdByName as string | null) ?? null,
		createdAt: new Date(r.createdAt as string | Date).toISOString(),
		displayKey: r.displayKey as string,
		thumbKey: r.thumbKey as string,
		contentType: r.contentType as string
	};
}

/** A visit's photos, oldest first. */
export async function listPhotos(k: Knex, sessionId: number): Promise<PhotoRow[]> {
	const rows = await base(k).where('ph.session_id', sessionId).orderBy('ph.created_at').orderBy('ph.id').select(columns);
	return rows.map(shape);
}

export async function getPhoto(k: Knex, id: number): Promise<PhotoRow | undefined> {
	const r = await base(k).where('ph.id', id).first(columns);
	return r ? shape(r) : undefined;
}

export interface NewPhoto {
	sessionId: number;
	positionId: number | null;
	caption: string;
	displayKey: string;
	thumbKey: string;
	contentType: string;
	width: number;
	height: number;
	thumbWidth: number;
	thumbHeight: number;
	displayBytes: number;
	thumbBytes: number;
	originalFilename: string;
	originalType: string;
	originalBytes: number;
	originalWidth: number;
	originalHeight: number;
	createdBy: number;
}

export async function insertPhoto(k: Knex, p: NewPhoto): Promise<number> {
	const [id] = await k('visit_photos').insert({
		session_id: p.sessionId,
		position_id: p.positionId,
		caption: p.caption,
		display_key: p.displayKey,
		thumb_key: p.thumbKey,
		content_type: p.contentType,
		width: p.width,
		height: p.height,
		thumb_width: p.thumbWidth,
		thumb_height: p.thumbHeight,
		display_bytes: p.displayBytes,
		thumb_bytes: p.thumbBytes,
		original_filename: p.originalFilename,
		original_type: p.originalType,
		original_bytes: p.originalBytes,
		original_width: p.originalWidth,
		original_height: p.originalHeight,
		created_by: p.createdBy
	});
	return id;
}

export async function updatePhotoCaption(k: Knex, id: number, caption: string): Promise<void> {
	await k('visit_photos').where({ id }).update({ caption });
}

/** Delete the row, locked first so a second removal waits and then finds nothing; false when already gone. */
export async function deletePhotoRow(trx: Knex.Transaction, id: number): Promise<boolean> {
	const row = await trx('visit_photos').where({ id }).forUpdate().first('id');
	if (!row) return false;
	await trx('visit_photos').where({ id }).delete();
	return true;
}
