import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeUser, TEST_PASSWORD } from '../helpers/factories';
import { Client } from '../helpers/http';
import { bucketKey, LIMITS } from '../../src/lib/server/auth/rate-limit';

let k: Knex;
let orgId: number;
beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
});
afterAll(async () => k.destroy());

describe('sign-in', () => {
	it('sets an HttpOnly, SameSite session cookie and signs out again', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const c = new Client();
		const res = await c.signIn(u.email, TEST_PASSWORD);
		expect(res.status).toBe(303);
		const cookie = res.headers.getSetCookie().find((s) => s.includes('session-token'))!;
		expect(cookie).toMatch(/HttpOnly/i);
		expect(cookie).toMatch(/SameSite=Lax/i);
		expect((await c.get('/projects', { accept: 'text/html' })).status).toBe(200);
		expect((await c.postForm('/signout', {})).status).toBe(303);
		expect((await c.get('/projects', { accept: 'text/html' })).status).toBe(303);
	});

	it('sends signed-out visitors to sign-in, and API calls get 401', async () => {
		const c = new Client();
		const page = await c.get('/projects', { accept: 'text/html' });
		expect(page.status).toBe(303);
		expect(page.headers.get('location')).toMatch(/^\/signin\?redirectTo=/);
		expect((await c.get('/api/anything', { accept: 'application/json' })).status).toBe(401);
	});

	it('refuses a wrong password with a clear message and no cookie', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const c = new Client();
		const res = await c.signIn(u.email, 'not the password');
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('do not match an account');
		expect(c.signedIn).toBe(false);
	});

	it('closes the Auth.js credential endpoint so the limit cannot be bypassed', async () => {
		const c = new Client();
		const res = await c.postForm('/auth/callback/credentials', { email: 'x@example.test', password: 'y' });
		expect(res.status).toBe(404);
	});

	it(`limits failures to ${LIMITS.signInAccount.limit} per ${LIMITS.signInAccount.windowMs / 60_000} minutes per account`, async () => {
		const u = await makeUser(k, orgId, 'acoustician');
		const c = new Client();
		for (let i = 0; i < LIMITS.signInAccount.limit; i++) expect((await c.signIn(u.email, `wrong ${i}`)).status).toBe(400);
		const blocked = await c.signIn(u.email, 'wrong again');
		expect(blocked.status).toBe(429);
		expect(await blocked.text()).toMatch(/Too many failed sign-ins\. Try again in \d+ minutes?/);
		// Even the right password waits until the window has passed.
		expect((await c.signIn(u.email, TEST_PASSWORD)).status).toBe(429);
		// Another account from the same address is not locked out by it.
		const other = await makeUser(k, orgId, 'acoustician');
		expect((await c.signIn(other.email, TEST_PASSWORD)).status).toBe(303);
		// Once the lockout has passed, sign-in works again.
		const past = new Date(Date.now() - 1000);
		await k('rate_limits').where({ bucket: bucketKey('signInAccount', u.email) }).update({ blocked_until: past, window_ends_at: past });
		expect((await new Client().signIn(u.email, TEST_PASSWORD)).status).toBe(303);
	});
});
