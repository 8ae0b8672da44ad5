import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { testDb } from '../helpers/db';
import { makeOrganization, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { acousticianWithProject, Client, signedInClient } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { encodeWav } from '../../src/lib/analysis';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import { readJson } from '../../src/lib/server/json-column';

// The capture pipeline against the running test server, the real MariaDB and the S3 fake:
// announce → PUT to the presigned URL → confirm → analysis job → result.
let k: Knex;
let tree: ProjectTree;
let acoustician: Client;
const c = loadConfig(process.env);
const s3 = createStorage(c);
const FIXTURES = join(import.meta.dirname, '../../fixtures');

interface Announced {
	capture: { id: number; status: string };
	upload: { url: string; headers: Record<string, string> };
}

async function announce(client: Client, sessionId: number, wav: Uint8Array, extra: Record<string, unknown> = {}) {
	return client.postJson(`/api/sessions/${sessionId}/captures`, {
		filename: 'P1-ir.wav',
		sizeBytes: wav.byteLength,
		sha256: sha256(wav),
		kind: 'impulse',
		positionId: tree.positionId,
		...extra
	});
}

async function uploadCapture(
	client: Client,
	sessionId: number,
	wav: Uint8Array,
	extra: Record<string, unknown> = {}
): Promise<{ id: number; objectKey: string; confirm: Response }> {
	const res = await announce(client, sessionId, wav, extra);
	expect(res.status, await res.clone().text()).toBe(201);
	const a = (await res.json()) as Announced;
	const put = await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: wav as Uint8Array<ArrayBuffer> });
	expect(put.status).toBe(200);
	// The object is in the store under the capture's key before the upload is confirmed.
	const { object_key: objectKey } = await k('captures').where({ id: a.capture.id }).first('object_key');
	expect((await s3.head(objectKey))?.size).toBe(wav.byteLength);
	const confirm = await client.request('POST', `/api/captures/${a.capture.id}/uploaded`, { headers: { accept: 'application/json' } });
	return { id: a.capture.id, objectKey, confirm };
}

/** Run queued jobs in this process until the given captures are settled. */
async function drain(captureIds: number[], storage = s3, limit = 60): Promise<void> {
	for (let i = 0; i < limit; i++) {
		const open = await k('captures').whereIn('id', captureIds).whereIn('status', ['queued', 'analysing']).count({ n: '*' }).first();
		if (Number(open?.n) === 0) return;
		const outcome = await runNextJob(k, storage, { owner: 'integration-test' });
		if (!outcome) await new Promise((r) => setTimeout(r, 50));
	}
	throw new Error('captures did not settle');
}

beforeAll(async () => {
	k = testDb();
	({ tree, acoustician } = await acousticianWithProject(k));
});
afterAll(async () => k.destroy());

