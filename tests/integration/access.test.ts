import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { authorize, type Target } from '../../src/lib/server/auth/access';
import { loadSessionUser } from '../../src/lib/server/auth/session-user';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, type ProjectTree } from '../helpers/factories';
import type { Role } from '../../src/lib/roles';

let k: Knex;
let orgA: number, orgB: number;
let treeA: ProjectTree, treeA2: ProjectTree, treeB: ProjectTree;
const users: Record<string, number> = {};

async function localsOf(userId: number): Promise<App.Locals> {
	const loaded = await loadSessionUser(k, userId);
	return { user: loaded!.user, memberships: loaded!.memberships } as App.Locals;
}

async function statusOf(p: Promise<unknown>): Promise<number> {
	try {
		await p;
		return 200;
	} catch (e) {
		return (e as { status?: number }).status ?? 500;
	}
}

beforeAll(async () => {
	k = testDb();
	orgA = await makeOrganization(k);
	orgB = await makeOrganization(k);
	for (const role of ['admin', 'acoustician', 'consultant', 'client'] as Role[]) users[role] = (await makeUser(k, orgA, role)).id;
	users.otherClient = (await makeUser(k, orgA, 'client')).id;
	treeA = await makeProjectTree(k, orgA, users.client);
	treeA2 = await makeProjectTree(k, orgA, users.otherClient);
	treeB = await makeProjectTree(k, orgB);
});

afterAll(async () => k.destroy());

const targetsOf = (t: ProjectTree): Target[] => [{ projectId: t.projectId }, { roomId: t.roomId }, { sessionId: t.sessionId }, { positionId: t.positionId }];

describe('authorize', () => {
	it('is signed-out proof: 401 without a user', async () => {
		expect(await statusOf(authorize({ user: null, memberships: [] } as unknown as App.Locals, 'project:read', { projectId: treeA.projectId }, k))).toBe(401);
	});

	it('lets staff read every project of their organization', async () => {
		for (const role of ['admin', 'acoustician', 'consultant']) {
			const locals = await localsOf(users[role]);
			for (const t of [...targetsOf(treeA), ...targetsOf(treeA2)]) expect(await statusOf(authorize(locals, 'project:read', t, k))).toBe(200);
		}
	});

	it('hides another organization entirely (404, not 403)', async () => {
		for (const role of ['admin', 'acoustician', 'consultant', 'client']) {
			const locals = await localsOf(users[role]);
			for (const t of targetsOf(treeB)) expect(await statusOf(authorize(locals, 'project:read', t, k))).toBe(404);
		}
	});

	it('lets a client read only their own project', async () => {
		const locals = await localsOf(users.client);
		for (const t of targetsOf(treeA)) expect(await statusOf(authorize(locals, 'project:read', t, k))).toBe(200);
		for (const t of targetsOf(treeA2)) expect(await statusOf(authorize(locals, 'project:read', t, k))).toBe(404);
		expect(await statusOf(authorize(locals, 'project:read', { organizationId: orgA }, k))).toBe(404);
	});

	it('refuses a role what it may not do (403) on what it can see', async () => {
		const client = await localsOf(users.client);
		expect(await statusOf(authorize(client, 'capture:write', { sessionId: treeA.sessionId }, k))).toBe(403);
		const consultant = await localsOf(users.consultant);
		expect(await statusOf(authorize(consultant, 'capture:write', { sessionId: treeA.sessionId }, k))).toBe(403);
		expect(await statusOf(authorize(consultant, 'members:manage', { organizationId: orgA }, k))).toBe(403);
		const acoustician = await localsOf(users.acoustician);
		expect(await statusOf(authorize(acoustician, 'capture:write', { sessionId: treeA.sessionId }, k))).toBe(200);
		expect(await statusOf(authorize(acoustician, 'report:publish', { roomId: treeA.roomId }, k))).toBe(403);
	});

	it('answers 404 for targets that do not exist', async () => {
		const admin = await localsOf(users.admin);
		expect(await statusOf(authorize(admin, 'project:read', { roomId: 2_000_000_000 }, k))).toBe(404);
	});

	it('returns the scope it checked', async () => {
		const scope = await authorize(await localsOf(users.acoustician), 'project:edit', { sessionId: treeA.sessionId }, k);
		expect(scope).toMatchObject({ organizationId: orgA, projectId: treeA.projectId, role: 'acoustician' });
	});
});
