import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, Client } from '../helpers/http';
import { fillRoute, listRoutes } from '../helpers/routes';
import { ownedIds } from '../helpers/owned-ids';

// A client of project A must get 404 on every page, form action and API route of project B —
// in the same organization and in another one. authorize() answers 404 for what lies outside a
// user's reach, so its existence is not revealed, and 403 only for what a user can see but their
// role may not do; a client reaches only the projects they are a member of, so project B of
// either organization is out of reach. The route list comes from the route modules, so a route
// or action added later is covered without editing this test.
let k: Knex;
let client: Client;
let treeA: ProjectTree, sameOrgB: ProjectTree, otherOrgB: ProjectTree;
let idsSameOrg: Record<string, number | string>, idsOtherOrg: Record<string, number | string>;

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
