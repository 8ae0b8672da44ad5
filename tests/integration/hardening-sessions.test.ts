// Sessions end when they should, at once: a sign-out ends that session even for a copy of its
// cookie; a new password, "sign out everywhere" and removal from an organization end every
// session of the account. Before, the old cookie still opened /projects for twelve hours.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { makeOrganization, makeUser, TEST_PASSWORD } from '../helpers/factories';
import { cookieHeaderOf, postFormFrom } from '../helpers/from-address';
import { userOfSession } from '../../src/lib/server/auth/session-user';
import { createPasswordReset } from '../../src/lib/server/queries/tokens';

const FROM = '127.0.0.1';
let k: Knex;
let orgId: number;

beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
});
afterAll(async () => k.destroy());

/** Sign in and return the session's cookie header, as a browser would keep it. */
async function signIn(email: string, password = TEST_PASSWORD): Promise<string> {
	const res = await postFormFrom(FROM, '/signin', { email, password, redirectTo: '/projects' });
	expect(res.status).toBe(303);
	const cookie = cookieHeaderOf(res.setCookies);
	expect(cookie).toContain('session-token');
	return cookie;
}

/** 200 while the session stands; 303 to sign-in once it has ended. */
async function projectsStatus(cookie: string): Promise<number> {
	const res = await fetch(`${BASE_URL}/projects`, { headers: { cookie, accept: 'text/html' }, redirect: 'manual' });
	if (res.status === 303) expect(res.headers.get('location')).toMatch(/^\/signin\?redirectTo=/);
	return res.status;
}

