// Personal API tokens, end to end on the running app: made on the account page and shown once,
// stored as a hash only, acting as their user within their scopes on /api routes only, refused
// after expiry, revocation, sign-out everywhere and removal from the organization, rate-limited
// per token, their last use noted cheaply and audited from a new address.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { getWithTokenFrom, makeApiToken, withToken } from '../helpers/api-tokens';
import { startPrivateServer } from '../helpers/private-server';
import { decayWav } from '../helpers/wav';
import { newFormKey } from '../../src/lib/forms';
import { bucketKey } from '../../src/lib/server/auth/rate-limit';

const FIXTURES = join(import.meta.dirname, '../../fixtures');
const TOKEN_IN_TEXT = /rdt_[A-Za-z0-9_-]{43}/;
const sha256 = (s: string | Uint8Array) => createHash('sha256').update(s).digest('hex');
/** An audit record's details (the driver may hand the JSON column over parsed or as text). */
const detailsOf = (d: unknown) => (typeof d === 'string' ? JSON.parse(d) : d);

let k: Knex;
let orgId: number;
let tree: ProjectTree;
let acoustician: { id: number; email: string };
let browser: Client;

beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
	tree = await makeProjectTree(k, orgId);
	acoustician = await makeUser(k, orgId, 'acoustician');
	browser = await signedInClient(acoustician.email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

/** Create a token through the account page's form and read it from the page, as its owner would. */
async function createOnPage(c: Client, fields: Record<string, string>): Promise<{ res: Response; token: string | null; html: string }> {
	const res = await c.postForm('/account?/createToken', { formId: 'token', ...fields });
	if (res.status !== 303) return { res, token: null, html: await res.text() };
	const page = await c.get('/account', { accept: 'text/html' });
	const html = await page.text();
	return { res, token: TOKEN_IN_TEXT.exec(html)?.[0] ?? null, html };
}

const upload = (token: string, sessionId: number, label: string, seed: number) => {
	const form = new FormData();
	form.set('kind', 'impulse');
	form.set('newPositionLabel', label);
	form.set('file', new Blob([decayWav({ seed }) as Uint8Array<ArrayBuffer>], { type: 'audio/wav' }), `${label}.wav`);
	return withToken(token, 'POST', `/api/sessions/${sessionId}/captures/upload`, { body: form });
};

describe('creating a token on the account page', () => {
	let token: string;
	let formKey: string;

	it('shows the token once, after a redirect, on a page no cache keeps', async () => {
		formKey = newFormKey();
		const { res, token: shown, html } = await createOnPage(browser, { name: 'rig laptop', scope_read: 'on', scope_upload: 'on', expiresInDays: '30', formKey });
		expect(res.headers.get('location')).toBe('/account?token=created#tokens');
		const flash = res.headers.getSetCookie().find((c) => c.startsWith('ringdown-new-token='));
		expect(flash).toMatch(/Path=\/account/i);
		expect(flash).toMatch(/HttpOnly/i);
		expect(flash).toMatch(/SameSite=Strict/i);
		expect(shown, html.slice(0, 500)).not.toBeNull();
		token = shown!;
		expect(html).toContain('shown this once');
		// Seen once: the next look at the page has only its name and hint.
		const again = await (await browser.get('/account', { accept: 'text/html' })).text();
		expect(again).not.toMatch(TOKEN_IN_TEXT);
		expect(again).toContain('rig laptop');
		expect(again).toContain(`${token.slice(0, 8)}…`);
	});

	it('stores only the SHA-256 of the token, with its scopes and a bounded expiry', async () => {
		const row = await k('api_tokens').where({ user_id: acoustician.id, name: 'rig laptop' }).first();
		expect(row.token_hash).toBe(sha256(token));
		expect(row.hint).toBe(token.slice(0, 8));
		expect(row.scopes).toBe('read,upload');
		const days = (new Date(row.expires_at).getTime() - new Date(row.created_at).getTime()) / 86_400_000;
		expect(days).toBeCloseTo(30, 2);
		const audit = await k('audit_events').where({ action: 'api_token.created', entity_id: row.id }).first();
		expect(audit.user_id).toBe(acoustician.id);
		expect(detailsOf(audit.details)).toMatchObject({ name: 'rig laptop', scopes: ['read', 'upload'] });
	});

	it('leaves the token itself in no column of any table', async () => {
		const secret = token.slice(4);
		const columns: { table: string; column: string }[] = (
			await k.raw(
				`SELECT TABLE_NAME AS \`table\`, COLUMN_NAME AS \`column\` FROM information_schema.COLUMNS
				 WHERE TABLE_SCHEMA = DATABASE() AND DATA_TYPE IN ('char','varchar','text','mediumtext','longtext','tinytext','json','blob','mediumblob','longblob','varbinary','binary')`
			)
		)[0];
		expect(columns.length).toBeGreaterThan(20);
		const found: string[] = [];
		for (const { table, column } of columns) {
			const hit = await k(table).whereRaw('INSTR(??, ?) > 0', [column, secret]).first(k.raw('1 AS hit'));
			if (hit) found.push(`${table}.${column}`);
		}
		expect(found).toEqual([]);
	});

	it('acts on a resent form once: the same redirect, one token, and the token is not shown again', async () => {
		const { res, token: shown } = await createOnPage(browser, { name: 'rig laptop', scope_read: 'on', scope_upload: 'on', expiresInDays: '30', formKey });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/account?token=created#tokens');
		expect(shown).toBeNull();
		expect((await k('api_tokens').where({ user_id: acoustician.id, name: 'rig laptop' }).count({ n: '*' }).first())?.n).toBe(1);
	});

	it.each([
		['no scope', { name: 'x', expiresInDays: '30' }, 'Tick at least one scope.'],
		['an expiry past a year', { name: 'x', scope_read: 'on', expiresInDays: '366' }, 'A token lasts at most 365 days.'],
		['no expiry', { name: 'x', scope_read: 'on', expiresInDays: '' }, 'A token lasts at least one day.'],
		['no name', { name: '  ', scope_read: 'on', expiresInDays: '30' }, 'Name the token']
	])('refuses %s with the reason, and makes nothing', async (_, fields, message) => {
		const before = (await k('api_tokens').where({ user_id: acoustician.id }).count({ n: '*' }).first())?.n;
		const res = await browser.postForm('/account?/createToken', { formId: 'token', ...fields });
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(html).toContain(message);
		expect((await k('api_tokens').where({ user_id: acoustician.id }).count({ n: '*' }).first())?.n).toBe(before);
	});

	it('refuses a token past the twentieth in use', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		for (let i = 0; i < 20; i++) await makeApiToken(k, u.id, ['read']);
		// Expired and revoked ones do not count.
		await makeApiToken(k, u.id, ['read'], { expiresAt: new Date(Date.now() - 1000) });
		const c = await signedInClient(u.email, TEST_PASSWORD);
		const res = await c.postForm('/account?/createToken', { formId: 'token', name: 'one more', scope_read: 'on', expiresInDays: '7' });
		expect(res.status).toBe(409);
		expect(await res.text()).toContain('You have 20 tokens in use');
		await k('api_tokens').where({ user_id: u.id }).whereNull('revoked_at').limit(1).update({ revoked_at: new Date() });
		expect((await c.postForm('/account?/createToken', { formId: 'token', name: 'one more', scope_read: 'on', expiresInDays: '7' })).status).toBe(303);
	});
});

