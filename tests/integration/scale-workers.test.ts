// Two worker processes on one MariaDB and one object store behave as one: files uploaded at
// once into two visits, through the running web server, while both workers poll the same job
// table — every capture is analysed exactly once (one claim, one result), and each visit's
// acoustician gets exactly one "analysed" e-mail.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, type Client } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';

const ROOT = join(import.meta.dirname, '../..');
const FILES_PER_VISIT = 15;
let k: Knex;
const visits: { tree: ProjectTree; client: Client; email: string }[] = [];
const workers: { process: ChildProcess; log: string[] }[] = [];
const s3 = createStorage(loadConfig(process.env));

function startWorker(name: string) {
	// A lease long enough for any one analysis on a busy machine: a lapse would make a second
	// (still single) result, but a second claim, and this test counts claims.
	const w = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
		cwd: ROOT,
		env: { ...process.env, NODE_OPTIONS: '', JOB_LEASE_MS: '30000', WORKER_POLL_MS: '100' },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	const entry = { process: w, log: [] as string[] };
	w.stdout!.on('data', (d) => entry.log.push(`${name}: ${d}`));
	w.stderr!.on('data', (d) => entry.log.push(`${name}: ${d}`));
	workers.push(entry);
}

async function waitUntil(check: () => Promise<boolean>, what: string, timeoutMs: number): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (!(await check())) {
		if (Date.now() > until) throw new Error(`timed out waiting for ${what}\n${workers.flatMap((w) => w.log).join('')}`);
		await new Promise((r) => setTimeout(r, 100));
	}
}

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	for (let v = 0; v < 2; v++) {
		const user = await makeUser(k, org, 'acoustician');
		const tree = await makeProjectTree(k, org);
		await k('sessions').where({ id: tree.sessionId }).update({ acoustician_id: user.id });
		visits.push({ tree, client: await signedInClient(user.email, TEST_PASSWORD), email: user.email });
	}
	// Settle what other tests left queued, so the workers meet only these jobs.
	while (await runNextJob(k, s3, { owner: 'integration-test' }));
});

afterEach(() => {
	for (const w of workers.splice(0)) if (w.process.exitCode === null) w.process.kill('SIGKILL');
});
afterAll(async () => k.destroy());

describe('two workers on one database and one object store', () => {
	it(`${2 * FILES_PER_VISIT} files uploaded at once into two visits: each analysed exactly once, one e-mail per visit`, async () => {
		startWorker('worker A');
		startWorker('worker B');

		// All files of both visits announced at once, then all uploaded and confirmed at once.
		const files = visits.flatMap((v, vi) => Array.from({ length: FILES_PER_VISIT }, (_, i) => ({ v, wav: decayWav({ seed: 9100 + vi * 100 + i, durationS: 0.6 }), label: `Seat ${i % 4}` })));
		const announced = await Promise.all(
			files.map(async ({ v, wav, label }) => {
				const res = await v.client.postJson(`/api/sessions/${v.tree.sessionId}/captures`, {
					filename: `${label}-${sha256(wav).slice(0, 6)}.wav`, sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', newPositionLabel: label
				});
				expect(res.status, await res.clone().text()).toBe(201);
				return (await res.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
			})
		);
		const confirmed = await Promise.all(
			announced.map(async (a, i) => {
				const put = await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: files[i].wav as Uint8Array<ArrayBuffer> });
				expect(put.status).toBe(200);
				return (await files[i].v.client.request('POST', `/api/captures/${a.capture.id}/uploaded`, { headers: { accept: 'application/json' } })).status;
			})
		);
		expect(confirmed.filter((s) => s !== 200)).toEqual([]);

		const ids = announced.map((a) => a.capture.id);
		await waitUntil(
			async () => Number((await k('captures').whereIn('id', ids).whereIn('status', ['analysed', 'failed']).count({ n: '*' }).first())?.n) === ids.length,
			'every capture to be settled',
			240_000
		);

		const captures = await k('captures').whereIn('id', ids).select('id', 'status', 'error', 'analysis_attempts');
		expect(captures.filter((c) => c.status !== 'analysed'), JSON.stringify(captures)).toEqual([]);
		// One result per capture, written by one run of one worker.
		expect(captures.map((c) => c.analysis_attempts)).toEqual(Array(ids.length).fill(1));
		const analyses = await k('analyses').whereIn('capture_id', ids).select('capture_id');
		expect(analyses).toHaveLength(ids.length);
		const jobs = await k('jobs').whereRaw(`JSON_VALUE(payload, '$.captureId') IN (${ids.map(() => '?').join(',')})`, ids).select('status', 'attempts');
		expect(jobs).toHaveLength(ids.length);
		expect(jobs.filter((j) => j.status !== 'done' || j.attempts !== 1), JSON.stringify(jobs)).toEqual([]);
		// Each visit's acoustician is told once that the visit is analysed.
		for (const v of visits) {
			await waitUntil(async () => Boolean(await k('email_outbox').where({ to_address: v.email, kind: 'session-analysed' }).first()), `the e-mail to ${v.email}`, 30_000);
		}
		await new Promise((r) => setTimeout(r, 500)); // a late duplicate would show by now
		for (const v of visits) {
			expect(await k('email_outbox').where({ to_address: v.email, kind: 'session-analysed' }).count({ n: '*' }).first()).toEqual({ n: 1 });
		}
		// Neither worker logged an error.
		expect(workers.flatMap((w) => w.log).filter((l) => /error|failed/i.test(l))).toEqual([]);
	}, 300_000);
});
