// Photos of a visit: of the room as a whole or of one position, each with a caption. An upload is
// checked and re-encoded here (images.ts), stored as two objects (display size and thumbnail)
// and then recorded in one row; a failure at any step leaves neither objects nor row behind.
import { randomUUID } from 'node:crypto';
import { audit } from '../audit';
import { db } from '../db';
import { notFound, Problem } from '../problem';
import { storage, type Storage } from '../storage';
import { transaction } from '../transaction';
import type { Scope } from '../auth/access';
import { deletePhotoRow, getPhoto, insertPhoto, listPhotos, updatePhotoCaption, type PhotoRow, type PhotoView } from '../queries/photos';
import { isPositionOfSession, listPositions } from '../queries/positions';
import { getProject } from '../queries/projects';
import { getRoom } from '../queries/rooms';
import { getSession } from '../queries/sessions';
import { roleAllows } from '../../roles';
import { photoFileSchema, type AddPhotoInput } from '../../schemas/photos';
import { PHOTO_CONTENT_TYPES, PhotoImageError, preparePhoto, STORED_CONTENT_TYPE } from './images';

/** What pages are shown of a photo: no object keys. */
function toView(p: PhotoRow): PhotoView {
	const { displayKey: _d, thumbKey: _t, contentType: _c, ...view } = p;
	return view;
}

export async function visitPhotos(sessionId: number): Promise<PhotoView[]> {
	return (await listPhotos(db(), sessionId)).map(toView);
}

/** Both objects of one photo share a random name, so one photo's keys tell nothing of another's. */
function newPhotoKeys(): { displayKey: string; thumbKey: string } {
	const name = randomUUID();
	return { displayKey: `photos/${name}.jpg`, thumbKey: `photos/${name}-thumb.jpg` };
}

const OTHER_VISIT = 'That position belongs to another visit.';

/** Remove what was stored for an upload that did not complete; what cannot be removed now the orphan sweep removes later. */
async function removeObjects(s: Storage, keys: string[]): Promise<void> {
	await Promise.allSettled(keys.map((key) => s.remove(key)));
}

/** Check, re-encode, store and record one photo; returns its id. */
export async function addPhoto(scope: Scope, sessionId: number, input: AddPhotoInput, file: unknown, s: Storage = storage()): Promise<number> {
	const checked = photoFileSchema.safeParse(file);
	if (!checked.success) throw new Problem(400, checked.error.issues[0].message, { field: 'photo', code: 'invalid' });
	const photo = checked.data;
	if (input.positionId !== null && !(await isPositionOfSession(db(), sessionId, input.positionId))) throw new Problem(422, OTHER_VISIT, { field: 'positionId' });

	let prepared;
	try {
		prepared = await preparePhoto(new Uint8Array(await photo.arrayBuffer()));
	} catch (e) {
		if (e instanceof PhotoImageError) throw new Problem(422, e.message, { field: 'photo', code: 'bad_image' });
		throw e;
	}

	const keys = newPhotoKeys();
	const stored: string[] = [];
	try {
		await s.put(keys.displayKey, prepared.display.bytes, STORED_CONTENT_TYPE, prepared.display.bytes.byteLength);
		stored.push(keys.displayKey);
		await s.put(keys.thumbKey, prepared.thumb.bytes, STORED_CONTENT_TYPE, prepared.thumb.bytes.byteLength);
		stored.push(keys.thumbKey);
		return await transaction(async (trx) => {
			// Checked again inside the transaction: the position may have been removed meanwhile.
			if (input.positionId !== null && !(await isPositionOfSession(trx, sessionId, input.positionId))) throw new Problem(422, OTHER_VISIT, { field: 'positionId' });
			const id = await insertPhoto(trx, {
				sessionId,
				positionId: input.positionId,
				caption: input.caption,
				...keys,
				contentType: STORED_CONTENT_TYPE,
				width: prepared.display.width,
				height: prepared.display.height,
				thumbWidth: prepared.thumb.width,
				thumbHeight: prepared.thumb.height,
				displayBytes: prepared.display.bytes.byteLength,
				thumbBytes: prepared.thumb.bytes.byteLength,
				originalFilename: photo.name || 'photo',
				originalType: PHOTO_CONTENT_TYPES[prepared.format],
				originalBytes: photo.size,
				originalWidth: prepared.width,
				originalHeight: prepared.height,
				createdBy: scope.user.id
			});
			await audit(trx, scope, 'photo.added', 'photo', id, { sessionId, positionId: input.positionId, filename: photo.name, bytes: photo.size });
			return id;
		});
	} catch (e) {
		await removeObjects(s, stored);
		throw e;
	}
}

