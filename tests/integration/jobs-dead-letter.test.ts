// Jobs that always end: an attempt is counted when a job is claimed, so a job whose worker is
// killed every time runs out of attempts like any other, and is then dead-lettered — the job
// `dead` with its reason, its capture failed with a message that says what happened.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, type Client } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { encodeWav } from '../../src/lib/analysis';
import { exponentialNoiseDecay } from '../../src/lib/analysis/synthetic';
import { confirmUpload, createCapture } from '../../src/lib/server/captures/service';
import { createStorage, type Storage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { unavailable } from '../../src/lib/server/problem';
import { claim } from '../../src/lib/server/jobs/queue';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import type { Scope } from '../../src/lib/server/auth/access';

let k: Knex;
let tree: ProjectTree;
let scope: Scope;
let acoustician: Client;
const s3 = createStorage(loadConfig(process.env));

const ROOT = join(import.meta.dirname, '../..');
const workers: ChildProcess[] = [];

function startWorker(leaseMs: number): ChildProcess {
	// Node itself with the tsx loader, so the pid signalled is the worker's own.
	const w = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
		cwd: ROOT,
		env: { ...process.env, NODE_OPTIONS: '', JOB_LEASE_MS: String(leaseMs), WORKER_POLL_MS: '100' },
		stdio: 'ignore'
	});
	workers.push(w);
	return w;
}

async function waitUntil(check: () => Promise<boolean>, what: string, timeoutMs = 60_000): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (!(await check())) {
		if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 20));
	}
}

async function addCapture(seed: number, label: string, wav = decayWav({ seed, durationS: 0.5 })): Promise<{ captureId: number; jobId: number }> {
	const created = await createCapture(scope, tree.sessionId, { filename: `${label}.wav`, sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', newPositionLabel: label, channel: 0 }, s3);
	await s3.put(created.capture.objectKey, wav, 'audio/wav', wav.byteLength);
	await confirmUpload(scope, created.capture.id, s3);
	const job = await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [created.capture.id]).first('id');
	return { captureId: created.capture.id, jobId: job.id };
}

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** What the visit's capture list (the API the page polls) says about one capture. */
async function shownCapture(id: number): Promise<{ status: string; error: string | null }> {
	const res = await acoustician.get(`/api/sessions/${tree.sessionId}/captures`, { accept: 'application/json' });
	expect(res.status).toBe(200);
	const body = (await res.json()) as { captures: { id: number; status: string; error: string | null }[] };
	return body.captures.find((c) => c.id === id)!;
}

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const user = await makeUser(k, org, 'acoustician');
	tree = await makeProjectTree(k, org);
	scope = { organizationId: org, projectId: tree.projectId, role: 'acoustician', user: { id: user.id, email: user.email, name: 'Test', unitSystem: 'metric' } };
	acoustician = await signedInClient(user.email, TEST_PASSWORD);
	// Settle whatever other tests left queued, so the claims below meet only these jobs.
	while (await runNextJob(k, s3, { owner: 'integration-test' }));
});
afterEach(() => {
	for (const w of workers.splice(0)) if (w.exitCode === null) w.kill('SIGKILL');
});
afterAll(async () => k.destroy());

