// Photos of a visit, through the running app: uploaded through the photo page's form, re-encoded
// without metadata, stored as two objects and one row, served only to those who may read the
// visit, captioned and removed with their objects; a bad file is refused and nothing is stored.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import sharp from 'sharp';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { cameraPhoto, jpegSegments, metadataTags } from '../helpers/photos';
import { createStorage, type Storage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { closeDb } from '../../src/lib/server/db';
import { addPhoto } from '../../src/lib/server/photos/service';
import { removeOrphanObjects } from '../../src/lib/server/housekeeping/orphan-objects';
import { PHOTO_MAX_BYTES } from '../../src/lib/schemas/photos';

let k: Knex;
let tree: ProjectTree, otherTree: ProjectTree;
let orgId: number;
let acoustician: Client, consultant: Client, client: Client, otherClient: Client;
const s3 = createStorage(loadConfig(process.env));
const exists = async (key: string) => (await s3.head(key)) !== null;

/** Every object key under photos/ (the test run's store is its own). */
async function photoObjects(): Promise<Set<string>> {
	const keys = new Set<string>();
	let after: string | undefined;
	do {
		const page = await s3.list('photos/', after);
		for (const o of page.objects) keys.add(o.key);
		after = page.next;
	} while (after);
	return keys;
}

function send(c: Client, sessionId: number, o: { bytes: Uint8Array; name?: string; type?: string; positionId?: number | ''; caption?: string }) {
	const form = new FormData();
	form.append('photo', new Blob([o.bytes as Uint8Array<ArrayBuffer>], { type: o.type ?? 'image/jpeg' }), o.name ?? 'IMG_0001.jpg');
	form.append('positionId', String(o.positionId ?? ''));
	form.append('caption', o.caption ?? '');
	return c.request('POST', `/sessions/${sessionId}/photos?/add`, { body: form, headers: { accept: 'text/html' } });
}

async function uploaded(res: Response): Promise<number> {
	expect(res.status, await res.clone().text()).toBe(303);
	const m = /\/sessions\/\d+\/photos#photo-(\d+)$/.exec(res.headers.get('location') ?? '');
	expect(m, res.headers.get('location') ?? '').not.toBeNull();
	return Number(m![1]);
}

/** An audit record's details (the JSON column may come back parsed). */
const details = (d: unknown) => (typeof d === 'string' ? JSON.parse(d) : d);
const row = (id: number) => k('visit_photos').where({ id }).first();
const postForm = (c: Client, sessionId: number, action: string, fields: Record<string, string>) => c.postForm(`/sessions/${sessionId}/photos?/${action}`, fields);

beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
	const clientUser = await makeUser(k, orgId, 'client');
	const otherClientUser = await makeUser(k, orgId, 'client');
	tree = await makeProjectTree(k, orgId, clientUser.id);
	otherTree = await makeProjectTree(k, orgId, otherClientUser.id);
	acoustician = await signedInClient((await makeUser(k, orgId, 'acoustician')).email, TEST_PASSWORD);
	consultant = await signedInClient((await makeUser(k, orgId, 'consultant')).email, TEST_PASSWORD);
	client = await signedInClient(clientUser.email, TEST_PASSWORD);
	otherClient = await signedInClient(otherClientUser.email, TEST_PASSWORD);
});
afterAll(async () => {
	await k.destroy();
	await closeDb();
});