async function photoOfSession(sessionId: number, photoId: number): Promise<PhotoRow> {
	const photo = await getPhoto(db(), photoId);
	if (!photo || photo.sessionId !== sessionId) throw notFound('This visit has no such photo.');
	return photo;
}

/** Change a photo's caption (empty is allowed). */
export async function setPhotoCaption(scope: Scope, sessionId: number, photoId: number, caption: string): Promise<void> {
	const before = await photoOfSession(sessionId, photoId);
	if (before.caption === caption) return;
	await transaction(async (trx) => {
		await updatePhotoCaption(trx, photoId, caption);
		await audit(trx, scope, 'photo.captioned', 'photo', photoId, { from: before.caption, to: caption });
	});
}

/**
 * Remove a photo: its two objects, then its row. Objects first, as with captures: if the store is
 * down the photo stays whole and the removal can be tried again; removing an object that is
 * already gone succeeds, so a second try (or a second click) finishes the job.
 */
export async function removePhoto(scope: Scope, sessionId: number, photoId: number, s: Storage = storage()): Promise<void> {
	const photo = await photoOfSession(sessionId, photoId);
	await s.remove(photo.displayKey);
	await s.remove(photo.thumbKey);
	await transaction(async (trx) => {
		if (await deletePhotoRow(trx, photoId)) {
			await audit(trx, scope, 'photo.removed', 'photo', photoId, { sessionId, positionId: photo.positionId, caption: photo.caption, filename: photo.originalFilename });
		}
	});
}

const isMissingObject = (e: unknown) => {
	const x = e as { name?: string; $metadata?: { httpStatusCode?: number } };
	return x?.name === 'NoSuchKey' || x?.name === 'NotFound' || x?.$metadata?.httpStatusCode === 404;
};

/** The stored bytes of one size of a photo, with what the answer needs to describe them. */
export async function photoFile(photoId: number, size: 'display' | 'thumb', s: Storage = storage()): Promise<{ bytes: Uint8Array; contentType: string; etag: string; filename: string }> {
	const photo = await getPhoto(db(), photoId);
	if (!photo) throw notFound('This photo no longer exists.');
	const key = size === 'thumb' ? photo.thumbKey : photo.displayKey;
	let bytes: Uint8Array;
	try {
		bytes = await s.getBytes(key);
	} catch (e) {
		if (isMissingObject(e)) throw notFound('This photo is no longer stored.');
		throw e;
	}
	return { bytes, contentType: photo.contentType, etag: photoEtag(photo, size), filename: `photo-${photo.id}${size === 'thumb' ? '-thumb' : ''}.jpg` };
}

/** A photo's stored bytes never change (a new upload is a new photo), so its key names its version. */
export function photoEtag(photo: { displayKey: string; thumbKey: string }, size: 'display' | 'thumb'): string {
	const key = size === 'thumb' ? photo.thumbKey : photo.displayKey;
	return `"${key.replace(/^photos\//, '').replace(/\.jpg$/, '')}"`;
}

/** The entity tag of a photo without reading its bytes (for a conditional request), or null when it is gone. */
export async function photoTag(photoId: number, size: 'display' | 'thumb'): Promise<string | null> {
	const photo = await getPhoto(db(), photoId);
	return photo ? photoEtag(photo, size) : null;
}

/** The visit's photo page: the visit, its positions and its photos. */
export async function photosPage(scope: Scope, sessionId: number) {
	const k = db();
	const session = (await getSession(k, sessionId))!;
	const room = (await getRoom(k, session.roomId))!;
	const [project, positions, photos] = await Promise.all([getProject(k, room.projectId), listPositions(k, sessionId), visitPhotos(sessionId)]);
	return {
		session: { id: session.id, conditionLabel: session.conditionLabel, measuredOn: session.measuredOn },
		room: { id: room.id, name: room.name },
		project: { id: project!.id, name: project!.name },
		positions: positions.map((p) => ({ id: p.id, label: p.label })),
		photos,
		can: { edit: roleAllows(scope.role, 'project:edit') }
	};
}