describe('a good impulse response', () => {
	it('is uploaded, queued, analysed exactly once, and its result stored with the engine version', async () => {
		const wav = decayWav({ t60S: 0.5, seed: 11 });
		const { id, confirm } = await uploadCapture(acoustician, tree.sessionId, wav);
		expect(confirm.status).toBe(200);
		expect(((await confirm.json()) as { capture: { status: string } }).capture.status).toBe('queued');
		const row = await k('captures').where({ id }).first();
		expect(row.object_key).toMatch(/^captures\/[0-9a-f-]{36}\.wav$/); // random, not guessable
		expect(await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [id]).count({ n: '*' }).first()).toEqual({ n: 1 });

		await drain([id]);
		const after = await k('captures').where({ id }).first();
		expect(after.status).toBe('analysed');
		const analyses = await k('analyses').where({ capture_id: id });
		expect(analyses).toHaveLength(1);
		const metrics = readJson<{ broadband: { t30S: number } }>(analyses[0].metrics);
		// An ideal exponential decay of T = 0.5 s: T30 within 5 % (ISO 3382-1 Annex A JND).
		expect(Math.abs(metrics.broadband.t30S - 0.5) / 0.5).toBeLessThan(0.05);
		expect(analyses[0].engine_version).toMatch(/^\d+\.\d+\.\d+$/);

		const api = await acoustician.get(`/api/captures/${id}/analysis`, { accept: 'application/json' });
		const body = (await api.json()) as { curves: { frequencyResponse: { freqHz: number[] } } };
		expect(body.curves.frequencyResponse.freqHz.length).toBeGreaterThan(100);
	});

	it('is flagged, not stored twice, when the same file is added again', async () => {
		const wav = decayWav({ seed: 12 });
		const { id } = await uploadCapture(acoustician, tree.sessionId, wav);
		const before = await k('captures').where({ session_id: tree.sessionId }).count({ n: '*' }).first();
		const again = await announce(acoustician, tree.sessionId, wav, { filename: 'copy.wav' });
		expect(again.status).toBe(409);
		expect(await again.json()).toMatchObject({ duplicateOf: id });
		expect(await k('captures').where({ session_id: tree.sessionId }).count({ n: '*' }).first()).toEqual(before);
	});

	it('can be re-run, replacing its result rather than adding one', async () => {
		const { id } = await uploadCapture(acoustician, tree.sessionId, decayWav({ seed: 13 }));
		await drain([id]);
		const rerun = await acoustician.request('POST', `/api/captures/${id}/rerun`, { headers: { accept: 'application/json' } });
		expect(rerun.status).toBe(202);
		expect((await k('captures').where({ id }).first()).status).toBe('queued');
		await drain([id]);
		expect(await k('analyses').where({ capture_id: id }).count({ n: '*' }).first()).toEqual({ n: 1 });
	});

	it('can be moved to a new position, downloaded, and deleted with its object and rows (audited)', async () => {
		const wav = decayWav({ seed: 14 });
		const { id } = await uploadCapture(acoustician, tree.sessionId, wav);
		await drain([id]);
		const moved = await acoustician.request('PATCH', `/api/captures/${id}`, { body: JSON.stringify({ newPositionLabel: 'P9' }), headers: { 'content-type': 'application/json', accept: 'application/json' } });
		expect(moved.status).toBe(200);
		expect(((await moved.json()) as { capture: { positionLabel: string } }).capture.positionLabel).toBe('P9');

		const dl = await acoustician.get(`/api/captures/${id}/download`);
		expect(dl.status).toBe(302);
		const file = await fetch(dl.headers.get('location')!);
		expect(sha256(new Uint8Array(await file.arrayBuffer()))).toBe(sha256(wav));

		const key = (await k('captures').where({ id }).first()).object_key;
		const del = await acoustician.request('DELETE', `/api/captures/${id}`);
		expect(del.status).toBe(204);
		expect(await k('captures').where({ id }).first()).toBeUndefined();
		expect(await k('analyses').where({ capture_id: id }).first()).toBeUndefined();
		expect(await s3.head(key)).toBeNull();
		expect(await k('audit_events').where({ action: 'capture.deleted', entity_id: id }).first()).toBeTruthy();
	});

	it('is accepted through the server-side multipart route too', async () => {
		const wav = decayWav({ seed: 15 });
		const form = new FormData();
		form.set('file', new Blob([wav as Uint8Array<ArrayBuffer>], { type: 'audio/wav' }), 'scripted-P2.wav');
		form.set('kind', 'impulse');
		form.set('newPositionLabel', 'P2');
		const res = await acoustician.request('POST', `/api/sessions/${tree.sessionId}/captures/upload`, { body: form, headers: { accept: 'application/json' } });
		expect(res.status, await res.clone().text()).toBe(201);
		const { capture } = (await res.json()) as { capture: { id: number; status: string } };
		expect(capture.status).toBe('queued');
		const row = await k('captures').where({ id: capture.id }).first();
		expect(row.sha256).toBe(sha256(wav));
		expect((await s3.head(row.object_key))?.size).toBe(wav.byteLength);
	});

	it('deconvolves a recorded sweep against the uploaded reference', async () => {
		const recorded = new Uint8Array(readFileSync(join(FIXTURES, 'sweep-recorded-48k.wav')));
		const reference = new Uint8Array(readFileSync(join(FIXTURES, 'sweep-1s-48k.wav')));
		const form = new FormData();
		form.set('file', new Blob([recorded], { type: 'audio/wav' }), 'P3-sweep.wav');
		form.set('reference', new Blob([reference], { type: 'audio/wav' }), 'played.wav');
		form.set('kind', 'sweep');
		form.set('newPositionLabel', 'P3');
		const res = await acoustician.request('POST', `/api/sessions/${tree.sessionId}/captures/upload`, { body: form, headers: { accept: 'application/json' } });
		expect(res.status, await res.clone().text()).toBe(201);
		const { capture } = (await res.json()) as { capture: { id: number } };
		await drain([capture.id]);
		const row = await k('captures').where({ id: capture.id }).first();
		expect(row.status, row.error).toBe('analysed');
		const metrics = readJson<{ deconvolution: unknown }>((await k('analyses').where({ capture_id: capture.id }).first()).metrics);
		expect(metrics.deconvolution).not.toBeNull();
	});
});

