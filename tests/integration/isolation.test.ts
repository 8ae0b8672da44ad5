import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, Client } from '../helpers/http';
import { fillRoute, listRoutes } from '../helpers/routes';
import { ownedIds } from '../helpers/owned-ids';

// A client of project A must get 403/404 on every page, form action and API route of
// project B — in the same organization and in another one. The route list comes from the
// file system, so a route added later is covered without editing this test.
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

const routes = listRoutes();

describe('route list', () => {
	it('is found and every parameterised route is project-scoped or listed as unscoped', () => {
		expect(routes.length).toBeGreaterThan(10);
		for (const r of routes) {
			if (UNSCOPED.has(r.path) || r.params.length === 0) continue;
			expect(fillRoute(r.path, idsSameOrg), `no test id for a parameter of ${r.path}`).not.toBeNull();
		}
	});
});

describe.each([
	['same organization', () => idsSameOrg],
	['another organization', () => idsOtherOrg]
])('a client of project A, on project B of the %s', (_, ids) => {
	const scoped = routes.filter((r) => r.params.length > 0 && !UNSCOPED.has(r.path));

	it.each(scoped.filter((r) => r.kind === 'page').map((r) => [r.path]))('cannot open page %s', async (path) => {
		const url = fillRoute(path, ids())!;
		const res = await client.get(url, { accept: 'text/html' });
		expect([403, 404], `${url} answered ${res.status}`).toContain(res.status);
	});

	it.each(scoped.filter((r) => r.actions.length > 0).flatMap((r) => r.actions.map((a) => [r.path, a])))('cannot run action %s ?/%s', async (path, action) => {
		const url = `${fillRoute(path, ids())!}?/${action}`;
		const res = await client.postForm(url, { label: 'x', name: 'x', email: 'x@example.test' });
		expect([403, 404], `${url} answered ${res.status}`).toContain(res.status);
	});

	it.each(scoped.filter((r) => r.kind === 'endpoint').flatMap((r) => r.methods.map((m) => [m, r.path])))('cannot call %s %s', async (method, path) => {
		const url = fillRoute(path, ids())!;
		const res = await client.request(method, url, { headers: { accept: 'application/json', 'content-type': 'application/json' }, body: method === 'GET' ? undefined : '{}' });
		expect([403, 404], `${method} ${url} answered ${res.status}`).toContain(res.status);
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