describe('a photo upload', () => {
	it('stores an upright display size and thumbnail without EXIF or GPS, and one row naming them', async () => {
		// A phone photo stored 3000 × 2400 on its side (EXIF orientation 6), with its GPS position.
		const original = await cameraPhoto({ width: 3000, height: 2400, orientation: 6 });
		expect(metadataTags(original).gps).toMatchObject({ Latitude: expect.closeTo(59.325, 3) });
		const id = await uploaded(await send(acoustician, tree.sessionId, { bytes: original, positionId: tree.positionId, caption: 'Microphone at the sofa, door open' }));

		const r = await row(id);
		expect(r).toMatchObject({
			session_id: tree.sessionId,
			position_id: tree.positionId,
			caption: 'Microphone at the sofa, door open',
			content_type: 'image/jpeg',
			// Upright 2400 × 3000, long edge to 2048 and 480.
			width: 1638,
			height: 2048,
			thumb_width: 384,
			thumb_height: 480,
			original_filename: 'IMG_0001.jpg',
			original_type: 'image/jpeg',
			original_bytes: original.byteLength,
			original_width: 2400,
			original_height: 3000
		});
		for (const [key, w, h] of [[r.display_key, 1638, 2048], [r.thumb_key, 384, 480]] as const) {
			const stored = await s3.getBytes(key);
			const meta = await sharp(stored).metadata();
			expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', w, h]);
			expect(meta.exif).toBeUndefined();
			expect(meta.orientation).toBeUndefined();
			expect(metadataTags(stored)).toEqual({ exif: undefined, gps: undefined, xmp: undefined, iptc: undefined });
			expect(jpegSegments(stored).filter((s) => s.marker === 'FFE1' || s.marker === 'FFED')).toEqual([]);
			expect(stored.byteLength).toBe(key === r.display_key ? r.display_bytes : r.thumb_bytes);
		}
		expect(await k('audit_events').where({ entity_type: 'photo', entity_id: id, action: 'photo.added' }).first('id')).toBeDefined();
	});

	it('keeps a small PNG at its size, and a consultant may add one of the room as a whole', async () => {
		const png = new Uint8Array(await sharp({ create: { width: 640, height: 360, channels: 3, background: '#336699' } }).png().toBuffer());
		const id = await uploaded(await send(consultant, tree.sessionId, { bytes: png, name: 'sketch.png', type: 'image/png', caption: 'Room from the door' }));
		expect(await row(id)).toMatchObject({ position_id: null, width: 640, height: 360, thumb_width: 480, thumb_height: 270, original_type: 'image/png', content_type: 'image/jpeg' });
	});

	it.each([
		['text with a photo name', () => new TextEncoder().encode('this is a shopping list, not a photo'), 'image/jpeg', 422, 'This file is not a JPEG, PNG or WebP image.'],
		['a GIF', () => new Uint8Array([0x47, 0x49, 0x46, 0x38, 0x39, 0x61, 1, 0, 1, 0, 0, 0, 0, 0x3b]), 'image/gif', 422, 'This file is not a JPEG, PNG or WebP image.'],
		['a JPEG cut short', async () => { const whole = await cameraPhoto({ width: 800, height: 600 }); return whole.subarray(0, Math.floor(whole.length * 0.6)); }, 'image/jpeg', 422, 'This image could not be read'],
		['an empty file', () => new Uint8Array(0), 'image/jpeg', 400, 'Choose a photo to upload']
	])('refuses %s with the reason, and stores nothing', async (_, make, type, status, message) => {
		const objectsBefore = await photoObjects();
		const rowsBefore = (await k('visit_photos').where({ session_id: tree.sessionId }).count({ n: '*' }).first())!.n;
		const res = await send(acoustician, tree.sessionId, { bytes: await make(), type, positionId: tree.positionId, caption: 'refused' });
		expect(res.status).toBe(status);
		expect(await res.text()).toContain(message);
		expect((await k('visit_photos').where({ session_id: tree.sessionId }).count({ n: '*' }).first())!.n).toBe(rowsBefore);
		expect(await photoObjects()).toEqual(objectsBefore);
	});

	it('refuses a photo over the size limit before reading it (413), and stores nothing', async () => {
		const objectsBefore = await photoObjects();
		const big = new Uint8Array(PHOTO_MAX_BYTES + 512 * 1024);
		big.set([0xff, 0xd8, 0xff, 0xe0]);
		const res = await send(acoustician, tree.sessionId, { bytes: big, caption: 'too big' });
		expect(res.status).toBe(413);
		expect(await res.text()).toMatch(/larger than the 20\.\d MiB allowed here/);
		expect(await k('visit_photos').where({ caption: 'too big' }).first()).toBeUndefined();
		expect(await photoObjects()).toEqual(objectsBefore);
	});

	it('refuses a position of another visit, and a client may not upload', async () => {
		const photo = await cameraPhoto({ width: 400, height: 300 });
		const objectsBefore = await photoObjects();
		const foreign = await send(acoustician, tree.sessionId, { bytes: photo, positionId: otherTree.positionId, caption: 'wrong visit' });
		expect(foreign.status).toBe(422);
		expect(await foreign.text()).toContain('That position belongs to another visit.');
		expect((await send(client, tree.sessionId, { bytes: photo, caption: 'by the client' })).status).toBe(403);
		expect((await send(otherClient, tree.sessionId, { bytes: photo, caption: 'by another client' })).status).toBe(404);
		expect(await k('visit_photos').whereIn('caption', ['wrong visit', 'by the client', 'by another client']).first()).toBeUndefined();
		expect(await photoObjects()).toEqual(objectsBefore);
	});
});

