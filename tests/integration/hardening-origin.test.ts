// Changes from another site are refused whatever their content type, pages carry a
// Content-Security-Policy, and cookies are Secure exactly when the public address is HTTPS.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { startPrivateServer } from '../helpers/private-server';

const FOREIGN = 'https://evil.example';

let k: Knex;
let orgId: number;
let tree: ProjectTree;
let acoustician: Client;
let cookie: string;
beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
	tree = await makeProjectTree(k, orgId);
	const u = await makeUser(k, orgId, 'acoustician');
	acoustician = await signedInClient(u.email, TEST_PASSWORD);
	// The session cookie, to send by hand with or without an Origin.
	const res = await new Client().signIn(u.email, TEST_PASSWORD);
	cookie = res.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.join('; ');
});
afterAll(async () => k.destroy());

const send = (method: string, path: string, headers: Record<string, string>) => fetch(BASE_URL + path, { method, headers, redirect: 'manual' });

describe('state-changing requests from another site', () => {
	it('refuses a body-less POST with a foreign Origin on both rerun routes', async () => {
		const captureId = 999_999_999; // past the origin check a missing capture is a 404, not a 403
		for (const path of [`/api/sessions/${tree.sessionId}/rerun`, `/api/captures/${captureId}/rerun`]) {
			const res = await send('POST', path, { cookie, origin: FOREIGN, accept: 'application/json' });
			expect(res.status, path).toBe(403);
			expect(await res.json()).toEqual({ message: 'Changes from another site are refused.' });
		}
	});

	it('refuses PUT, PATCH and DELETE from another site, and any content type', async () => {
		for (const method of ['PUT', 'PATCH', 'DELETE']) {
			expect((await send(method, `/api/captures/999999999`, { cookie, origin: FOREIGN })).status, method).toBe(403);
		}
		const json = await fetch(`${BASE_URL}/api/sessions/${tree.sessionId}/rerun`, { method: 'POST', headers: { cookie, origin: FOREIGN, 'content-type': 'application/json' }, body: '{}' });
		expect(json.status).toBe(403);
	});

	it('refuses a request that carries the session cookie but no Origin', async () => {
		expect((await send('POST', `/api/sessions/${tree.sessionId}/rerun`, { cookie })).status).toBe(403);
	});

	it('accepts the same request from the site itself', async () => {
		const res = await acoustician.request('POST', `/api/sessions/${tree.sessionId}/rerun`, { headers: { accept: 'application/json' } });
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ queued: 0 });
	});

	// SvelteKit's own check (form content types only) is off: the handle covers these too.
	it('refuses form content types from another site or with cookies and no Origin: actions, uploads, sign-in', async () => {
		const label = `cross-site ${Date.now()}`;
		const form = await send('POST', `/rooms/${tree.roomId}?/createSession`, { cookie, origin: FOREIGN, 'content-type': 'application/x-www-form-urlencoded' });
		expect(form.status).toBe(403);
		const noOrigin = await fetch(`${BASE_URL}/rooms/${tree.roomId}?/createSession`, {
			method: 'POST',
			redirect: 'manual',
			headers: { cookie, 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ conditionLabel: label, measuredOn: '2026-12-04' })
		});
		expect(noOrigin.status).toBe(403);
		expect(await k('sessions').where({ room_id: tree.roomId, condition_label: label }).first()).toBeUndefined();
		const multipart = new FormData();
		multipart.set('kind', 'impulse');
		multipart.set('newPositionLabel', 'cross-site');
		multipart.set('file', new Blob([new Uint8Array(64)], { type: 'audio/wav' }), 'x.wav');
		const upload = await fetch(`${BASE_URL}/api/sessions/${tree.sessionId}/captures/upload`, { method: 'POST', headers: { cookie, origin: FOREIGN, accept: 'application/json' }, body: multipart });
		expect(upload.status).toBe(403);
		expect(await upload.json()).toEqual({ message: 'Changes from another site are refused.' });
		const text = await fetch(`${BASE_URL}/api/sessions/${tree.sessionId}/rerun`, { method: 'POST', headers: { cookie, 'content-type': 'text/plain' }, body: 'x' });
		expect(text.status).toBe(403);
		// Signing someone in from another site (into the attacker's account) is refused as well.
		const signIn = await fetch(`${BASE_URL}/signin`, {
			method: 'POST',
			redirect: 'manual',
			headers: { origin: FOREIGN, 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
			body: new URLSearchParams({ email: 'x@example.test', password: 'x', redirectTo: '/projects' })
		});
		expect(signIn.status).toBe(403);
	});

	it('lets a request without cookies and without Origin through to sign-in (a script with a token, later)', async () => {
		const res = await send('POST', `/api/sessions/${tree.sessionId}/rerun`, { accept: 'application/json' });
		expect(res.status).toBe(401);
	});
});

