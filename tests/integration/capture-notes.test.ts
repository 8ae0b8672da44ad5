// A note per capture ("door open", "HVAC on"): written, changed and cleared by an acoustician or
// a consultant through the capture page's action, audited, bounded in length, shown in the
// capture's JSON, in the visit's list and in the band-values JSON; never set by a client.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { randomUUID } from 'node:crypto';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, type Client } from '../helpers/http';

let k: Knex;
let tree: ProjectTree;
let captureId: number;
let acoustician: Client, consultant: Client, client: Client, otherClient: Client;

const band = (centerHz: number | 'broadband') => ({ centerHz, edtS: 0.41, t20S: 0.43, t30S: 0.45, c50Db: 2.1, c80Db: 5.3, d50: 0.62, tsMs: 38, peakToNoiseDb: 52, curvaturePct: 3, biased: false });
const note = (c: Client, id: number, text: string) => c.postForm(`/captures/${id}?/note`, { note: text });
const stored = async (id: number) => (await k('captures').where({ id }).first('note')).note as string | null;

beforeAll(async () => {
	k = testDb();
	const orgId = await makeOrganization(k);
	const clientUser = await makeUser(k, orgId, 'client');
	const otherClientUser = await makeUser(k, orgId, 'client');
	tree = await makeProjectTree(k, orgId, clientUser.id);
	await makeProjectTree(k, orgId, otherClientUser.id);
	[captureId] = await k('captures').insert({
		session_id: tree.sessionId,
		position_id: tree.positionId,
		kind: 'impulse',
		original_filename: 'p1-door.wav',
		object_key: `captures/${randomUUID()}.wav`,
		status: 'analysed',
		sample_rate: 48000,
		channels: 1,
		duration_s: 2
	});
	await k('analyses').insert({
		capture_id: captureId,
		engine_version: 'test',
		metrics: JSON.stringify({ engineVersion: 'test', bands: [band(500), band(1000)], broadband: band('broadband'), peakToNoiseDb: 52 }),
		curves: JSON.stringify({}),
		warnings: JSON.stringify([])
	});
	acoustician = await signedInClient((await makeUser(k, orgId, 'acoustician')).email, TEST_PASSWORD);
	consultant = await signedInClient((await makeUser(k, orgId, 'consultant')).email, TEST_PASSWORD);
	client = await signedInClient(clientUser.email, TEST_PASSWORD);
	otherClient = await signedInClient(otherClientUser.email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

describe('a capture note', () => {
	it('is written by the acoustician, changed by the consultant, each change audited', async () => {
		expect((await note(acoustician, captureId, '  door open\r\nHVAC on  ')).status).toBe(200);
		expect(await stored(captureId)).toBe('door open\nHVAC on');
		expect((await note(consultant, captureId, 'door open, HVAC off')).status).toBe(200);
		expect(await stored(captureId)).toBe('door open, HVAC off');
		const audits = await k('audit_events').where({ entity_type: 'capture', entity_id: captureId, action: 'capture.noted' }).orderBy('id').select('details');
		expect(audits.map((a) => (typeof a.details === 'string' ? JSON.parse(a.details) : a.details))).toEqual([
			{ from: null, to: 'door open\nHVAC on' },
			{ from: 'door open\nHVAC on', to: 'door open, HVAC off' }
		]);
		// The same text again changes nothing and records nothing.
		expect((await note(consultant, captureId, 'door open, HVAC off')).status).toBe(200);
		expect(Number((await k('audit_events').where({ entity_type: 'capture', entity_id: captureId, action: 'capture.noted' }).count({ n: '*' }).first())!.n)).toBe(2);
	});

	it('is shown in the capture’s JSON, the visit’s list, its page and its band-values JSON, not in the CSV', async () => {
		const view = await (await acoustician.get(`/api/captures/${captureId}`, { accept: 'application/json' })).json();
		expect(view.capture.note).toBe('door open, HVAC off');
		const list = await (await consultant.get(`/api/sessions/${tree.sessionId}/captures`, { accept: 'application/json' })).json();
		expect(list.captures.find((c: { id: number }) => c.id === captureId).note).toBe('door open, HVAC off');
		expect(await (await acoustician.get(`/captures/${captureId}`, { accept: 'text/html' })).text()).toContain('door open, HVAC off');

		const json = await acoustician.get(`/api/captures/${captureId}/export?format=json`);
		expect(json.status).toBe(200);
		const doc = JSON.parse(await json.text());
		expect(doc).toMatchObject({ schema: 'ringdown.capture-bands/1', note: 'door open, HVAC off' });
		expect(doc.bands).toHaveLength(2);
		const csv = await (await acoustician.get(`/api/captures/${captureId}/export?format=csv`)).text();
		expect(csv.split('\r\n')[0]).toMatch(/^centre_Hz,/);
		expect(csv).not.toContain('door open');
	});

	it('is bounded to 500 characters, with the reason, and nothing changes', async () => {
		const res = await note(acoustician, captureId, 'x'.repeat(501));
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('Keep the note under 500 characters.');
		expect(await stored(captureId)).toBe('door open, HVAC off');
		// 500 is taken (the column holds that many characters, any script).
		const full = 'ö'.repeat(500);
		expect((await note(acoustician, captureId, full)).status).toBe(200);
		expect(await stored(captureId)).toBe(full);
	});

	it('is cleared by an empty note', async () => {
		expect((await note(acoustician, captureId, '   ')).status).toBe(200);
		expect(await stored(captureId)).toBeNull();
		const doc = JSON.parse(await (await acoustician.get(`/api/captures/${captureId}/export?format=json`)).text());
		expect(doc.note).toBeNull();
	});

	it('is not set by a client of the project (403) nor of another project (404)', async () => {
		await note(acoustician, captureId, 'HVAC on');
		expect((await note(client, captureId, 'client was here')).status).toBe(403);
		expect((await note(otherClient, captureId, 'other client was here')).status).toBe(404);
		expect(await stored(captureId)).toBe('HVAC on');
		// Nor read: captures are the practice's working material.
		expect((await otherClient.get(`/api/captures/${captureId}`, { accept: 'application/json' })).status).toBe(404);
		expect((await client.get(`/api/captures/${captureId}`, { accept: 'application/json' })).status).toBe(403);
	});
});
