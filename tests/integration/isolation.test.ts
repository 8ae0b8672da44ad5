import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, Client } from '../helpers/http';
import { fillRoute, listRoutes } from '../helpers/routes';
import { BASE_URL } from '../helpers/env';
import { ownedIds } from '../helpers/owned-ids';
import { makeApiToken, withToken } from '../helpers/api-tokens';
import { TOKEN_SCOPES } from '../../src/lib/roles';

// A client of project A must get 404 on every page, form action and API route of project B —
// in the same organization and in another one. authorize() answers 404 for what lies outside a
// user's reach, so its existence is not revealed, and 403 only for what a user can see but their
// role may not do; a client reaches only the projects they are a member of, so project B of
// either organization is out of reach. The route list comes from the route modules, so a route
// or action added later is covered without editing this test. The same walk is made with API
// tokens (every scope): a client's token and an admin's token reach what their user reaches and
// no further, and no token opens a page or runs a form action.
let k: Knex;
let client: Client;
let treeA: ProjectTree, sameOrgB: ProjectTree, otherOrgB: ProjectTree;
let idsSameOrg: Record<string, number | string>, idsOtherOrg: Record<string, number | string>, idsOwn: Record<string, number | string>;
let clientToken: string, adminToken: string;
let admin: Client;

// Routes with no project-scoped parameter: reachable by design (sign-in, own account, lists
// filtered by the helper, token pages answered by the token alone).
const UNSCOPED = new Set(['/', '/signin', '/signout', '/health', '/account', '/projects', '/organization', '/signal', '/invitation/[token]', '/password/forgot', '/password/reset/[token]']);

beforeAll(async () => {
	k = testDb();
	const orgA = await makeOrganization(k);
	const orgB = await makeOrganization(k);
	const user = await makeUser(k, orgA, 'client');
	treeA = await makeProjectTree(k, orgA, user.id);
	const otherClient = await makeUser(k, orgA, 'client');
	sameOrgB = await makeProjectTree(k, orgA, otherClient.id);
	otherOrgB = await makeProjectTree(k, orgB);
	idsSameOrg = await ownedIds(k, sameOrgB);
	idsOtherOrg = await ownedIds(k, otherOrgB);
	client = await signedInClient(user.email, TEST_PASSWORD);
	idsOwn = await ownedIds(k, treeA);
	const adminUser = await makeUser(k, orgA, 'admin');
	admin = await signedInClient(adminUser.email, TEST_PASSWORD);
	clientToken = (await makeApiToken(k, user.id, [...TOKEN_SCOPES])).token;
	adminToken = (await makeApiToken(k, adminUser.id, [...TOKEN_SCOPES])).token;
});

afterAll(async () => k.destroy());

const routes = await listRoutes();

describe('route list', () => {
	it('is found and every parameterised route is project-scoped or listed as unscoped', () => {
		expect(routes.length).toBeGreaterThan(10);
		// Read from the modules: the pages with forms bring their actions, the endpoints their methods.
		expect(routes.filter((r) => r.actions.length > 0).length).toBeGreaterThan(5);
		for (const r of routes.filter((r) => r.kind === 'endpoint')) expect(r.methods.length, r.path).toBeGreaterThan(0);
		for (const r of routes) {
			if (UNSCOPED.has(r.path) || r.params.length === 0) continue;
			expect(fillRoute(r.path, idsSameOrg), `no test id for a parameter of ${r.path}`).not.toBeNull();
		}
	});
});

/** What authorize() answers a client for project B: outside their reach in both organizations. */
const OUT_OF_REACH = 404;

describe.each([
	['same organization', () => idsSameOrg],
	['another organization', () => idsOtherOrg]
])('a client of project A, on project B of the %s', (_, ids) => {
	const scoped = routes.filter((r) => r.params.length > 0 && !UNSCOPED.has(r.path));

	it.each(scoped.filter((r) => r.kind === 'page').map((r) => [r.path]))('cannot open page %s', async (path) => {
		const url = fillRoute(path, ids())!;
		const res = await client.get(url, { accept: 'text/html' });
		expect(res.status, `${url}`).toBe(OUT_OF_REACH);
	});

	it.each(scoped.filter((r) => r.actions.length > 0).flatMap((r) => r.actions.map((a) => [r.path, a])))('cannot run action %s ?/%s', async (path, action) => {
		const url = `${fillRoute(path, ids())!}?/${action}`;
		const res = await client.postForm(url, { label: 'x', name: 'x', email: 'x@example.test' });
		expect(res.status, `${url}`).toBe(OUT_OF_REACH);
	});

	it.each(scoped.filter((r) => r.kind === 'endpoint').flatMap((r) => r.methods.map((m) => [m, r.path])))('cannot call %s %s', async (method, path) => {
		const url = fillRoute(path, ids())!;
		const res = await client.request(method, url, { headers: { accept: 'application/json', 'content-type': 'application/json' }, body: method === 'GET' ? undefined : '{}' });
		expect(res.status, `${method} ${url}`).toBe(OUT_OF_REACH);
	});
});

