// Object storage that takes the connection and then says nothing (a paused or overloaded store):
// announce, confirm, the test-signal download and the scripted upload answer 503 with a message
// that says storage is briefly unreachable — within seconds, instead of hanging — and write
// nothing. A private web server talks to a silent TCP server in place of the store; the shared
// store stays up.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer, type Server, type Socket } from 'node:net';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { startPrivateServer, type PrivateServer } from '../helpers/private-server';
import { decayWav, sha256 } from '../helpers/wav';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { confirmUpload, createCapture } from '../../src/lib/server/captures/service';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import { Problem } from '../../src/lib/server/problem';
import type { Scope } from '../../src/lib/server/auth/access';

const SILENT_PORT = 3329;
const APP_PORT = 3198;
// Two tries of the 5 s idle timeout, and some slack for a busy machine; without timeouts each of
// these requests waited as long as the caller did.
const ANSWER_WITHIN_MS = 15_000;
// The rest of the test gives the store a 1.5 s idle timeout, so each refusal takes 3 s, not 10.
const SHORT_IDLE = { S3_IDLE_TIMEOUT_MS: '1500' };
const SHORT_ANSWER_WITHIN_MS = 8_000;

let k: Knex;
let tree: ProjectTree;
let scope: Scope;
let app: PrivateServer;
let silent: Server;
const sockets = new Set<Socket>();
let cookie: string;
const s3 = createStorage(loadConfig(process.env));
const silentAt = { S3_ENDPOINT: `http://127.0.0.1:${SILENT_PORT}` };
/** With the default timeouts, as a web server or worker runs. */
const silentStoreAsDeployed = createStorage(loadConfig({ ...process.env, ...silentAt }));
const silentStore = createStorage(loadConfig({ ...process.env, ...silentAt, ...SHORT_IDLE }));

async function timed(request: () => Promise<Response>): Promise<{ res: Response; ms: number; body: { message?: string; code?: string } }> {
	const t0 = Date.now();
	const res = await request();
	const body = await res.json();
	return { res, ms: Date.now() - t0, body };
}

function post(path: string, init: { json?: unknown; form?: FormData } = {}): Promise<Response> {
	const headers: Record<string, string> = { origin: app.url, cookie, accept: 'application/json' };
	if (init.json !== undefined) headers['content-type'] = 'application/json';
	return fetch(app.url + path, { method: 'POST', headers, body: init.form ?? (init.json === undefined ? undefined : JSON.stringify(init.json)), redirect: 'manual' });
}

