import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { type ProjectTree } from '../helpers/factories';
import { acousticianWithProject, Client } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';

// The upload check reads a WAV's header from the object store with ranged reads, walking the
// RIFF chunk list (RIFF chunks: id, 32-bit little-endian size, body, pad byte — Microsoft/IBM
// "Multimedia Programming Interface and Data Specifications 1.0", 1991). A recorder that writes
// a long LIST of tags before its format chunk makes a valid file; it must be read, not refused.
let k: Knex;
let tree: ProjectTree;
let acoustician: Client;
const s3 = createStorage(loadConfig(process.env));

/** The same file with a LIST chunk of `bytes` bytes between the RIFF header and `fmt `. */
function withListChunk(wav: Uint8Array, bytes: number): Uint8Array {
	const list = new Uint8Array(8 + bytes + (bytes % 2));
	list.set([0x4c, 0x49, 0x53, 0x54, 0, 0, 0, 0, 0x49, 0x4e, 0x46, 0x4f]); // "LIST" size "INFO"
	new DataView(list.buffer).setUint32(4, bytes, true);
	list.fill(0x41, 12, 8 + bytes);
	const out = new Uint8Array(wav.length + list.length);
	out.set(wav.subarray(0, 12), 0);
	out.set(list, 12);
	out.set(wav.subarray(12), 12 + list.length);
	new DataView(out.buffer).setUint32(4, out.length - 8, true);
	return out;
}

async function upload(wav: Uint8Array): Promise<{ id: number; objectKey: string; confirm: Response }> {
	const res = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, {
		filename: 'P1-tagged.wav',
		sizeBytes: wav.byteLength,
		sha256: sha256(wav),
		kind: 'impulse',
		positionId: tree.positionId
	});
	expect(res.status, await res.clone().text()).toBe(201);
	const a = (await res.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
	const put = await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: wav as Uint8Array<ArrayBuffer> });
	expect(put.status).toBe(200);
	const { object_key: objectKey } = await k('captures').where({ id: a.capture.id }).first('object_key');
	const confirm = await acoustician.request('POST', `/api/captures/${a.capture.id}/uploaded`, { headers: { accept: 'application/json' } });
	return { id: a.capture.id, objectKey, confirm };
}

beforeAll(async () => {
	k = testDb();
	({ tree, acoustician } = await acousticianWithProject(k));
});
afterAll(async () => k.destroy());

describe('a WAV with a long LIST chunk before its format chunk', () => {
	it('is accepted at upload (70 kB of tags, more than the first read) and analysed', async () => {
		const wav = withListChunk(decayWav({ t60S: 0.5, seed: 71 }), 70_000);
		const { id, confirm } = await upload(wav);
		expect(confirm.status, await confirm.clone().text()).toBe(200);
		const row = await k('captures').where({ id }).first();
		expect(row.status).toBe('queued');
		expect(row.sample_rate).toBe(48_000);
		expect(row.channels).toBe(1);
		expect(Number(row.duration_s)).toBeCloseTo(1.5, 3);
		for (let i = 0; i < 40; i++) {
			const open = await k('captures').where({ id }).whereIn('status', ['queued', 'analysing']).first();
			if (!open) break;
			if (!(await runNextJob(k, s3, { owner: 'wav-chunks-test' }))) await new Promise((r) => setTimeout(r, 50));
		}
		expect((await k('captures').where({ id }).first()).status).toBe('analysed');
	});

	it('is refused with the reason, and removed, when the LIST chunk claims more bytes than the file', async () => {
		const wav = withListChunk(decayWav({ seed: 72 }), 70_000);
		new DataView(wav.buffer).setUint32(16, 0x7fff_0000, true);
		const { id, objectKey, confirm } = await upload(wav);
		expect(confirm.status).toBe(422);
		expect(((await confirm.json()) as { message: string }).message).toMatch(/"LIST" chunk is longer than the file/);
		expect(await k('captures').where({ id }).first()).toBeUndefined();
		expect(await s3.head(objectKey)).toBeNull();
	});
});
