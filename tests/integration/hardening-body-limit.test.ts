// Request bodies are capped before anything reads them: public form actions used to read the whole
// body first, so a few large POSTs could exhaust the server's memory.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD } from '../helpers/factories';
import { signedInClient } from '../helpers/http';
import { decayWav } from '../helpers/wav';
import { listeningPid, rawRequest, watchMemory } from '../../scripts/probe/raw-http';
import { loadConfig } from '../../src/lib/server/config';

const MiB = 1024 * 1024;
const LIMIT = loadConfig(process.env).BODY_MAX_BYTES;
const FORM = { origin: BASE_URL, 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' };

let k: Knex;
let orgId: number;
beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
});
afterAll(async () => k.destroy());

describe('public forms refuse large bodies before reading them', () => {
	for (const path of ['/signin', '/password/forgot']) {
		it(`${path}: 5 MB with Content-Length is answered 413 at once`, async () => {
			const a = await rawRequest(BASE_URL, { path, bodySize: 5 * MiB, bodyStart: 'email=someone%40example.test&password=', headers: FORM });
			expect(a.status, a.error).toBe(413);
			expect(a.body).toMatch(/larger than the 1 MiB allowed/);
			expect(a.ms).toBeLessThan(2_000);
		});

		it(`${path}: 5 MB chunked, without Content-Length, is answered 413`, async () => {
			const a = await rawRequest(BASE_URL, { path, bodySize: 5 * MiB, bodyStart: 'email=someone%40example.test&password=', chunked: true, headers: FORM });
			expect(a.status, a.error).toBe(413);
			expect(a.ms).toBeLessThan(2_000);
		});
	}

	it('a chunked body under the limit still reaches the form whole', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const body = new URLSearchParams({ email: u.email, password: TEST_PASSWORD, redirectTo: '/projects' }).toString();
		const a = await rawRequest(BASE_URL, { path: '/signin', bodySize: body.length, bodyStart: body, chunked: true, headers: FORM });
		expect(a.status).toBe(303);
		expect(a.headers.location).toBe('/projects');
	});

	it('the server does not grow while four 50 MB bodies are refused at the same time', async () => {
		const pid = listeningPid(Number(new URL(BASE_URL).port));
		expect(pid, 'the test web server process is visible in /proc').not.toBeNull();
		const watch = watchMemory(pid!);
		const bodies = [false, true, false, true].map((chunked) =>
			rawRequest(BASE_URL, { path: '/password/forgot', bodySize: 50 * MiB, bodyStart: 'email=', chunked, headers: FORM })
		);
		// /health keeps answering promptly meanwhile.
		const t = performance.now();
		const health = await fetch(`${BASE_URL}/health`);
		const healthMs = performance.now() - t;
		const answers = await Promise.all(bodies);
		expect(health.status).toBe(200);
		expect(healthMs).toBeLessThan(1_000);
		const { startBytes, peakBytes } = watch.stop();
		expect(answers.map((a) => a.status)).toEqual([413, 413, 413, 413]);
		// Reading all four would hold 200 MB and more. Refused, what arrives before the answer is
		// dropped as it comes: the growth is the young-generation heap filling with those chunks
		// before a collection (a few MB each), not anything kept.
		expect(peakBytes - startBytes).toBeLessThan(40 * MiB);
	});
});

describe('API routes have the same small limit', () => {
	it('answers a JSON body over the limit with 413 and a JSON message', async () => {
		const u = await makeUser(k, orgId, 'acoustician');
		const tree = await makeProjectTree(k, orgId);
		const c = await signedInClient(u.email, TEST_PASSWORD);
		const res = await c.request('POST', `/api/sessions/${tree.sessionId}/captures`, {
			body: JSON.stringify({ filename: 'x'.repeat(LIMIT) }),
			headers: { 'content-type': 'application/json', accept: 'application/json' }
		});
		expect(res.status).toBe(413);
		expect(await res.json()).toMatchObject({ code: 'too_large' });
	});

	it('lets the scripted upload route take a recording larger than the small limit', async () => {
		const u = await makeUser(k, orgId, 'acoustician');
		const tree = await makeProjectTree(k, orgId);
		const c = await signedInClient(u.email, TEST_PASSWORD);
		const wav = decayWav({ durationS: 8 });
		expect(wav.byteLength).toBeGreaterThan(LIMIT);
		const form = new FormData();
		form.set('file', new Blob([wav as Uint8Array<ArrayBuffer>], { type: 'audio/wav' }), 'large-P1.wav');
		form.set('kind', 'impulse');
		form.set('positionId', String(tree.positionId));
		const res = await c.request('POST', `/api/sessions/${tree.sessionId}/captures/upload`, { body: form, headers: { accept: 'application/json' } });
		expect(res.status, await res.clone().text()).toBe(201);
	});
});
