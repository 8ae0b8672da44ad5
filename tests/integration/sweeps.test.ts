import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { sha256 } from '../helpers/wav';
import { decodeWav } from '../../src/lib/analysis';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import { readJson } from '../../src/lib/server/json-column';

// Test signals: made and downloaded from the Test signal page; recordings of one are
// deconvolved against exactly the stored signal.
const FIXTURES = join(import.meta.dirname, '../../fixtures');
const s3 = createStorage(loadConfig(process.env));
let k: Knex;
let tree: ProjectTree;
let org: number;
let acoustician: Client;

beforeAll(async () => {
	k = testDb();
	org = await makeOrganization(k);
	tree = await makeProjectTree(k, org);
	acoustician = await signedInClient((await makeUser(k, org, 'acoustician')).email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

describe('test signals', () => {
	it('are made from the form and download as the WAV that was asked for', async () => {
		const res = await acoustician.postForm('/signal?/create', { name: 'Check sweep', sampleRate: '96000', bitDepth: '24', f1Hz: '20', f2Hz: '20000', durationS: '2', silenceS: '1', levelDbfs: '-6', fadeS: '0.05' });
		expect(res.status).toBe(303);
		const sweep = await k('sweep_definitions').where({ organization_id: org, name: 'Check sweep' }).first();
		const dl = await acoustician.get(`/api/sweeps/${sweep.id}/download`);
		expect(dl.status).toBe(200);
		expect(dl.headers.get('content-disposition')).toContain('.wav');
		const wav = decodeWav(new Uint8Array(await dl.arrayBuffer()));
		expect(wav.sampleRate).toBe(96_000);
		expect(wav.bitDepth).toBe(24);
		expect(wav.durationS).toBeCloseTo(3, 3); // 2 s sweep + 1 s silence
		let peak = 0;
		for (const v of wav.samples) peak = Math.max(peak, Math.abs(v));
		// −6 dBFS peak = 10^(−6/20) = 0.501, within 24-bit quantisation (and the fades).
		expect(peak).toBeGreaterThan(0.49);
		expect(peak).toBeLessThan(0.502);
	});

	it.each([
		['an end frequency above half the sample rate', { sampleRate: '44100', f2Hz: '24000' }, 'half the sample rate'],
		['no headroom', { levelDbfs: '0' }, 'headroom'],
		['less than three octaves', { f1Hz: '500', f2Hz: '2000' }, 'three octaves']
	])('refuse %s', async (_, change, reason) => {
		const res = await acoustician.postForm('/signal?/create', { name: 'Bad', sampleRate: '48000', bitDepth: '24', f1Hz: '20', f2Hz: '20000', durationS: '5', silenceS: '2', levelDbfs: '-6', fadeS: '0.05', ...change });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain(reason);
	});

	it('deconvolve a recording against the stored test signal', async () => {
		// The fixture sweep (20 Hz – 20 kHz, 1 s) stored as this organization's test signal.
		const reference = new Uint8Array(readFileSync(join(FIXTURES, 'sweep-1s-48k.wav')));
		const key = `sweeps/${randomUUID()}.wav`;
		await s3.put(key, reference, 'audio/wav', reference.byteLength);
		const [sweepId] = await k('sweep_definitions').insert({ organization_id: org, name: 'Fixture sweep', f1_hz: 20, f2_hz: 20000, duration_s: 1, fade_in_s: 0.05, fade_out_s: 0.01, silence_s: 0, sample_rate: 48000, bit_depth: '16', level_dbfs: -6, object_key: key });

		const recorded = new Uint8Array(readFileSync(join(FIXTURES, 'sweep-recorded-48k.wav')));
		const res = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, { filename: 'P1-sweep.wav', sizeBytes: recorded.byteLength, sha256: sha256(recorded), kind: 'sweep', positionId: tree.positionId, sweepDefinitionId: sweepId });
		expect(res.status).toBe(201);
		const a = (await res.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
		await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: recorded });
		expect((await acoustician.request('POST', `/api/captures/${a.capture.id}/uploaded`)).status).toBe(200);
		// Run the queue until this capture is settled (jobs queued by earlier files may come first).
		const settled = async () => ['analysed', 'failed'].includes((await k('captures').where({ id: a.capture.id }).first('status')).status);
		for (let i = 0; i < 400 && !(await settled()) && (await runNextJob(k, s3, { owner: 'sweep-test' })); i++);
		const row = await k('captures').where({ id: a.capture.id }).first();
		expect(row.status, row.error).toBe('analysed');
		const metrics = readJson<{ broadband: { t30S: number }; deconvolution: { f1Hz: number } }>((await k('analyses').where({ capture_id: a.capture.id }).first()).metrics);
		// The fixture's room decays with T = 0.4 s (fixtures/README.md): within 10 % after deconvolution.
		expect(Math.abs(metrics.broadband.t30S - 0.4) / 0.4).toBeLessThan(0.1);
		expect(metrics.deconvolution.f1Hz).toBe(20);
	});

	it('are not for clients or another organization', async () => {
		const sweep = await k('sweep_definitions').where({ organization_id: org }).first('id');
		const clientUser = await makeUser(k, org, 'client');
		const client = await signedInClient(clientUser.email, TEST_PASSWORD);
		expect((await client.get(`/api/sweeps/${sweep.id}/download`)).status).toBe(404);
		expect((await client.get('/signal', { accept: 'text/html' })).status).toBe(403);
		const stranger = await signedInClient((await makeUser(k, await makeOrganization(k), 'acoustician')).email, TEST_PASSWORD);
		expect((await stranger.get(`/api/sweeps/${sweep.id}/download`)).status).toBe(404);
	});
});