describe('bad input is refused and leaves nothing behind', () => {
	const countRows = async () => Number((await k('captures').where({ session_id: tree.sessionId }).count({ n: '*' }).first())?.n);

	it.each([
		['a file that is not a WAV by name', { filename: 'notes.txt' }, 422, 'Only WAV files'],
		['an oversized file', { sizeBytes: c.UPLOAD_MAX_BYTES + 1 }, 422, 'larger than'],
		['a file too small to be a WAV', { sizeBytes: 10 }, 422, 'too small'],
		['a recorded sweep without its reference', { kind: 'sweep' }, 422, 'needs the sweep that was played'],
		['a bad checksum', { sha256: 'xyz' }, 422, 'SHA-256'],
		['a channel out of range', { channel: 9 }, 422, '8 channels']
	])('refuses %s before upload', async (_, change, status, text) => {
		const before = await countRows();
		const res = await announce(acoustician, tree.sessionId, decayWav({ seed: 21 }), change);
		expect(res.status).toBe(status);
		expect(JSON.stringify(await res.json())).toContain(text);
		expect(await countRows()).toBe(before);
	});

	it('refuses a non-JSON body with 400', async () => {
		const res = await acoustician.request('POST', `/api/sessions/${tree.sessionId}/captures`, { body: 'filename=x.wav', headers: { 'content-type': 'application/json', accept: 'application/json' } });
		expect(res.status).toBe(400);
	});

	const truncated = () => {
		const good = decayWav({ seed: 22 });
		return good.slice(0, good.length - 5000); // the data chunk now claims more than the file holds
	};
	const tooLong = () => encodeWav(new Float64Array(44_100 * (c.ANALYSIS_MAX_DURATION_S + 1)), 44_100, 16);
	const notWav = () => new TextEncoder().encode('This is a text file, not audio. '.repeat(20));

	it.each([
		['a file that is not RIFF/WAVE inside', notWav, 'not a WAV file'],
		['a truncated file', truncated, 'truncated'],
		['a recording over the duration limit', tooLong, 'limit']
	])('refuses %s at upload and removes its row and object', async (_, make, text) => {
		const before = await countRows();
		const wav = make();
		const { id, objectKey, confirm } = await uploadCapture(acoustician, tree.sessionId, wav, { filename: 'bad.wav' });
		expect(confirm.status).toBe(422);
		expect(((await confirm.json()) as { message: string }).message).toContain(text);
		expect(await k('captures').where({ id }).first()).toBeUndefined();
		expect(await countRows()).toBe(before);
		expect(await k('audit_events').where({ action: 'capture.refused', entity_id: id }).first()).toBeTruthy();
		// The object is gone from the store too: HEAD answers NotFound.
		expect(await s3.head(objectKey)).toBeNull();
	});

	it('refuses a file whose size differs from what was announced, and removes it', async () => {
		const wav = decayWav({ seed: 23 });
		const res = await announce(acoustician, tree.sessionId, wav);
		const a = (await res.json()) as Announced;
		const row = await k('captures').where({ id: a.capture.id }).first();
		// Write a different object behind the presigned URL's back.
		await s3.put(row.object_key, wav.slice(0, 1000), 'audio/wav', 1000);
		const confirm = await acoustician.request('POST', `/api/captures/${a.capture.id}/uploaded`, { headers: { accept: 'application/json' } });
		expect(confirm.status).toBe(422);
		expect(await s3.head(row.object_key)).toBeNull();
		expect(await k('captures').where({ id: a.capture.id }).first()).toBeUndefined();
	});

	it('fails a capture whose object changed after upload (checksum), with a reason', async () => {
		const wav = decayWav({ seed: 24 });
		const { id } = await uploadCapture(acoustician, tree.sessionId, wav);
		const row = await k('captures').where({ id }).first();
		const tampered = decayWav({ seed: 25 });
		await s3.put(row.object_key, tampered, 'audio/wav', tampered.byteLength);
		await drain([id]);
		const after = await k('captures').where({ id }).first();
		expect(after.status).toBe('failed');
		expect(after.error).toContain('SHA-256');
	});

	it('fails a capture that is all noise with a reason a person can act on', async () => {
		const { id } = await uploadCapture(acoustician, tree.sessionId, decayWav({ seed: 26, t60S: 0.4, noiseDbRePeak: -12 }));
		await drain([id]);
		const after = await k('captures').where({ id }).first();
		expect(after.status).toBe('failed');
		expect(after.error).toMatch(/peak-to-noise|noise/i);
		// Its page says why and offers no band-value downloads; asked for anyway, they are refused with the reason.
		const page = await acoustician.get(`/captures/${id}`);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain('This capture could not be analysed');
		expect(html).not.toContain(`/api/captures/${id}/export`);
		const exported = await acoustician.get(`/api/captures/${id}/export?format=csv`);
		expect(exported.status).toBe(409);
		expect(await exported.text()).toContain('could not be analysed');
	});
});

