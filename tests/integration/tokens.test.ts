import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { createInvitation, createPasswordReset, INVITATION_DAYS, RESET_HOURS } from '../../src/lib/server/queries/tokens';
import { hashToken } from '../../src/lib/server/auth/tokens';

let k: Knex;
let orgId: number;
let adminId: number;

beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
	adminId = (await makeUser(k, orgId, 'admin')).id;
});
afterAll(async () => k.destroy());

const PASSWORD = 'a long new password';

describe('invitation tokens', () => {
	it('are stored hashed, work once, and create the account with its role and project', async () => {
		const tree = await makeProjectTree(k, orgId);
		const email = `invitee-${Date.now()}@example.test`;
		const { id, token } = await createInvitation(k, { organizationId: orgId, email, role: 'client', projectId: tree.projectId, invitedBy: adminId });
		const row = await k('invitations').where({ id }).first();
		expect(row.token_hash).toBe(hashToken(token));
		expect(row.token_hash).not.toContain(token);
		// Expiry as documented: 7 days.
		expect(new Date(row.expires_at).getTime() - Date.now()).toBeGreaterThan((INVITATION_DAYS * 24 - 1) * 3600_000);

		const c = new Client();
		expect((await c.get(`/invitation/${token}`, { accept: 'text/html' })).status).toBe(200);
		const accepted = await c.postForm(`/invitation/${token}`, { name: 'New Client', password: PASSWORD, confirm: PASSWORD });
		expect(accepted.status).toBe(303);

		const user = await k('users').where({ email }).first();
		expect(user.name).toBe('New Client');
		expect(await k('memberships').where({ user_id: user.id, organization_id: orgId }).first('role')).toEqual({ role: 'client' });
		expect(await k('project_members').where({ user_id: user.id, project_id: tree.projectId }).first()).toBeTruthy();

		// Second use: refused, and nothing changes.
		expect((await c.get(`/invitation/${token}`, { accept: 'text/html' })).status).toBe(410);
		const again = await c.postForm(`/invitation/${token}`, { name: 'Someone Else', password: 'another password!', confirm: 'another password!' });
		expect(again.status).toBe(410);
		expect((await k('users').where({ email }).first()).name).toBe('New Client');

		// And the new password signs in.
		await signedInClient(email, PASSWORD);
	});

	it('expire', async () => {
		const email = `late-${Date.now()}@example.test`;
		const past = new Date(Date.now() - (INVITATION_DAYS + 1) * 86400_000);
		const { token } = await createInvitation(k, { organizationId: orgId, email, role: 'consultant', projectId: null, invitedBy: adminId }, past);
		const c = new Client();
		expect((await c.get(`/invitation/${token}`, { accept: 'text/html' })).status).toBe(410);
		expect((await c.postForm(`/invitation/${token}`, { name: 'Late', password: PASSWORD, confirm: PASSWORD })).status).toBe(410);
		expect(await k('users').where({ email }).first()).toBeUndefined();
	});

	it('reject a mismatched confirmation with a field error and keep the token usable', async () => {
		const email = `typo-${Date.now()}@example.test`;
		const { token } = await createInvitation(k, { organizationId: orgId, email, role: 'acoustician', projectId: null, invitedBy: adminId });
		const c = new Client();
		const res = await c.postForm(`/invitation/${token}`, { name: 'Typo', password: PASSWORD, confirm: PASSWORD + 'x' });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('The two passwords differ.');
		expect((await c.get(`/invitation/${token}`, { accept: 'text/html' })).status).toBe(200);
	});
});

describe('password reset tokens', () => {
	it('work once and replace the password', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const token = await createPasswordReset(k, u.id);
		const c = new Client();
		expect((await c.postForm(`/password/reset/${token}`, { password: PASSWORD, confirm: PASSWORD })).status).toBe(303);
		await signedInClient(u.email, PASSWORD);
		expect((await c.postForm(`/password/reset/${token}`, { password: 'yet another password', confirm: 'yet another password' })).status).toBe(410);
		await signedInClient(u.email, PASSWORD);
	});

	it('expire', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const token = await createPasswordReset(k, u.id, new Date(Date.now() - (RESET_HOURS + 1) * 3600_000));
		const res = await new Client().get(`/password/reset/${token}`, { accept: 'text/html' });
		expect(res.status).toBe(410);
		// Signed out, the page offers the ways on that work: a new link, and signing in.
		const html = await res.text();
		expect(html).toContain('href="/password/forgot"');
		expect(html).toContain('href="/signin"');
		expect(html).not.toContain('Back to projects');
	});

	it('are queued as mail from the forgot form without revealing unknown addresses', async () => {
		const u = await makeUser(k, orgId, 'acoustician');
		const c = new Client();
		const known = await c.postForm('/password/forgot', { email: u.email });
		const unknown = await c.postForm('/password/forgot', { email: `nobody-${Date.now()}@example.test` });
		expect(known.status).toBe(200);
		expect(unknown.status).toBe(200);
		// The address typed and each page's script nonce differ by design; the rest must not.
		const strip = (s: string) => s.replace(/[\w.+-]+@example\.test/g, '').replace(/nonce="[^"]*"/g, '');
		expect(strip(await known.text())).toBe(strip(await unknown.text()));
		const mail = await k('email_outbox').where({ to_address: u.email, kind: 'password-reset' }).first();
		expect(mail.text_body).toMatch(/\/password\/reset\/[\w-]{40,}/);
	});
});
