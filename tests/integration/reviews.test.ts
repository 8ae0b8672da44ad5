import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';

// Problem bands and comparisons: bad input refused with a reason, other people's rooms closed.
let k: Knex;
let tree: ProjectTree;
let otherTree: ProjectTree;
let consultant: Client;
let client: Client;
let secondSessionId: number;

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const clientUser = await makeUser(k, org, 'client');
	tree = await makeProjectTree(k, org, clientUser.id);
	[secondSessionId] = await k('sessions').insert({ room_id: tree.roomId, condition_label: 'treated', measured_on: '2026-11-20' });
	otherTree = await makeProjectTree(k, await makeOrganization(k));
	consultant = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
	client = await signedInClient(clientUser.email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

const band = (over: Record<string, string> = {}) => ({ fLoHz: '40', fHiHz: '60', severity: 'severe', note: 'modal peak', ...over });
const bandsOf = async (roomId: number) => Number((await k('problem_bands').where({ room_id: roomId }).count({ n: '*' }).first())?.n);

describe('problem bands', () => {
	it('are added with an audit record', async () => {
		const before = await bandsOf(tree.roomId);
		const res = await consultant.postForm(`/rooms/${tree.roomId}?/addProblemBand`, band());
		expect(res.status).toBe(200);
		expect(await bandsOf(tree.roomId)).toBe(before + 1);
		const id = (await k('problem_bands').where({ room_id: tree.roomId }).orderBy('id', 'desc').first()).id;
		expect(await k('audit_events').where({ action: 'problem_band.created', entity_id: id }).first()).toBeTruthy();
	});

	it.each([
		['f_lo ≥ f_hi', band({ fLoHz: '60', fHiHz: '40' }), 'upper frequency must be above'],
		['equal edges', band({ fLoHz: '50', fHiHz: '50' }), 'upper frequency must be above'],
		['below 10 Hz', band({ fLoHz: '5' }), 'between 10 Hz and 24 kHz'],
		['above 24 kHz', band({ fHiHz: '30000' }), 'between 10 Hz and 24 kHz'],
		['a reversed time range', band({ tLoMs: '80', tHiMs: '20' }), 'end time must be after'],
		['no note', band({ note: '' }), 'Describe the problem'],
		['an unknown severity', band({ severity: 'catastrophic' }), 'Pick a severity']
	])('are refused with %s, with the reason', async (_, fields, reason) => {
		const before = await bandsOf(tree.roomId);
		const res = await consultant.postForm(`/rooms/${tree.roomId}?/addProblemBand`, fields);
		expect(res.status).toBe(400);
		expect(await res.text()).toContain(reason);
		expect(await bandsOf(tree.roomId)).toBe(before);
	});

	it("are refused on another organization's room (404) and for a client (403)", async () => {
		const otherBefore = await bandsOf(otherTree.roomId);
		expect((await consultant.postForm(`/rooms/${otherTree.roomId}?/addProblemBand`, band())).status).toBe(404);
		expect(await bandsOf(otherTree.roomId)).toBe(otherBefore);
		expect((await client.postForm(`/rooms/${tree.roomId}?/addProblemBand`, band())).status).toBe(403);
	});
});

describe('comparisons', () => {
	it('of two visits of the room are created; across rooms they are refused', async () => {
		const ok = await consultant.postForm(`/rooms/${tree.roomId}?/createComparison`, { title: 'Before/after', baselineSessionId: String(tree.sessionId), treatedSessionId: String(secondSessionId) });
		expect(ok.status).toBe(303);
		expect(ok.headers.get('location')).toMatch(/^\/comparisons\/\d+$/);

		const foreign = await consultant.postForm(`/rooms/${tree.roomId}?/createComparison`, { title: 'Mixed', baselineSessionId: String(tree.sessionId), treatedSessionId: String(otherTree.sessionId) });
		expect(foreign.status).toBe(400);
		expect(await foreign.text()).toContain('Both visits must be of this room');
		const same = await consultant.postForm(`/rooms/${tree.roomId}?/createComparison`, { title: 'Same', baselineSessionId: String(tree.sessionId), treatedSessionId: String(tree.sessionId) });
		expect(same.status).toBe(400);
	});

	it('are hidden from the client until published, then shown (page, API, export, PDF)', async () => {
		const [id] = await k('comparisons').insert({ room_id: tree.roomId, baseline_session_id: tree.sessionId, treated_session_id: secondSessionId, title: 'Draft for client' });
		const paths = [`/reports/${id}`, `/api/comparisons/${id}`, `/api/comparisons/${id}/export?format=csv`, `/api/comparisons/${id}/report.pdf`];
		for (const p of paths) expect((await client.get(p, { accept: 'text/html' })).status, p).toBe(404);
		expect((await client.get(`/comparisons/${id}`, { accept: 'text/html' })).status).toBe(403);

		await k('comparisons').where({ id }).update({ published_at: new Date() });
		for (const p of paths) expect((await client.get(p, { accept: 'text/html' })).status, p).toBe(200);
		const pdf = await client.get(`/api/comparisons/${id}/report.pdf`);
		expect(new TextDecoder().decode((await pdf.arrayBuffer()).slice(0, 5))).toBe('%PDF-');
		// Still no internal page for the client.
		expect((await client.get(`/comparisons/${id}`, { accept: 'text/html' })).status).toBe(403);
	});

	it('publishing e-mails the project clients once', async () => {
		const [id] = await k('comparisons').insert({ room_id: tree.roomId, baseline_session_id: tree.sessionId, treated_session_id: secondSessionId, title: 'To publish' });
		const org = (await k('projects').where({ id: tree.projectId }).first()).organization_id;
		const publisher = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
		expect((await publisher.postForm(`/comparisons/${id}?/publish`, {})).status).toBe(303);
		expect((await publisher.postForm(`/comparisons/${id}?/publish`, {})).status).toBe(303);
		const clientEmail = (await k('users as u').join('project_members as pm', 'pm.user_id', 'u.id').where('pm.project_id', tree.projectId).first('u.email')).email;
		const mails = await k('email_outbox').where({ to_address: clientEmail, kind: 'report-published' }).where('text_body', 'like', `%/reports/${id}%`);
		expect(mails).toHaveLength(1);
		expect(mails[0].text_body).toContain('http');
	});
});