describe('object storage down', () => {
	const dead = createStorage({ ...c, S3_ENDPOINT: 'http://127.0.0.1:9' });

	it('when an upload starts: a clear error and no row', async () => {
		const { createCapture } = await import('../../src/lib/server/captures/service');
		const before = Number((await k('captures').count({ n: '*' }).first())?.n);
		const scope = { organizationId: 0, projectId: tree.projectId, role: 'acoustician' as const, user: { id: 1, email: '', name: '', unitSystem: 'metric' as const } };
		const wav = decayWav({ seed: 31 });
		await expect(createCapture(scope, tree.sessionId, { filename: 'x.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId, channel: 0 }, dead)).rejects.toThrow(/not reachable/);
		expect(Number((await k('captures').count({ n: '*' }).first())?.n)).toBe(before);
	});

	it('during a job: the job is retried and succeeds once storage is back', async () => {
		const { id } = await uploadCapture(acoustician, tree.sessionId, decayWav({ seed: 32 }));
		// Put this capture's job first in line (the queue takes the earliest run_after), so the dead
		// store meets it whatever other files left queued.
		await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [id]).update({ run_after: new Date('2000-01-01T00:00:00Z') });
		const outcome = await runNextJob(k, dead, { owner: 'integration-test' });
		expect(outcome?.job.payload).toMatchObject({ captureId: id });
		expect(outcome?.result).toBe('retry');
		const job = await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [id]).first();
		expect(job).toMatchObject({ status: 'queued', attempts: 1 });
		expect(job.last_error).toMatch(/not reachable/);
		expect((await k('captures').where({ id }).first()).status).toBe('queued');
		await k('jobs').where({ id: job.id }).update({ run_after: new Date('2000-01-01T00:00:00Z') }); // skip the back-off wait, first in line again
		await drain([id]);
		expect((await k('captures').where({ id }).first()).status).toBe('analysed');
		expect(await k('analyses').where({ capture_id: id }).count({ n: '*' }).first()).toEqual({ n: 1 });
	});
});

describe('who may upload and see captures', () => {
	it('a consultant and a client cannot upload (403)', async () => {
		const org = (await k('projects').where({ id: tree.projectId }).first()).organization_id;
		const consultant = await makeUser(k, org, 'consultant');
		const client = await makeUser(k, org, 'client');
		await k('project_members').insert({ project_id: tree.projectId, user_id: client.id });
		for (const u of [consultant, client]) {
			const http = await signedInClient(u.email, TEST_PASSWORD);
			const res = await announce(http, tree.sessionId, decayWav({ seed: 41 }));
			expect(res.status).toBe(403);
		}
	});

	it("an acoustician of another organization can neither see nor download another's capture (404)", async () => {
		const { id } = await uploadCapture(acoustician, tree.sessionId, decayWav({ seed: 42 }));
		const otherOrg = await makeOrganization(k);
		const stranger = await signedInClient((await makeUser(k, otherOrg, 'acoustician')).email, TEST_PASSWORD);
		for (const path of [`/api/captures/${id}`, `/api/captures/${id}/download`, `/api/captures/${id}/analysis`, `/api/sessions/${tree.sessionId}/captures`]) {
			expect((await stranger.get(path, { accept: 'application/json' })).status, path).toBe(404);
		}
		expect((await stranger.request('DELETE', `/api/captures/${id}`)).status).toBe(404);
		expect(await k('captures').where({ id }).first()).toBeTruthy();
	});
});