describe('a request with a token', () => {
	it('acts as its user on /api routes, with no cookie and no Origin', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['read']);
		const res = await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`);
		expect(res.status).toBe(200);
		const body = (await res.json()) as { captures: { positionLabel: string }[]; pending: number };
		expect(Array.isArray(body.captures)).toBe(true);
		expect(typeof body.pending).toBe('number');
	});

	it('opens no page and runs no form action', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['read', 'upload', 'review']);
		for (const path of ['/projects', `/sessions/${tree.sessionId}`, '/account']) {
			const res = await withToken(token, 'GET', path, { headers: { accept: 'text/html' } });
			expect(res.status, path).toBe(303);
			expect(res.headers.get('location'), path).toMatch(/^\/signin\?/);
		}
		const before = (await k('users').where({ id: acoustician.id }).first()).session_version;
		const action = await withToken(token, 'POST', '/account?/signOutEverywhere', { headers: { accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' }, body: '' });
		expect(action.status).toBe(303);
		expect(action.headers.get('location')).toMatch(/^\/signin\?/);
		expect((await k('users').where({ id: acoustician.id }).first()).session_version).toBe(before);
		const created = await withToken(token, 'POST', `/rooms/${tree.roomId}?/createSession`, {
			headers: { accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ conditionLabel: 'by token', measuredOn: '2026-12-04' })
		});
		expect(created.status).toBe(303);
		expect(await k('sessions').where({ room_id: tree.roomId, condition_label: 'by token' }).first()).toBeUndefined();
	});

	it('is the token’s user only: a cookie sent along is not read', async () => {
		const otherOrg = await makeOrganization(k);
		const otherTree = await makeProjectTree(k, otherOrg);
		const otherAdmin = await makeUser(k, otherOrg, 'admin');
		const res = await new Client().signIn(otherAdmin.email, TEST_PASSWORD);
		const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
		expect((await fetch(`${BASE_URL}/api/sessions/${otherTree.sessionId}/captures`, { headers: { cookie, accept: 'application/json' } })).status).toBe(200);
		const { token } = await makeApiToken(k, acoustician.id, ['read']);
		expect((await withToken(token, 'GET', `/api/sessions/${otherTree.sessionId}/captures`, { headers: { cookie } })).status).toBe(404);
		// Another scheme (a proxy's Basic) is not a token: the cookie session answers as before.
		expect((await fetch(`${BASE_URL}/api/sessions/${otherTree.sessionId}/captures`, { headers: { cookie, authorization: 'Basic dTpw', accept: 'application/json' } })).status).toBe(200);
	});

	it('without a token or a session: 401 naming the Bearer scheme', async () => {
		const res = await fetch(`${BASE_URL}/api/sessions/${tree.sessionId}/captures`, { headers: { accept: 'application/json' } });
		expect(res.status).toBe(401);
		expect(res.headers.get('www-authenticate')).toBe('Bearer realm="Ringdown"');
		expect((await res.json()).message).toContain('Authorization: Bearer');
	});

	it.each([
		['a malformed token', 'rdt_short'],
		['an empty one', ''],
		['a well-formed token nobody made', `rdt_${'A'.repeat(43)}`]
	])('refuses %s: 401, not valid, with the RFC 6750 challenge', async (_, token) => {
		const res = await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`);
		expect(res.status).toBe(401);
		expect(res.headers.get('www-authenticate')).toBe('Bearer realm="Ringdown", error="invalid_token", error_description="The token is not valid"');
		expect(await res.json()).toEqual({ message: 'This API token is not valid.', code: 'invalid_token' });
	});
});