describe('ending sessions', () => {
	it('sign-out ends that session: a copy of its cookie no longer opens a page, and an API call gets 401', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const cookie = await signIn(u.email);
		const other = await signIn(u.email);
		expect(await projectsStatus(cookie)).toBe(200);
		expect((await postFormFrom(FROM, '/signout', {}, { cookie })).status).toBe(303);
		expect(await projectsStatus(cookie)).toBe(303);
		const api = await fetch(`${BASE_URL}/api/sessions/1/captures`, { headers: { cookie, accept: 'application/json' } });
		expect(api.status).toBe(401);
		// The refused cookie is taken out of the browser.
		const page = await fetch(`${BASE_URL}/projects`, { headers: { cookie, accept: 'text/html' }, redirect: 'manual' });
		expect(page.headers.getSetCookie().some((c) => /session-token=;/.test(c) || /session-token=[^;]*;.*(Max-Age=0|Expires=Thu, 01 Jan 1970)/i.test(c))).toBe(true);
		// The same account's other session (another device) is not ended by it.
		expect(await projectsStatus(other)).toBe(200);
	});

	it('a password reset ends every session of the account, and the new password signs in', async () => {
		const u = await makeUser(k, orgId, 'acoustician');
		const first = await signIn(u.email);
		const second = await signIn(u.email);
		const token = await createPasswordReset(k, u.id);
		const reset = await postFormFrom(FROM, `/password/reset/${token}`, { password: 'a brand new passphrase', confirm: 'a brand new passphrase' });
		expect(reset.status).toBe(303);
		expect(await projectsStatus(first)).toBe(303);
		expect(await projectsStatus(second)).toBe(303);
		expect(await projectsStatus(await signIn(u.email, 'a brand new passphrase'))).toBe(200);
		expect(await k('audit_events').where({ action: 'password.reset', entity_id: u.id }).first()).toBeTruthy();
	});

	it('"sign out everywhere" on the account page ends every session, this one included', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const here = await signIn(u.email);
		const elsewhere = await signIn(u.email);
		const res = await postFormFrom(FROM, '/account?/signOutEverywhere', {}, { cookie: here });
		expect(res.status).toBe(303);
		expect(res.location).toBe('/signin?signedOut=everywhere');
		expect(await projectsStatus(here)).toBe(303);
		expect(await projectsStatus(elsewhere)).toBe(303);
		expect(await k('audit_events').where({ action: 'sessions.ended_everywhere', entity_id: u.id }).first()).toBeTruthy();
		// A new sign-in is a new session, untouched by the ending.
		expect(await projectsStatus(await signIn(u.email))).toBe(200);
	});

	it('the account page offers it', async () => {
		const u = await makeUser(k, orgId, 'client');
		const page = await fetch(`${BASE_URL}/account`, { headers: { cookie: await signIn(u.email), accept: 'text/html' } });
		const html = await page.text();
		expect(html).toContain('action="?/signOutEverywhere"');
		expect(html).toContain('Sign out everywhere');
	});

	it('removal from an organization ends the removed person\'s sessions and their access; only an admin may remove', async () => {
		const admin = await makeUser(k, orgId, 'admin');
		const member = await makeUser(k, orgId, 'consultant');
		const adminCookie = await signIn(admin.email);
		const memberCookie = await signIn(member.email);
		// Not an admin: refused, nothing changes.
		const refused = await postFormFrom(FROM, `/organization?/removeMember&org=${orgId}`, { userId: String(admin.id) }, { cookie: memberCookie });
		expect(refused.status).toBe(403);
		expect(await k('memberships').where({ user_id: admin.id, organization_id: orgId }).first()).toBeTruthy();

		const removed = await postFormFrom(FROM, `/organization?/removeMember&org=${orgId}`, { userId: String(member.id) }, { cookie: adminCookie });
		expect(removed.status).toBe(200);
		expect(await k('memberships').where({ user_id: member.id, organization_id: orgId }).first()).toBeUndefined();
		expect(await projectsStatus(memberCookie)).toBe(303);
		expect(await projectsStatus(adminCookie)).toBe(200);
		const record = await k('audit_events').where({ action: 'membership.removed', entity_id: member.id, organization_id: orgId }).first();
		expect(record?.user_id).toBe(admin.id);
	});

	it('removal takes a client\'s access to the organization\'s projects with it', async () => {
		const admin = await makeUser(k, orgId, 'admin');
		const client = await makeUser(k, orgId, 'client');
		const [projectId] = await k('projects').insert({ organization_id: orgId, name: `removal-${Date.now()}`, client_name: 'c' });
		await k('project_members').insert({ project_id: projectId, user_id: client.id });
		const res = await postFormFrom(FROM, `/organization?/removeMember&org=${orgId}`, { userId: String(client.id) }, { cookie: await signIn(admin.email) });
		expect(res.status).toBe(200);
		expect(await k('project_members').where({ user_id: client.id }).first()).toBeUndefined();
	});

	it('keeps the last admin, and says so', async () => {
		const lone = await makeOrganization(k);
		const admin = await makeUser(k, lone, 'admin');
		const cookie = await signIn(admin.email);
		const res = await postFormFrom(FROM, `/organization?/removeMember&org=${lone}`, { userId: String(admin.id) }, { cookie });
		expect(res.status).toBe(409);
		expect(res.body).toContain('An organization needs at least one admin.');
		expect(await projectsStatus(cookie)).toBe(200);
	});

	it('refuses to remove someone who is not a member (404), and a bad id (400)', async () => {
		const admin = await makeUser(k, orgId, 'admin');
		const stranger = await makeUser(k, await makeOrganization(k), 'consultant');
		const cookie = await signIn(admin.email);
		expect((await postFormFrom(FROM, `/organization?/removeMember&org=${orgId}`, { userId: String(stranger.id) }, { cookie })).status).toBe(404);
		expect((await postFormFrom(FROM, `/organization?/removeMember&org=${orgId}`, { userId: 'nobody' }, { cookie })).status).toBe(400);
		expect(await projectsStatus(await signIn(stranger.email))).toBe(200);
	});

	it('a session lasts twelve hours from its sign-in however often it is used', async () => {
		// The claims are inside the signed token; this checks the rule through the service that reads them.
		const u = await makeUser(k, orgId, 'consultant');
		const row = await k('users').where({ id: u.id }).first('session_version');
		const token = { userId: u.id, sessionId: `test-${Date.now()}`, sessionVersion: row.session_version, signedInAt: Date.now() };
		expect(await userOfSession(k, token)).not.toBeNull();
		expect(await userOfSession(k, token, token.signedInAt + 12 * 3600_000)).not.toBeNull();
		expect(await userOfSession(k, token, token.signedInAt + 12 * 3600_000 + 1)).toBeNull();
		expect(await userOfSession(k, { ...token, sessionVersion: row.session_version + 1 })).toBeNull();
		expect(await userOfSession(k, { userId: u.id })).toBeNull();
	});
});
