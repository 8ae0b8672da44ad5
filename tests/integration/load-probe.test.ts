import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import { createComparison } from '../../src/lib/server/queries/reviews';

// The load probe (scripts/probe-load.ts) run briefly against the test server: a consultant's
// projects, visit, comparison and analysis pages under concurrent load answer without one error.
// The full run (100 connections, 60 s a route) is for a private instance; see README, *Load*.
const ROOT = join(import.meta.dirname, '../..');
let k: Knex;
let tree: ProjectTree;
let consultant: { email: string; id: number };
let captureId: number;
let comparisonId: number;
const s3 = createStorage(loadConfig(process.env));

async function uploadAnalysed(client: Client, sessionId: number, positionId: number, seed: number): Promise<number> {
	const wav = decayWav({ t60S: 0.5, seed });
	const res = await client.postJson(`/api/sessions/${sessionId}/captures`, { filename: `P1-${seed}.wav`, sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId });
	expect(res.status, await res.clone().text()).toBe(201);
	const a = (await res.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
	expect((await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: wav as Uint8Array<ArrayBuffer> })).status).toBe(200);
	expect((await client.request('POST', `/api/captures/${a.capture.id}/uploaded`, { headers: { accept: 'application/json' } })).status).toBe(200);
	for (let i = 0; i < 60; i++) {
		if ((await k('captures').where({ id: a.capture.id }).first('status')).status === 'analysed') return a.capture.id;
		if (!(await runNextJob(k, s3, { owner: 'load-probe-test' }))) await new Promise((r) => setTimeout(r, 50));
	}
	throw new Error(`capture ${a.capture.id} was not analysed`);
}

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const acoustician = await signedInClient((await makeUser(k, org, 'acoustician')).email, TEST_PASSWORD);
	consultant = await makeUser(k, org, 'consultant');
	tree = await makeProjectTree(k, org);
	const [afterId] = await k('sessions').insert({ room_id: tree.roomId, condition_label: 'after panels', measured_on: '2026-11-20' });
	const [afterPosition] = await k('positions').insert({ session_id: afterId, label: 'P1' });
	captureId = await uploadAnalysed(acoustician, tree.sessionId, tree.positionId, 91);
	await uploadAnalysed(acoustician, afterId, afterPosition, 92);
	comparisonId = await createComparison(k, { roomId: tree.roomId, baselineSessionId: tree.sessionId, treatedSessionId: afterId, title: 'Before and after', createdBy: consultant.id });
}, 120_000);
afterAll(async () => k.destroy());

describe('scripts/probe-load.ts', () => {
	it('drives every route with concurrent connections and counts no error', () => {
		const run = spawnSync(
			join(ROOT, 'node_modules/.bin/tsx'),
			['scripts/probe-load.ts', BASE_URL, '--connections', '8', '--duration', '2', '--settle', '0', '--email', consultant.email, '--password', TEST_PASSWORD,
				'--session', String(tree.sessionId), '--comparison', String(comparisonId), '--capture', String(captureId)],
			{ cwd: ROOT, encoding: 'utf8', timeout: 90_000 }
		);
		expect(run.status, run.stdout + run.stderr).toBe(0);
		const rows = run.stdout.split('\n').filter((line) => /^\S+\s+\/\S+\s+\d+ req/.test(line));
		expect(rows.map((r) => r.split(/\s+/)[0])).toEqual(['projects', 'visit', 'comparison', 'analysis', 'analysis-api']);
		for (const row of rows) {
			expect(Number(/(\d+) req /.exec(row)?.[1]), row).toBeGreaterThan(0);
			expect(row).toMatch(/non-2xx 0 {2}errors 0 /);
		}
		expect(run.stdout).toMatch(/\d+ requests, 0 errors/);
	}, 120_000);
});