describe('scopes, within the role', () => {
	let captureId: number;
	beforeAll(async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['upload']);
		const res = await upload(token, tree.sessionId, 'scoped', 71);
		expect(res.status, await res.clone().text()).toBe(201);
		captureId = (await res.json()).capture.id;
	});

	const calls = (sessionId: number, capture: () => number) => ({
		read: () => [
			['GET', `/api/sessions/${sessionId}/captures`],
			['GET', `/api/captures/${capture()}`]
		],
		upload: () => [
			['POST', `/api/sessions/${sessionId}/rerun`],
			['PATCH', `/api/captures/${capture()}`]
		]
	});

	it('read: reads, and is refused every change with 403 naming the scopes', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['read']);
		const c = calls(tree.sessionId, () => captureId);
		for (const [method, path] of c.read()) expect((await withToken(token, method, path)).status, `${method} ${path}`).toBe(200);
		for (const [method, path] of c.upload()) {
			const res = await withToken(token, method, path, { headers: { 'content-type': 'application/json' }, body: JSON.stringify({ filename: 'renamed.wav' }) });
			expect(res.status, `${method} ${path}`).toBe(403);
			expect((await res.json()).message).toBe('This API token’s scopes do not allow this.');
		}
		expect((await upload(token, tree.sessionId, 'read-only', 72)).status).toBe(403);
		expect((await withToken(token, 'DELETE', `/api/captures/${captureId}`)).status).toBe(403);
		expect(await k('captures').where({ id: captureId }).first()).toBeTruthy();
	});

	it('upload: uploads and changes captures, and reads nothing', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['upload']);
		const c = calls(tree.sessionId, () => captureId);
		for (const [method, path] of c.read()) expect((await withToken(token, method, path)).status, `${method} ${path}`).toBe(403);
		const rerun = await withToken(token, 'POST', `/api/sessions/${tree.sessionId}/rerun`);
		expect(rerun.status).toBe(200);
		const rename = await withToken(token, 'PATCH', `/api/captures/${captureId}`, { headers: { 'content-type': 'application/json' }, body: JSON.stringify({ filename: 'renamed.wav' }) });
		expect(rename.status).toBe(200);
		expect((await k('captures').where({ id: captureId }).first()).original_filename).toBe('renamed.wav');
	});

	it('review: neither reads captures nor uploads', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['review']);
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(403);
		expect((await upload(token, tree.sessionId, 'review-only', 73)).status).toBe(403);
	});

	it('every scope cannot take a client past their role', async () => {
		const client = await makeUser(k, orgId, 'client');
		await k('project_members').insert({ project_id: tree.projectId, user_id: client.id });
		const { token } = await makeApiToken(k, client.id, ['read', 'upload', 'review']);
		const res = await upload(token, tree.sessionId, 'by client', 74);
		expect(res.status).toBe(403);
		expect((await res.json()).message).toBe('Your role does not allow this.');
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(403);
	});
});

