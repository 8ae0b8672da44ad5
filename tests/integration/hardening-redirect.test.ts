// After signing in, people are sent only to a path on this site, whatever `redirectTo` says.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { makeOrganization, makeUser, TEST_PASSWORD } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';

// How a browser reads the Location header it gets (WHATWG URL Standard, as Node implements it).
const staysOnSite = (location: string | null) => location !== null && new URL(location, `${BASE_URL}/signin`).origin === new URL(BASE_URL).origin;

// `redirectTo` as it arrives in the address bar, percent-encoded ("%09" is a tab).
const HOSTILE_QUERIES = ['/%09/evil.example', '/%0a/evil.example', '/%0d%0a/evil.example', '//evil.example', '/%5Cevil.example', '%2F%2Fevil.example', 'https://evil.example', 'javascript:alert(1)', '/.//evil.example'];

let k: Knex;
let email: string;
beforeAll(async () => {
	k = testDb();
	email = (await makeUser(k, await makeOrganization(k), 'consultant')).email;
});
afterAll(async () => k.destroy());

describe('sign-in redirects stay on the site', () => {
	it.each(HOSTILE_QUERIES)('a signed-in visit to /signin?redirectTo=%s goes to the projects', async (query) => {
		const c = await signedInClient(email, TEST_PASSWORD);
		const res = await c.get(`/signin?redirectTo=${query}`, { accept: 'text/html' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/projects');
	});

	it.each(HOSTILE_QUERIES)('signing in with redirectTo=%s goes to the projects', async (query) => {
		const target = decodeURIComponent(query);
		const c = new Client();
		const res = await c.postForm('/signin', { email, password: TEST_PASSWORD, redirectTo: target });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/projects');
	});

	it('the sign-in form carries only a safe target in its hidden field', async () => {
		const html = await (await new Client().get('/signin?redirectTo=/%09/evil.example', { accept: 'text/html' })).text();
		expect(html).not.toContain('evil.example');
	});

	it('a path on the site is kept, with its query', async () => {
		const c = new Client();
		const res = await c.postForm('/signin', { email, password: TEST_PASSWORD, redirectTo: '/projects?sort=name#top' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/projects?sort=name#top');
		expect(staysOnSite(res.headers.get('location'))).toBe(true);
	});
});