function expectStorageUnavailable(r: { res: Response; ms: number; body: { message?: string; code?: string } }) {
	expect(r.res.status).toBe(503);
	expect(r.body.code).toBe('unavailable');
	expect(r.body.message).toMatch(/Object storage is not reachable right now/);
	expect(r.ms).toBeLessThan(SHORT_ANSWER_WITHIN_MS);
}

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const user = await makeUser(k, org, 'acoustician');
	tree = await makeProjectTree(k, org);
	scope = { organizationId: org, projectId: tree.projectId, role: 'acoustician', user: { id: user.id, email: user.email, name: 'Test', unitSystem: 'metric' } };
	// Accepts every connection, reads what it is sent, never answers.
	silent = createServer((socket) => {
		sockets.add(socket);
		socket.on('data', () => {});
		socket.on('error', () => {});
		socket.on('close', () => sockets.delete(socket));
	});
	await new Promise<void>((ok) => silent.listen(SILENT_PORT, '127.0.0.1', ok));
	app = await startPrivateServer(APP_PORT, { ...silentAt, ...SHORT_IDLE });
	const signIn = await fetch(`${app.url}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: app.url, 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
		body: new URLSearchParams({ email: user.email, password: TEST_PASSWORD, redirectTo: '/projects' })
	});
	expect(signIn.status).toBe(303);
	cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}, 120_000);

afterAll(async () => {
	await app?.stop();
	for (const s of sockets) s.destroy();
	await new Promise((ok) => silent?.close(ok));
	await k.destroy();
});

describe('a store that accepts connections and never answers', () => {
	it('every storage call gives up with a 503 problem within seconds', async () => {
		const calls = [
			{ store: silentStoreAsDeployed, call: (s: typeof silentStore) => s.ping(), within: ANSWER_WITHIN_MS },
			...[(s: typeof silentStore) => s.ping(), (s: typeof silentStore) => s.head('captures/x.wav'), (s: typeof silentStore) => s.getBytes('captures/x.wav'), (s: typeof silentStore) => s.list('captures/')].map(
				(call) => ({ store: silentStore, call, within: SHORT_ANSWER_WITHIN_MS })
			)
		];
		for (const { store, call, within } of calls) {
			const t0 = Date.now();
			const e = await call(store).then(() => null, (err: unknown) => err);
			expect(e).toBeInstanceOf(Problem);
			expect((e as Problem).status).toBe(503);
			expect(Date.now() - t0).toBeLessThan(within);
		}
	}, 90_000);

	it('announce answers 503 with a clear message and writes nothing', async () => {
		const wav = decayWav({ seed: 8001, durationS: 0.4 });
		const r = await timed(() =>
			post(`/api/sessions/${tree.sessionId}/captures`, { json: { filename: 'a.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId } })
		);
		expectStorageUnavailable(r);
		expect(await k('captures').where({ session_id: tree.sessionId, sha256: sha256(wav) }).first()).toBeUndefined();
	}, 30_000);

	it('confirm answers 503 and the capture keeps waiting for its upload', async () => {
		// Announced and uploaded while the store was up (through the shared store).
		const wav = decayWav({ seed: 8002, durationS: 0.4 });
		const created = await createCapture(scope, tree.sessionId, { filename: 'b.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId, channel: 0 }, s3);
		await s3.put(created.capture.objectKey, wav, 'audio/wav', wav.byteLength);
		const r = await timed(() => post(`/api/captures/${created.capture.id}/uploaded`));
		expectStorageUnavailable(r);
		expect((await k('captures').where({ id: created.capture.id }).first()).status).toBe('awaiting_upload');
		// Once the store answers again the same confirm goes through.
		expect((await confirmUpload(scope, created.capture.id, s3)).status).toBe('queued');
	}, 30_000);

	it('the scripted upload answers 503 and leaves no capture behind', async () => {
		const wav = decayWav({ seed: 8003, durationS: 0.4 });
		const form = new FormData();
		form.set('file', new Blob([wav as Uint8Array<ArrayBuffer>], { type: 'audio/wav' }), 'scripted.wav');
		form.set('kind', 'impulse');
		form.set('newPositionLabel', 'Scripted');
		const r = await timed(() => post(`/api/sessions/${tree.sessionId}/captures/upload`, { form }));
		expectStorageUnavailable(r);
		expect(await k('captures').where({ session_id: tree.sessionId, sha256: sha256(wav) }).first()).toBeUndefined();
	}, 30_000);

	it('the test-signal download answers 503', async () => {
		const [sweepId] = await k('sweep_definitions').insert({
			organization_id: scope.organizationId, name: 'Outage sweep', f1_hz: 20, f2_hz: 20000, duration_s: 5, fade_in_s: 0.05, fade_out_s: 0.05,
			silence_s: 2, sample_rate: 48000, bit_depth: '24', level_dbfs: -12, object_key: `sweeps/outage-${Date.now()}.wav`
		});
		const r = await timed(() => fetch(`${app.url}/api/sweeps/${sweepId}/download`, { headers: { cookie, accept: 'application/json' } }));
		expectStorageUnavailable(r);
		await k('sweep_definitions').where({ id: sweepId }).del();
	}, 30_000);

	it('a worker that cannot download the file hands the job back to retry, the capture queued again', async () => {
		while (await runNextJob(k, s3, { owner: 'integration-test' })); // others' leftovers first
		const wav = decayWav({ seed: 8004, durationS: 0.4 });
		const created = await createCapture(scope, tree.sessionId, { filename: 'c.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId, channel: 0 }, s3);
		await s3.put(created.capture.objectKey, wav, 'audio/wav', wav.byteLength);
		await confirmUpload(scope, created.capture.id, s3);
		const t0 = Date.now();
		const outcome = await runNextJob(k, silentStore, { owner: 'cut-off-worker' });
		expect(Date.now() - t0).toBeLessThan(SHORT_ANSWER_WITHIN_MS);
		expect(outcome?.result).toBe('retry');
		const job = await k('jobs').where({ id: outcome!.job.id }).first();
		expect(job.status).toBe('queued');
		expect(job.last_error).toMatch(/Object storage is not reachable/);
		expect((await k('captures').where({ id: created.capture.id }).first()).status).toBe('queued');
	}, 30_000);
});