describe('the end of a token', () => {
	it('expired: 401 saying when, and the challenge says so', async () => {
		const { id, token } = await makeApiToken(k, acoustician.id, ['read']);
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
		await k('api_tokens').where({ id }).update({ expires_at: new Date('2026-11-30T12:00:00Z') });
		const res = await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`);
		expect(res.status).toBe(401);
		expect(res.headers.get('www-authenticate')).toContain('error="invalid_token", error_description="The token has expired"');
		expect((await res.json()).message).toBe('This API token expired on 2026-11-30. Create a new one on your account page.');
	});

	it('revoked on the account page: refused from the next request on, and audited', async () => {
		const { id, token } = await makeApiToken(k, acoustician.id, ['read'], { name: 'to revoke' });
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
		const res = await browser.postForm('/account?/revokeToken', { formId: 'revoke', tokenId: String(id) });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/account?token=revoked#tokens');
		const refused = await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`);
		expect(refused.status).toBe(401);
		expect((await refused.json()).message).toContain('was revoked');
		expect(await k('audit_events').where({ action: 'api_token.revoked', entity_id: id, user_id: acoustician.id }).first()).toBeTruthy();
		const page = await (await browser.get('/account', { accept: 'text/html' })).text();
		expect(page).toMatch(/to revoke[\s\S]*?Revoked/);
	});

	it('someone else’s token cannot be revoked (404), and it keeps working', async () => {
		const other = await makeUser(k, orgId, 'acoustician');
		const { id, token } = await makeApiToken(k, other.id, ['read']);
		const res = await browser.postForm('/account?/revokeToken', { formId: 'revoke', tokenId: String(id) });
		expect(res.status).toBe(404);
		expect((await k('api_tokens').where({ id }).first()).revoked_at).toBeNull();
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
	});

	it('signing out everywhere ends every token of the account', async () => {
		const u = await makeUser(k, orgId, 'acoustician');
		const c = await signedInClient(u.email, TEST_PASSWORD);
		const { token } = await makeApiToken(k, u.id, ['read']);
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
		expect((await c.postForm('/account?/signOutEverywhere', {})).status).toBe(303);
		const res = await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`);
		expect(res.status).toBe(401);
		expect((await res.json()).message).toContain('signed out everywhere');
		const again = await signedInClient(u.email, TEST_PASSWORD);
		expect(await (await again.get('/account', { accept: 'text/html' })).text()).toContain('Ended with your sessions');
	});

	it('removal from the organization ends the tokens; a membership gone is out of reach at the next request', async () => {
		const admin = await makeUser(k, orgId, 'admin');
		const adminClient = await signedInClient(admin.email, TEST_PASSWORD);
		const member = await makeUser(k, orgId, 'acoustician');
		const { token } = await makeApiToken(k, member.id, ['read']);
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
		expect((await adminClient.postForm(`/organization?/removeMember&org=${orgId}`, { userId: String(member.id) })).status).toBe(200);
		expect((await withToken(token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(401);

		// Memberships are read on every request: one taken away by any path is out of reach at once.
		const secondOrg = await makeOrganization(k);
		const secondTree = await makeProjectTree(k, secondOrg);
		const both = await makeUser(k, orgId, 'acoustician');
		await k('memberships').insert({ user_id: both.id, organization_id: secondOrg, role: 'acoustician' });
		const t2 = await makeApiToken(k, both.id, ['read']);
		expect((await withToken(t2.token, 'GET', `/api/sessions/${secondTree.sessionId}/captures`)).status).toBe(200);
		await k('memberships').where({ user_id: both.id, organization_id: secondOrg }).delete();
		expect((await withToken(t2.token, 'GET', `/api/sessions/${secondTree.sessionId}/captures`)).status).toBe(404);
		expect((await withToken(t2.token, 'GET', `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
	});
});