describe('a stored photo', () => {
	let id: number;
	beforeAll(async () => {
		id = await uploaded(await send(acoustician, tree.sessionId, { bytes: await cameraPhoto({ width: 1200, height: 900 }), positionId: tree.positionId, caption: 'HVAC vent above P1' }));
	});

	it('is served to the project’s people with its type and private caching, never to another project’s client', async () => {
		const r = await row(id);
		for (const who of [acoustician, consultant, client]) {
			const res = await who.get(`/api/photos/${id}`);
			expect(res.status).toBe(200);
			expect(res.headers.get('content-type')).toBe('image/jpeg');
			expect(res.headers.get('cache-control')).toBe('private, max-age=86400');
			expect(res.headers.get('x-content-type-options')).toBe('nosniff');
			expect(new Uint8Array(await res.arrayBuffer())).toEqual(await s3.getBytes(r.display_key));
		}
		const thumb = await client.get(`/api/photos/${id}?size=thumb`);
		expect(thumb.status).toBe(200);
		expect(new Uint8Array(await thumb.arrayBuffer())).toEqual(await s3.getBytes(r.thumb_key));
		expect(thumb.headers.get('etag')).not.toBe((await client.get(`/api/photos/${id}`)).headers.get('etag'));

		// A second look with the entity tag needs no bytes.
		const tag = (await acoustician.get(`/api/photos/${id}`)).headers.get('etag')!;
		const again = await acoustician.get(`/api/photos/${id}`, { 'if-none-match': tag });
		expect(again.status).toBe(304);
		expect((await again.arrayBuffer()).byteLength).toBe(0);

		expect((await otherClient.get(`/api/photos/${id}`)).status).toBe(404);
		expect((await otherClient.get(`/api/photos/${id}?size=thumb`)).status).toBe(404);
		expect((await new Client().get(`/api/photos/${id}`, { accept: 'application/json' })).status).toBe(401);
		const badSize = await acoustician.get(`/api/photos/${id}?size=original`, { accept: 'application/json' });
		expect(badSize.status).toBe(422);
		// The visit page and the photo page show it; the other project's client sees neither.
		expect(await (await client.get(`/sessions/${tree.sessionId}`, { accept: 'text/html' })).text()).toContain('HVAC vent above P1');
		expect(await (await client.get(`/sessions/${tree.sessionId}/photos`, { accept: 'text/html' })).text()).toContain('HVAC vent above P1');
		expect((await otherClient.get(`/sessions/${tree.sessionId}/photos`, { accept: 'text/html' })).status).toBe(404);
	});

	it('gets a new caption from an editor, bounded in length, with an audit record', async () => {
		const res = await postForm(consultant, tree.sessionId, 'caption', { photoId: String(id), caption: '  HVAC vent above P1, running  ', back: 'visit' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/sessions/${tree.sessionId}#photos`);
		expect((await row(id)).caption).toBe('HVAC vent above P1, running');
		const audited = await k('audit_events').where({ entity_type: 'photo', entity_id: id, action: 'photo.captioned' }).first('details');
		expect(details(audited.details)).toEqual({ from: 'HVAC vent above P1', to: 'HVAC vent above P1, running' });

		const long = await postForm(consultant, tree.sessionId, 'caption', { photoId: String(id), caption: 'x'.repeat(301) });
		expect(long.status).toBe(400);
		expect(await long.text()).toContain('Keep the caption under 300 characters.');
		expect((await postForm(client, tree.sessionId, 'caption', { photoId: String(id), caption: 'client caption' })).status).toBe(403);
		expect((await postForm(otherClient, tree.sessionId, 'caption', { photoId: String(id), caption: 'other caption' })).status).toBe(404);
		// Through another visit the photo is not found.
		expect((await postForm(acoustician, otherTree.sessionId, 'caption', { photoId: String(id), caption: 'through B' })).status).toBe(404);
		expect((await row(id)).caption).toBe('HVAC vent above P1, running');
	});

	it('stays with the visit when its position is removed', async () => {
		const [positionId] = await k('positions').insert({ session_id: tree.sessionId, label: `P-photo-${Date.now()}` });
		const pid = await uploaded(await send(acoustician, tree.sessionId, { bytes: await cameraPhoto({ width: 500, height: 400 }), positionId, caption: 'position to go' }));
		expect((await acoustician.postForm(`/sessions/${tree.sessionId}?/deletePosition`, { positionId: String(positionId) })).status).toBe(200);
		expect(await row(pid)).toMatchObject({ position_id: null, caption: 'position to go' });
	});

	it('is removed with both its objects, only by an editor of its visit', async () => {
		const r = await row(id);
		expect((await postForm(otherClient, tree.sessionId, 'remove', { photoId: String(id) })).status).toBe(404);
		expect((await postForm(client, tree.sessionId, 'remove', { photoId: String(id) })).status).toBe(403);
		expect((await postForm(acoustician, otherTree.sessionId, 'remove', { photoId: String(id) })).status).toBe(404);
		expect(await row(id)).toBeDefined();
		expect(await exists(r.display_key)).toBe(true);

		const res = await postForm(acoustician, tree.sessionId, 'remove', { photoId: String(id) });
		expect(res.status).toBe(303);
		expect(await row(id)).toBeUndefined();
		expect(await exists(r.display_key)).toBe(false);
		expect(await exists(r.thumb_key)).toBe(false);
		const audited = await k('audit_events').where({ entity_type: 'photo', entity_id: id, action: 'photo.removed' }).first('details');
		expect(details(audited.details)).toMatchObject({ caption: 'HVAC vent above P1, running' });
		expect((await acoustician.get(`/api/photos/${id}`, { accept: 'application/json' })).status).toBe(404);
		// Removing it again finds nothing.
		expect((await postForm(acoustician, tree.sessionId, 'remove', { photoId: String(id) })).status).toBe(404);
	});
});

describe('an upload that fails half-way', () => {
	/** The test store, recording what was put and failing where told. */
	function recordingStore(failOn?: (key: string) => boolean): Storage & { put_: string[] } {
		const put_: string[] = [];
		return {
			...s3,
			put_,
			async put(key, body, type, length) {
				if (failOn?.(key)) throw new Error('store refused the object');
				await s3.put(key, body, type, length);
				put_.push(key);
			}
		};
	}
	const file = async () => new File([(await cameraPhoto({ width: 600, height: 400 })) as Uint8Array<ArrayBuffer>], 'half.jpg', { type: 'image/jpeg' });

	it('removes the stored objects when the row cannot be written', async () => {
		const store = recordingStore();
		// A user id no row has: the insert's foreign key refuses it after both objects are stored.
		const scope = { organizationId: orgId, projectId: tree.projectId, role: 'acoustician' as const, user: { id: 2_000_000_000, email: 'gone@example.test', name: 'Gone', unitSystem: 'metric' as const } };
		await expect(addPhoto(scope, tree.sessionId, { positionId: null, caption: 'no row', back: 'photos' }, await file(), store)).rejects.toThrow();
		expect(store.put_).toHaveLength(2);
		for (const key of store.put_) expect(await exists(key), key).toBe(false);
		expect(await k('visit_photos').where({ caption: 'no row' }).first()).toBeUndefined();
	});

	it('removes the display size when the thumbnail cannot be stored', async () => {
		const store = recordingStore((key) => key.endsWith('-thumb.jpg'));
		const user = (await k('users').where('email', 'like', 'acoustician-%').orderBy('id', 'desc').first('id', 'email', 'name'))!;
		const scope = { organizationId: orgId, projectId: tree.projectId, role: 'acoustician' as const, user: { ...user, unitSystem: 'metric' as const } };
		await expect(addPhoto(scope, tree.sessionId, { positionId: null, caption: 'no thumbnail', back: 'photos' }, await file(), store)).rejects.toThrow('store refused the object');
		expect(store.put_).toHaveLength(1);
		expect(await exists(store.put_[0])).toBe(false);
		expect(await k('visit_photos').where({ caption: 'no thumbnail' }).first()).toBeUndefined();
	});

	it('leaves nothing the orphan sweep would not find: an object under photos/ no row names goes, named ones stay', async () => {
		const orphan = `photos/${crypto.randomUUID()}.jpg`;
		await s3.put(orphan, new Uint8Array([0xff, 0xd8, 0xff, 0xd9]), 'image/jpeg', 4);
		const named = (await k('visit_photos').select('display_key', 'thumb_key')).flatMap((r) => [r.display_key as string, r.thumb_key as string]);
		const kept = [];
		for (const key of named) if (await exists(key)) kept.push(key);
		expect(kept.length).toBeGreaterThan(0);
		await removeOrphanObjects(k, s3, new Date(Date.now() + 60_000));
		expect(await exists(orphan)).toBe(false);
		for (const key of kept) expect(await exists(key), key).toBe(true);
	});
});
