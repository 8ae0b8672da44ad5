// Test-data factories: each call makes fresh, uniquely named rows so tests never collide.
import type { Knex } from 'knex';
import { hashPassword } from '../../src/lib/server/auth/password';
import type { Role } from '../../src/lib/roles';

let counter = 0;
const unique = (prefix: string) => `${prefix}-${process.pid}-${Date.now().toString(36)}-${++counter}`;

export const TEST_PASSWORD = 'correct horse battery';
let cachedHash: string | undefined;

export async function makeOrganization(k: Knex, name = unique('org')): Promise<number> {
	const [id] = await k('organizations').insert({ name, slug: name.toLowerCase() });
	return id;
}

export async function makeUser(k: Knex, organizationId: number, role: Role, opts: { password?: string } = {}): Promise<{ id: number; email: string }> {
	const email = `${unique(role)}@example.test`;
	cachedHash ??= await hashPassword(TEST_PASSWORD);
	const hash = opts.password ? await hashPassword(opts.password) : cachedHash;
	const [id] = await k('users').insert({ email, name: `Test ${role}`, password_hash: hash });
	await k('memberships').insert({ user_id: id, organization_id: organizationId, role });
	return { id, email };
}

export interface ProjectTree {
	projectId: number;
	roomId: number;
	sessionId: number;
	positionId: number;
	name: string;
}

/** A project with one room, one session and one position, optionally granted to a client. */
export async function makeProjectTree(k: Knex, organizationId: number, clientUserId?: number): Promise<ProjectTree> {
	const name = unique('project');
	const [projectId] = await k('projects').insert({ organization_id: organizationId, name, client_name: `${name} client` });
	if (clientUserId) await k('project_members').insert({ project_id: projectId, user_id: clientUserId });
	const [roomId] = await k('rooms').insert({ project_id: projectId, name: `${name} room`, length_m: 5, width_m: 4, height_m: 3, room_use: 'listening' });
	const [sessionId] = await k('sessions').insert({ room_id: roomId, condition_label: 'untreated', measured_on: '2026-11-01' });
	const [positionId] = await k('positions').insert({ session_id: sessionId, label: 'P1' });
	return { projectId, roomId, sessionId, positionId, name };
}