describe.each([
	['a client of project A, on project B of the same organization', () => clientToken, () => idsSameOrg],
	['a client of project A, on project B of another organization', () => clientToken, () => idsOtherOrg],
	['an admin of organization A, on a project of another organization', () => adminToken, () => idsOtherOrg]
])('an API token of %s', (_, token, ids) => {
	const scoped = routes.filter((r) => r.params.length > 0 && !UNSCOPED.has(r.path));

	it.each(scoped.filter((r) => r.kind === 'endpoint').flatMap((r) => r.methods.map((m) => [m, r.path])))('cannot call %s %s', async (method, path) => {
		const url = fillRoute(path, ids())!;
		const res = await withToken(token(), method, url, { headers: { 'content-type': 'application/json' }, body: method === 'GET' ? undefined : '{}' });
		expect(res.status, `${method} ${url}`).toBe(OUT_OF_REACH);
	});
});

const anonymous = (url: string) => fetch(BASE_URL + url, { redirect: 'manual', headers: { accept: 'text/html' } });
const pages = routes.filter((r) => r.kind === 'page');
// Pages that send nobody to sign in; the actions of the others (sign in, forgot password) are
// open to anyone and limited on their own. Ids of a missing row will do: sign-in comes first.
const signInPages: typeof pages = [];
for (const r of pages) {
	const res = await anonymous(r.path.replace(/\[[^\]]+\]/g, '1'));
	if (res.status === 303 && res.headers.get('location')?.startsWith('/signin?')) signInPages.push(r);
}

describe('an API token with every scope, of an admin, on their own organization', () => {
	it('finds the pages that need signing in', () => {
		expect(signInPages.length).toBeGreaterThan(10);
		expect(signInPages.map((r) => r.path)).toContain('/account');
		expect(signInPages.map((r) => r.path)).not.toContain('/signin');
	});

	// A page anyone may open (sign-in, the API description) opens with a token as without one.
	it.each(pages.map((r) => [r.path]))('opens no page: %s answers as it does to nobody', async (path) => {
		const url = fillRoute(path, { ...idsOwn, token: 'x'.repeat(43) })!;
		const [byToken, byNobody] = [await withToken(adminToken, 'GET', url, { headers: { accept: 'text/html' } }), await anonymous(url)];
		expect(byToken.status, url).toBe(byNobody.status);
		expect(byToken.headers.get('location'), url).toBe(byNobody.headers.get('location'));
		if (signInPages.some((r) => r.path === path)) expect(byToken.headers.get('location'), url).toMatch(/^\/signin\?/);
	});

	it.each(signInPages.flatMap((r) => r.actions.map((a) => [r.path, a])))('runs no form action: %s ?/%s sends it to sign in', async (path, action) => {
		const page = fillRoute(path, idsOwn)!;
		const res = await withToken(adminToken, 'POST', `${page}?/${action}`, {
			headers: { accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ label: 'x', name: 'x', email: 'x@example.test' })
		});
		expect(res.status, page).toBe(303);
		expect(res.headers.get('location'), page).toMatch(/^\/signin\?/);
	});

	// Reads only: a change (a delete, a confirm) made by the first of two callers would change the
	// second's answer. Every scope together opens every permission an API route checks today.
	it.each(routes.filter((r) => r.kind === 'endpoint' && r.methods.includes('GET') && !UNSCOPED.has(r.path)).map((r) => [r.path]))(
		'answers GET %s as the admin’s own session does',
		async (path) => {
			const url = fillRoute(path, idsOwn)!;
			const bySession = await admin.get(url, { accept: 'application/json' });
			const byToken = await withToken(adminToken, 'GET', url);
			expect(byToken.status, url).toBe(bySession.status);
			expect(byToken.status, url).not.toBe(401);
		}
	);
});

describe('a client of project A, on their own project', () => {
	it('opens it, and the project list shows nothing else', async () => {
		const own = await client.get(`/projects/${treeA.projectId}`, { accept: 'text/html' });
		expect(own.status).toBe(200);
		const list = await (await client.get('/projects', { accept: 'text/html' })).text();
		expect(list).toContain(treeA.name);
		expect(list).not.toContain(sameOrgB.name);
		expect(list).not.toContain(otherOrgB.name);
	});
});
