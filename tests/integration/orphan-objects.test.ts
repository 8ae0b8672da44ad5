// Stored objects no row knows (a presigned upload reused after its capture was refused) are
// removed once they are older than a day; everything a row names stays — an upload still on
// its way included — and so does anything under a prefix the sweep does not know.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { type ProjectTree } from '../helpers/factories';
import { acousticianWithProject, type Client } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { createStorage, newObjectKey } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { removeOrphanObjects } from '../../src/lib/server/housekeeping/orphan-objects';

let k: Knex;
let tree: ProjectTree;
let acoustician: Client;
const s3 = createStorage(loadConfig(process.env));
const exists = async (key: string) => (await s3.head(key)) !== null;

async function announce(wav: Uint8Array, name: string) {
	const res = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, {
		filename: name, sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId
	});
	expect(res.status, await res.clone().text()).toBe(201);
	return (await res.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
}

const put = (a: { upload: { url: string; headers: Record<string, string> } }, body: Uint8Array) =>
	fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: body as Uint8Array<ArrayBuffer> });

beforeAll(async () => {
	k = testDb();
	({ tree, acoustician } = await acousticianWithProject(k));
});
afterAll(async () => k.destroy());

describe('the orphaned-object sweep', () => {
	it('removes an object stored through a reused upload URL after its capture was refused, keeps what rows name', async () => {
		// A file refused at confirm (not a WAV): its row and object are removed…
		const notWav = new Uint8Array(2000).fill(7);
		const refused = await announce(notWav, 'refused.wav');
		expect((await put(refused, notWav)).status).toBe(200);
		const { object_key: refusedKey } = await k('captures').where({ id: refused.capture.id }).first('object_key');
		const confirm = await acoustician.request('POST', `/api/captures/${refused.capture.id}/uploaded`, { headers: { accept: 'application/json' } });
		expect(confirm.status).toBe(422);
		expect(await k('captures').where({ id: refused.capture.id }).first()).toBeUndefined();
		expect(await exists(refusedKey)).toBe(false);
		// …but its presigned URL still works until it expires: the object comes back, no row knows it.
		expect((await put(refused, notWav)).status).toBe(200);
		expect(await exists(refusedKey)).toBe(true);

		// An upload still on its way: announced, stored, not yet confirmed.
		const pendingWav = decayWav({ seed: 9001, durationS: 0.4 });
		const pending = await announce(pendingWav, 'pending.wav');
		expect((await put(pending, pendingWav)).status).toBe(200);
		const { object_key: pendingKey } = await k('captures').where({ id: pending.capture.id }).first('object_key');
		// A test signal's object, and an object of a kind the sweep does not look after.
		const sweepKey = newObjectKey('sweeps');
		await s3.put(sweepKey, pendingWav, 'audio/wav', pendingWav.byteLength);
		await k('sweep_definitions').insert({
			organization_id: (await k('projects').where({ id: tree.projectId }).first('organization_id')).organization_id,
			name: 'Kept sweep', f1_hz: 20, f2_hz: 20000, duration_s: 5, fade_in_s: 0.05, fade_out_s: 0.05, silence_s: 2, sample_rate: 48000, bit_depth: '24', level_dbfs: -12, object_key: sweepKey
		});
		const unknownKindKey = `unswept-kind/${Date.now()}.bin`;
		await s3.put(unknownKindKey, notWav, 'application/octet-stream', notWav.byteLength);

		// A day from now, nothing here is old yet: the sweep keeps the orphan too.
		await removeOrphanObjects(k, s3);
		expect(await exists(refusedKey)).toBe(true);

		// Taken as more than a day old (every object stored before a minute from now):
		const removed = await removeOrphanObjects(k, s3, new Date(Date.now() + 60_000));
		expect(removed).toBeGreaterThanOrEqual(1);
		expect(await exists(refusedKey)).toBe(false);
		expect(await exists(pendingKey)).toBe(true);
		expect(await exists(sweepKey)).toBe(true);
		expect(await exists(unknownKindKey)).toBe(true);
		// The pending upload can still be confirmed afterwards.
		const confirmed = await acoustician.request('POST', `/api/captures/${pending.capture.id}/uploaded`, { headers: { accept: 'application/json' } });
		expect(confirmed.status, await confirmed.clone().text()).toBe(200);
	});

	it('looks after calibrator recordings too: an orphaned one goes, the ones input chains name stay', async () => {
		const orphan = newObjectKey('calibrators');
		const tone = decayWav({ seed: 9002, durationS: 0.2 });
		await s3.put(orphan, tone, 'audio/wav', tone.byteLength);
		// The demo seeds calibrated visits (scripts/demo/seed-calibration.ts): their recordings are named by rows.
		const named = (await k('input_chains').whereNotNull('calibrator_object_key').pluck('calibrator_object_key')) as string[];
		expect(named.length).toBeGreaterThan(0);
		await removeOrphanObjects(k, s3, new Date(Date.now() + 60_000));
		expect(await exists(orphan)).toBe(false);
		for (const key of named) expect(await exists(key), key).toBe(true);
	});
});