describe('a job whose worker is killed on every attempt', () => {
	it('is claimed at most max_attempts times, then dead-lettered with the reason and its capture failed', async () => {
		const { captureId, jobId } = await addCapture(7001, 'killed');
		const { max_attempts: max } = await k('jobs').where({ id: jobId }).first('max_attempts');
		expect(max).toBe(5);
		// Each claim is a worker that starts the job and dies: the lease (1 ms) runs out unrenewed.
		for (let attempt = 1; attempt <= max; attempt++) {
			const job = await claim(k, `killed-worker-${attempt}`, 1);
			expect(job?.id).toBe(jobId);
			// Counted when claimed, before any work was done.
			expect((await k('jobs').where({ id: jobId }).first('attempts')).attempts).toBe(attempt);
			await pause(20);
		}
		// The next worker finds every attempt used: it does not run the job again.
		const next = await runNextJob(k, s3, { owner: 'next-worker' });
		expect(next).toBeNull();

		const job = await k('jobs').where({ id: jobId }).first();
		expect(job.status).toBe('dead');
		expect(job.attempts).toBe(max);
		expect(job.lease_owner).toBeNull();
		expect(job.finished_at).not.toBeNull();
		expect(job.last_error).toMatch(/tried 5 times and the last try stopped before finishing/);
		expect(await k('analyses').where({ capture_id: captureId }).first()).toBeUndefined();

		const shown = await shownCapture(captureId);
		expect(shown.status).toBe('failed');
		expect(shown.error).toMatch(/^The analysis could not run \(it was tried 5 times and the last try stopped before finishing/);
		expect(shown.error).toMatch(/Re-run analysis/);
		// And it stays dead: nobody claims it again.
		await pause(20);
		expect(await claim(k, 'later-worker', 1)).toBeNull();
		expect((await k('jobs').where({ id: jobId }).first('attempts')).attempts).toBe(max);
	});

	it('real worker processes killed on each of its five attempts: the sixth worker dead-letters it and stays up', async () => {
		// A long, high-rate recording, so the analysis is still running when each worker dies.
		const x = exponentialNoiseDecay({ t60S: 1.2, durationS: 30, sampleRate: 96_000, onsetS: 0.01, noiseDbRePeak: -80, seed: 7010 });
		for (let i = 0; i < x.length; i++) x[i] *= 0.1;
		const { captureId, jobId } = await addCapture(7010, 'killed-process', encodeWav(x, 96_000, 24));
		const attempts = async () => (await k('jobs').where({ id: jobId }).first('attempts')).attempts as number;
		const LEASE_MS = 1_500;
		for (let attempt = 1; attempt <= 5; attempt++) {
			const w = startWorker(LEASE_MS);
			await waitUntil(async () => (await attempts()) === attempt, `worker ${attempt} to claim the job`);
			w.kill('SIGKILL');
			await new Promise((r) => w.once('exit', r));
			await pause(LEASE_MS + 100); // its lease runs out
		}
		const survivor = startWorker(LEASE_MS);
		await waitUntil(async () => (await k('jobs').where({ id: jobId }).first('status')).status === 'dead', 'the job to be dead-lettered');
		expect(await attempts()).toBe(5);
		const shown = await shownCapture(captureId);
		expect(shown.status).toBe('failed');
		expect(shown.error).toMatch(/tried 5 times and the last try stopped before finishing/);
		expect(await k('analyses').where({ capture_id: captureId }).first()).toBeUndefined();
		await pause(500);
		expect(survivor.exitCode).toBeNull(); // it went on polling, and did not take the job again
		expect(await attempts()).toBe(5);
	}, 120_000);

	it('a worker killed after an error keeps the error in the reason', async () => {
		const { captureId, jobId } = await addCapture(7002, 'error-then-killed');
		const storeDown: Storage = { ...s3, getBytes: async () => { throw unavailable('Object storage is not reachable right now. Try again in a moment.'); } };
		// Attempt 1 fails cleanly (storage down) and is queued again with back-off.
		expect((await runNextJob(k, storeDown, { owner: 'first' }))?.result).toBe('retry');
		await k('jobs').where({ id: jobId }).update({ run_after: k.raw('CURRENT_TIMESTAMP(3)') });
		// Attempts 2–5: the worker dies each time.
		for (let attempt = 2; attempt <= 5; attempt++) {
			expect((await claim(k, `killed-${attempt}`, 1))?.attempts).toBe(attempt);
			await pause(20);
		}
		expect(await runNextJob(k, s3, { owner: 'next-worker' })).toBeNull();
		const job = await k('jobs').where({ id: jobId }).first();
		expect(job.status).toBe('dead');
		expect(job.last_error).toMatch(/an earlier try said: Object storage is not reachable/);
		expect((await shownCapture(captureId)).status).toBe('failed');
	});
});

describe('a job whose every attempt fails', () => {
	it('is retried until its limit, then dead with the last reason; the capture fails in the same step', async () => {
		const { captureId, jobId } = await addCapture(7003, 'store-down');
		const storeDown: Storage = { ...s3, getBytes: async () => { throw unavailable('Object storage is not reachable right now. Try again in a moment.'); } };
		const results: string[] = [];
		for (let attempt = 1; attempt <= 5; attempt++) {
			const outcome = await runNextJob(k, storeDown, { owner: `w${attempt}` });
			expect(outcome?.job.id).toBe(jobId);
			results.push(outcome!.result);
			await k('jobs').where({ id: jobId }).update({ run_after: k.raw('CURRENT_TIMESTAMP(3)') }); // skip the back-off
		}
		expect(results).toEqual(['retry', 'retry', 'retry', 'retry', 'dead']);
		const job = await k('jobs').where({ id: jobId }).first();
		expect(job.status).toBe('dead');
		expect(job.attempts).toBe(5);
		const shown = await shownCapture(captureId);
		expect(shown.status).toBe('failed');
		expect(shown.error).toMatch(/^The analysis could not run \(Object storage is not reachable right now/);
		expect(await runNextJob(k, s3, { owner: 'after' })).toBeNull();
	});

	it('a worker whose lease was taken over does not settle the job it lost', async () => {
		const { captureId, jobId } = await addCapture(7004, 'taken-over');
		const slow = await claim(k, 'slow-worker', 1);
		expect(slow?.id).toBe(jobId);
		await pause(20);
		// Another worker takes the lapsed job and analyses it.
		const other = await runNextJob(k, s3, { owner: 'other-worker' });
		expect(other?.result).toBe('analysed');
		// The first worker now fails its (lost) attempt: nothing of the settled job changes.
		const { failAttempt } = await import('../../src/lib/server/jobs/queue');
		expect(await failAttempt(k, { ...slow!, attempts: 5 }, 'too late')).toBe('lease-lost');
		expect((await k('jobs').where({ id: jobId }).first()).status).toBe('done');
		expect((await shownCapture(captureId)).status).toBe('analysed');
	});
});