describe('Content-Security-Policy', () => {
	it('allows only the page’s own scripts (by nonce) and uploads to the configured object store', async () => {
		const res = await acoustician.get(`/sessions/${tree.sessionId}`, { accept: 'text/html' });
		expect(res.status).toBe(200);
		const csp = res.headers.get('content-security-policy') ?? '';
		const directive = (name: string) => csp.split(';').map((d) => d.trim()).find((d) => d.startsWith(`${name} `)) ?? '';
		const nonce = /'nonce-([^']+)'/.exec(directive('script-src'))?.[1];
		expect(nonce).toBeTruthy();
		expect(directive('script-src')).not.toContain('unsafe-inline');
		expect(directive('default-src')).toBe("default-src 'self'");
		expect(directive('frame-ancestors')).toBe("frame-ancestors 'none'");
		expect(directive('object-src')).toBe("object-src 'none'");
		expect(directive('connect-src').split(' ')).toEqual(['connect-src', "'self'", new URL(process.env.S3_ENDPOINT!).origin]);
		// Every inline script of the page carries that nonce.
		const html = await res.text();
		const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)([^>]*)>/g)].map((m) => m[1]);
		expect(inline.length).toBeGreaterThan(0);
		for (const attrs of inline) expect(attrs).toContain(`nonce="${nonce}"`);
	});
});

describe('cookie flags', () => {
	const flags = (setCookies: string[]) => setCookies.map((c) => ({ name: c.split('=')[0], secure: /;\s*secure/i.test(c), httpOnly: /;\s*httponly/i.test(c), sameSite: /;\s*samesite=lax/i.test(c) }));

	it('over http: HttpOnly and SameSite, never Secure — on sign-in and on sign-out', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const c = new Client();
		const signIn = flags((await c.signIn(u.email, TEST_PASSWORD)).headers.getSetCookie());
		const signOut = flags((await c.postForm('/signout', {})).headers.getSetCookie());
		expect(signIn.map((f) => f.name)).toContain('authjs.session-token');
		expect(signOut.length).toBeGreaterThan(0);
		for (const f of [...signIn, ...signOut]) expect(f, f.name).toMatchObject({ secure: false, httpOnly: true, sameSite: true });
	});

	it('with an https public address: the __Secure- session cookie, Secure on sign-in and on sign-out', async () => {
		const server = await startPrivateServer(3196, {}, 'https://127.0.0.1:3196');
		try {
			const u = await makeUser(k, orgId, 'consultant');
			const headers = { origin: 'https://127.0.0.1:3196', 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' };
			const signIn = await fetch(`${server.url}/signin`, { method: 'POST', redirect: 'manual', headers, body: new URLSearchParams({ email: u.email, password: TEST_PASSWORD, redirectTo: '/projects' }) });
			expect(signIn.status).toBe(303);
			const session = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
			const signOut = await fetch(`${server.url}/signout`, { method: 'POST', redirect: 'manual', headers: { ...headers, cookie: session }, body: '' });
			expect(signOut.status).toBe(303);
			const all = [...flags(signIn.headers.getSetCookie()), ...flags(signOut.headers.getSetCookie())];
			expect(all.map((f) => f.name)).toContain('__Secure-authjs.session-token');
			for (const f of all) expect(f, f.name).toMatchObject({ secure: true, httpOnly: true });
		} finally {
			await server.stop();
		}
	});
});
