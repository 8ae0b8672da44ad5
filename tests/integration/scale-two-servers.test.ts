// Two web servers on one database behave as one: a session signed in on one works on the other,
// a sign-out on either ends it on both, and the sign-in and reset limits count across both.
// Both are started here with the same public address and session secret, as they would run
// behind one load balancer; requests go to each one directly.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeUser, TEST_PASSWORD } from '../helpers/factories';
import { cookieHeaderOf, loopback, postFormFrom } from '../helpers/from-address';
import { startPrivateServer, type PrivateServer } from '../helpers/private-server';
import { LIMITS } from '../../src/lib/server/auth/rate-limit';

const PUBLIC = 'http://127.0.0.1:3195';
let k: Knex;
let orgId: number;
let a: PrivateServer;
let b: PrivateServer;

beforeAll(async () => {
	k = testDb();
	orgId = await makeOrganization(k);
	// One after the other: the machine has two cores, and each server starts faster alone.
	a = await startPrivateServer(3195, {}, PUBLIC);
	b = await startPrivateServer(3196, {}, PUBLIC);
}, 90_000);

afterAll(async () => {
	await a?.stop();
	await b?.stop();
	await k.destroy();
});

const on = (server: PrivateServer) => ({ base: server.url, origin: PUBLIC });

async function signInOn(server: PrivateServer, email: string, from = '127.0.0.1'): Promise<string> {
	const res = await postFormFrom(from, '/signin', { email, password: TEST_PASSWORD, redirectTo: '/projects' }, on(server));
	expect(res.status).toBe(303);
	return cookieHeaderOf(res.setCookies);
}

async function projectsOn(server: PrivateServer, cookie: string): Promise<number> {
	return (await fetch(`${server.url}/projects`, { headers: { cookie, accept: 'text/html' }, redirect: 'manual' })).status;
}

describe('two web servers on one database', () => {
	it('a session signed in on one works on the other', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const cookie = await signInOn(a, u.email);
		expect(await projectsOn(a, cookie)).toBe(200);
		expect(await projectsOn(b, cookie)).toBe(200);
	});

	it('a sign-out on one ends the session on the other at once', async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const cookie = await signInOn(b, u.email);
		expect(await projectsOn(a, cookie)).toBe(200);
		expect((await postFormFrom('127.0.0.1', '/signout', {}, { ...on(b), cookie })).status).toBe(303);
		expect(await projectsOn(a, cookie)).toBe(303);
		expect(await projectsOn(b, cookie)).toBe(303);
	});

	it('"sign out everywhere" on one ends sessions signed in on either', async () => {
		const u = await makeUser(k, orgId, 'acoustician');
		const onA = await signInOn(a, u.email);
		const onB = await signInOn(b, u.email);
		expect((await postFormFrom('127.0.0.1', '/account?/signOutEverywhere', {}, { ...on(a), cookie: onA })).status).toBe(303);
		for (const server of [a, b]) for (const cookie of [onA, onB]) expect(await projectsOn(server, cookie)).toBe(303);
	});

	it(`the sign-in limit counts across both: 40 tries at once, half on each, get ${LIMITS.signInAccount.limit} checks`, async () => {
		const u = await makeUser(k, orgId, 'consultant');
		const answers = await Promise.all(
			Array.from({ length: 40 }, (_, i) => postFormFrom(loopback(71, 1 + (i % 4)), '/signin', { email: u.email, password: `wrong ${i}`, redirectTo: '/projects' }, on(i % 2 ? a : b)))
		);
		const checked = answers.filter((r) => r.status === 400).length;
		const refused = answers.filter((r) => r.status === 429).length;
		expect({ checked, refused }).toEqual({ checked: LIMITS.signInAccount.limit, refused: 40 - LIMITS.signInAccount.limit });
		expect(Number((await k('login_attempts').where({ email: u.email }).count({ n: '*' }).first())!.n)).toBe(LIMITS.signInAccount.limit);
		// Locked out on both.
		for (const server of [a, b]) {
			expect((await postFormFrom(loopback(71, 9), '/signin', { email: u.email, password: TEST_PASSWORD, redirectTo: '/projects' }, on(server))).status).toBe(429);
		}
	});

	it(`the reset limit counts across both: 10 requests, alternating, send ${LIMITS.resetAccount.limit} mails`, async () => {
		const u = await makeUser(k, orgId, 'client');
		const statuses: number[] = [];
		for (let i = 0; i < 10; i++) statuses.push((await postFormFrom(loopback(72, 1 + i), '/password/forgot', { email: u.email }, on(i % 2 ? a : b))).status);
		expect(statuses.filter((s) => s === 200).length).toBe(LIMITS.resetAccount.limit);
		expect(statuses.filter((s) => s === 429).length).toBe(10 - LIMITS.resetAccount.limit);
		expect(Number((await k('email_outbox').where({ to_address: u.email, kind: 'password-reset' }).count({ n: '*' }).first())!.n)).toBe(LIMITS.resetAccount.limit);
	});
});