describe('last use', () => {
	it('is written at most once a minute from one address, and a new address is audited', async () => {
		const { id, token } = await makeApiToken(k, acoustician.id, ['read']);
		const events = () => k('audit_events').where({ action: 'api_token.new_address', entity_id: id }).orderBy('id');
		expect((await getWithTokenFrom('127.0.0.1', token, `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
		const first = await k('api_tokens').where({ id }).first();
		expect(first.last_used_address).toBe('127.0.0.1');
		expect(first.last_used_at).not.toBeNull();
		for (let i = 0; i < 3; i++) expect((await getWithTokenFrom('127.0.0.1', token, `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
		expect((await k('api_tokens').where({ id }).first()).last_used_at).toEqual(first.last_used_at);
		expect((await events()).map((e) => detailsOf(e.details))).toEqual([{ address: '127.0.0.1', previous: null }]);

		expect((await getWithTokenFrom('127.0.0.2', token, `/api/sessions/${tree.sessionId}/captures`)).status).toBe(200);
		expect((await k('api_tokens').where({ id }).first()).last_used_address).toBe('127.0.0.2');
		expect((await events()).map((e) => detailsOf(e.details))).toEqual([
			{ address: '127.0.0.1', previous: null },
			{ address: '127.0.0.2', previous: '127.0.0.1' }
		]);
		expect((await events())[1].user_id).toBe(acoustician.id);
	});

	it('shows on the account page', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['read'], { name: 'seen from afar' });
		await getWithTokenFrom('127.0.0.3', token, `/api/sessions/${tree.sessionId}/captures`);
		const html = await (await browser.get('/account', { accept: 'text/html' })).text();
		expect(html).toMatch(/seen from afar[\s\S]*?UTC[\s\S]*?from 127\.0\.0\.3/);
	});
});

describe('cross-site check', () => {
	it('does not apply to a token request: no ambient credentials, so another Origin is no risk', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['upload']);
		const res = await withToken(token, 'POST', `/api/sessions/${tree.sessionId}/rerun`, { headers: { origin: 'https://evil.example' } });
		expect(res.status).toBe(200);
	});

	it('takes a script’s multipart upload without Origin (SvelteKit’s own check would refuse it)', async () => {
		const { token } = await makeApiToken(k, acoustician.id, ['upload']);
		const recorded = new Uint8Array(readFileSync(join(FIXTURES, 'decay-t0.5-48k.wav')));
		const form = new FormData();
		form.set('kind', 'impulse');
		form.set('newPositionLabel', 'no origin');
		form.set('file', new Blob([recorded], { type: 'audio/wav' }), 'no-origin.wav');
		const res = await withToken(token, 'POST', `/api/sessions/${tree.sessionId}/captures/upload`, { body: form });
		expect(res.status, await res.clone().text()).toBe(201);
	});

	it('a cross-site request with the session cookie and a junk bearer token is the token’s: refused 401, the cookie unused', async () => {
		const res = await new Client().signIn(acoustician.email, TEST_PASSWORD);
		const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
		const sent = await fetch(`${BASE_URL}/api/sessions/${tree.sessionId}/rerun`, {
			method: 'POST',
			headers: { cookie, origin: 'https://evil.example', authorization: 'Bearer junk', accept: 'application/json' }
		});
		expect(sent.status).toBe(401);
	});
});

describe('rate limit', () => {
	it('answers 429 with Retry-After past the requests per minute, per token, counted across requests at once', async () => {
		const server = await startPrivateServer(3194, { API_TOKEN_REQUESTS_PER_MINUTE: '5' });
		try {
			const a = await makeApiToken(k, acoustician.id, ['read']);
			const b = await makeApiToken(k, acoustician.id, ['read']);
			const path = `/api/sessions/${tree.sessionId}/captures`;
			const answers = await Promise.all(Array.from({ length: 8 }, () => withToken(a.token, 'GET', path, { base: server.url })));
			const statuses = answers.map((r) => r.status).sort();
			expect(statuses).toEqual([200, 200, 200, 200, 200, 429, 429, 429]);
			const refused = answers.find((r) => r.status === 429)!;
			const retryAfter = Number(refused.headers.get('retry-after'));
			expect(retryAfter).toBeGreaterThanOrEqual(1);
			expect(retryAfter).toBeLessThanOrEqual(60);
			expect(await refused.json()).toEqual({ message: `Too many requests with this token: try again in ${retryAfter} s.`, code: 'rate_limited' });
			// Another token of the same user has its own allowance.
			expect((await withToken(b.token, 'GET', path, { base: server.url })).status).toBe(200);
			// Counted in the database (every server shares it), under a hashed key.
			expect(await k('rate_limits').where({ bucket: bucketKey('apiToken', String(a.id)) }).first()).toBeTruthy();
		} finally {
			await server.stop();
		}
	}, 90_000);
});
