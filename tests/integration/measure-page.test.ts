// The measurement page as the server renders it: for those who upload only, with the practice's
// test signals; and rendering it leaves the server running (its audio is closed only in the
// browser — a close run during the server render once threw after the answer and stopped the
// web server).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { randomUUID } from 'node:crypto';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, type Client } from '../helpers/http';

let k: Knex;
let tree: ProjectTree;
let acoustician: Client, consultant: Client, client: Client;
const signalName = `Room sweep ${randomUUID().slice(0, 8)}`;

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const clientUser = await makeUser(k, org, 'client');
	tree = await makeProjectTree(k, org, clientUser.id);
	await k('sweep_definitions').insert({ organization_id: org, name: signalName, f1_hz: 20, f2_hz: 20000, duration_s: 5, fade_in_s: 0.05, fade_out_s: 0.05, silence_s: 2, sample_rate: 48000, bit_depth: '24', level_dbfs: -6, object_key: `sweeps/${randomUUID()}.wav` });
	acoustician = await signedInClient((await makeUser(k, org, 'acoustician')).email, TEST_PASSWORD);
	consultant = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
	client = await signedInClient(clientUser.email, TEST_PASSWORD);
});

afterAll(async () => k.destroy());

describe('the measurement page', () => {
	it('renders for an acoustician with the practice’s test signals, again and again, and the server stays up', async () => {
		for (let i = 0; i < 3; i++) {
			const res = await acoustician.get(`/sessions/${tree.sessionId}/measure`, { accept: 'text/html' });
			expect(res.status).toBe(200);
			const html = await res.text();
			expect(html).toContain('Measure in the browser');
			expect(html).toContain(signalName);
			// The capture worklet is one of the app's own scripts, which the policy allows.
			expect(res.headers.get('content-security-policy')).toMatch(/script-src 'self'/);
		}
		expect((await fetch(`${process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:3100'}/health`)).status).toBe(200);
	});

	it('is refused to a consultant (who does not upload) and to the project’s client', async () => {
		expect((await consultant.get(`/sessions/${tree.sessionId}/measure`, { accept: 'text/html' })).status).toBe(403);
		expect((await client.get(`/sessions/${tree.sessionId}/measure`, { accept: 'text/html' })).status).toBe(403);
	});

	it('serves the capture worklet from the app, as JavaScript', async () => {
		const res = await acoustician.get('/measure/capture-worklet.js');
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/javascript/);
		expect(await res.text()).toContain("registerProcessor('ringdown-capture'");
	});
});
