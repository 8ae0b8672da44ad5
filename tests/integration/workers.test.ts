import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, type ProjectTree } from '../helpers/factories';
import { decayWav, sha256 } from '../helpers/wav';
import { encodeWav } from '../../src/lib/analysis';
import { exponentialNoiseDecay } from '../../src/lib/analysis/synthetic';
import { confirmUpload, createCapture } from '../../src/lib/server/captures/service';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import type { Scope } from '../../src/lib/server/auth/access';

// Real worker processes (scripts/worker.ts) against the job table: a worker killed mid-job,
// and two workers sharing a queue.
const ROOT = join(import.meta.dirname, '../..');
const LEASE_MS = 2_000;
let k: Knex;
let tree: ProjectTree;
let scope: Scope;
const s3 = createStorage(loadConfig(process.env));
const workers: ChildProcess[] = [];

function startWorker(leaseMs = LEASE_MS): ChildProcess {
	// Node itself with the tsx loader, so the pid we signal is the worker's own (the tsx wrapper
	// would survive a SIGKILL's target in a child of its own).
	const w = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
		cwd: ROOT,
		env: { ...process.env, NODE_OPTIONS: '', JOB_LEASE_MS: String(leaseMs), WORKER_POLL_MS: '100' },
		stdio: ['ignore', 'pipe', 'ignore']
	});
	w.stdout!.resume(); // read, so a chatty worker never blocks on a full pipe
	workers.push(w);
	return w;
}

async function addCapture(wav: Uint8Array, label = 'P1'): Promise<number> {
	const created = await createCapture(scope, tree.sessionId, { filename: `${label}.wav`, sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', newPositionLabel: label, channel: 0 }, s3);
	await s3.put(created.capture.objectKey, wav, 'audio/wav', wav.byteLength);
	await confirmUpload(scope, created.capture.id, s3);
	return created.capture.id;
}

async function waitUntil(check: () => Promise<boolean>, what: string, timeoutMs = 60_000): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (!(await check())) {
		if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 20));
	}
}

const settled = (ids: number[]) => async () =>
	Number((await k('captures').whereIn('id', ids).whereIn('status', ['analysed', 'failed']).count({ n: '*' }).first())?.n) === ids.length;

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const user = await makeUser(k, org, 'acoustician');
	tree = await makeProjectTree(k, org);
	scope = { organizationId: org, projectId: tree.projectId, role: 'acoustician', user: { id: user.id, email: user.email, name: 'Test', unitSystem: 'metric' } };
	// Settle whatever other tests left queued, so the workers below meet only these jobs.
	while (await runNextJob(k, s3, { owner: 'integration-test' }));
});

afterEach(async () => {
	for (const w of workers.splice(0)) if (w.exitCode === null) w.kill('SIGKILL');
});
afterAll(async () => k.destroy());

describe('workers', () => {
	it('a worker killed mid-job: the job is claimed again after its lease, analysed exactly once', async () => {
		// A long, high-rate recording so the analysis is still running when the worker dies.
		const x = exponentialNoiseDecay({ t60S: 1.2, durationS: 30, sampleRate: 96_000, onsetS: 0.01, noiseDbRePeak: -80, seed: 5 });
		for (let i = 0; i < x.length; i++) x[i] *= 0.1;
		const id = await addCapture(encodeWav(x, 96_000, 24), 'long');

		const first = startWorker();
		await waitUntil(async () => (await k('captures').where({ id }).first()).status === 'analysing', 'the first worker to start the job');
		first.kill('SIGKILL');
		const job = await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [id]).first();
		expect(job.status).toBe('running');
		expect(await k('analyses').where({ capture_id: id }).first()).toBeUndefined();

		startWorker();
		await waitUntil(settled([id]), 'the second worker to finish it', 90_000);
		expect((await k('captures').where({ id }).first()).status).toBe('analysed');
		expect(await k('analyses').where({ capture_id: id }).count({ n: '*' }).first()).toEqual({ n: 1 });
		const after = await k('jobs').where({ id: job.id }).first();
		expect(after.status, after.last_error).toBe('done');
		// Claimed at least twice: once by the killed worker, once after its lease ran out.
		expect(after.attempts).toBeGreaterThanOrEqual(2);
	}, 150_000);

	it('two workers on 20 queued captures analyse every one exactly once', async () => {
		const ids: number[] = [];
		for (let i = 0; i < 20; i++) ids.push(await addCapture(decayWav({ seed: 100 + i, durationS: 1 }), `Q${i}`));
		// A lease long enough for any one analysis: with a short one, a busy machine lets a lease
		// lapse mid-analysis (the analysis is synchronous) and a job would be taken over — still
		// done once, but on a second attempt.
		startWorker(30_000);
		startWorker(30_000);
		await waitUntil(settled(ids), 'all 20 captures', 120_000);
		const rows = await k('analyses').whereIn('capture_id', ids).select('capture_id');
		expect(rows).toHaveLength(20);
		expect(new Set(rows.map((r) => r.capture_id)).size).toBe(20);
		const jobs = await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') IN (" + ids.map(() => '?').join(',') + ')', ids).select('status', 'attempts', 'last_error');
		expect(jobs).toHaveLength(20);
		expect(jobs.filter((j) => j.status !== 'done'), JSON.stringify(jobs)).toEqual([]);
		expect(jobs.filter((j) => j.attempts !== 1), JSON.stringify(jobs)).toEqual([]);
	}, 150_000);

	it('stops gracefully on SIGTERM', async () => {
		const w = startWorker();
		// Signalled once it says it started: its handlers are in place by then (loading the
		// modules can take longer than any fixed wait on a busy machine).
		await new Promise<void>((r) => w.stdout!.on('data', (d) => String(d).includes('started') && r()));
		const exit = new Promise<number | null>((r) => w.once('exit', (code) => r(code)));
		w.kill('SIGTERM');
		expect(await exit).toBe(0);
	}, 30_000);
});
