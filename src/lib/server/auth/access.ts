// The one authorization helper. Every load, action and API route calls `authorize` (or
// `requireUser`) before touching data; nothing is reachable by default.
import { error } from '@sveltejs/kit';
import type { Knex } from 'knex';
import { db } from '../db';
import { roleAllows, roleNeedsProjectMembership, type Permission, type Role } from '../../roles';

export interface SessionUser {
	id: number;
	email: string;
	name: string;
	unitSystem: 'metric' | 'imperial';
}

export interface Membership {
	organizationId: number;
	organizationName: string;
	role: Role;
}

export type Target =
	| { organizationId: number }
	| { projectId: number }
	| { roomId: number }
	| { sessionId: number }
	| { positionId: number }
	| { captureId: number }
	| { comparisonId: number }
	| { problemBandId: number }
	| { sweepId: number };

export interface Scope {
	organizationId: number;
	projectId: number | null;
	role: Role;
	user: SessionUser;
}

interface Owner {
	organizationId: number;
	projectId: number | null;
}

// How each kind of row reaches its project: the tables from the row up to its room, each
// joined to the next through the foreign key named in PARENT_KEY.
const CHAINS = {
	roomId: ['rooms'],
	sessionId: ['sessions', 'rooms'],
	positionId: ['positions', 'sessions', 'rooms'],
	captureId: ['captures', 'sessions', 'rooms'],
	comparisonId: ['comparisons', 'rooms'],
	problemBandId: ['problem_bands', 'rooms']
} as const;
const PARENT_KEY: Record<string, string> = {
	positions: 'session_id',
	captures: 'session_id',
	sessions: 'room_id',
	comparisons: 'room_id',
	problem_bands: 'room_id',
	rooms: 'project_id'
};

/** Find the organization (and project) that owns a target, or null if it does not exist. */
async function ownerOf(k: Knex, target: Target): Promise<Owner | null> {
	if ('organizationId' in target) {
		const org = await k('organizations').where({ id: target.organizationId }).first('id');
		return org ? { organizationId: org.id, projectId: null } : null;
	}
	if ('sweepId' in target) {
		const sweep = await k('sweep_definitions').where({ id: target.sweepId }).first('organization_id');
		return sweep ? { organizationId: sweep.organization_id, projectId: null } : null;
	}
	let q: Knex.QueryBuilder;
	if ('projectId' in target) {
		q = k('projects as p').where('p.id', target.projectId);
	} else {
		const key = Object.keys(target)[0] as keyof typeof CHAINS;
		const chain = CHAINS[key];
		q = k(`${chain[0]} as t0`).where('t0.id', (target as Record<string, number>)[key]);
		chain.slice(1).forEach((table, i) => q.join(`${table} as t${i + 1}`, `t${i + 1}.id`, `t${i}.${PARENT_KEY[chain[i]]}`));
		q.join('projects as p', 'p.id', `t${chain.length - 1}.${PARENT_KEY.rooms}`);
	}
	const row = (await q.first({ organizationId: 'p.organization_id', projectId: 'p.id' })) as Owner | undefined;
	return row ?? null;
}

export function requireUser(locals: App.Locals): SessionUser {
	if (!locals.user) error(401, 'Sign in to continue.');
	return locals.user;
}

/**
 * Check that the signed-in user may do `permission` on `target`. Throws 401 when signed out,
 * 404 when the target does not exist or lies outside the user's reach (so its existence is
 * not revealed), 403 when the user can see it but their role may not do this.
 */
export async function authorize(
	locals: App.Locals,
	permission: Permission,
	target: Target,
	k: Knex = db()
): Promise<Scope> {
	const user = requireUser(locals);
	const owner = await ownerOf(k, target);
	if (!owner) error(404, 'Not found.');
	const membership = locals.memberships.find((m) => m.organizationId === owner.organizationId);
	if (!membership) error(404, 'Not found.');
	const role = membership.role;

	if (roleNeedsProjectMembership(role)) {
		// A client reaches only their own projects; an organization-wide target is beyond them.
		if (owner.projectId === null) error(404, 'Not found.');
		const member = await k('project_members').where({ project_id: owner.projectId, user_id: user.id }).first('id');
		if (!member) error(404, 'Not found.');
	}
	if (!roleAllows(role, permission)) error(403, 'Your role does not allow this.');
	return { organizationId: owner.organizationId, projectId: owner.projectId, role, user };
}

/** The user's role in an organization, or null. */
export function roleIn(locals: App.Locals, organizationId: number): Role | null {
	return locals.memberships.find((m) => m.organizationId === organizationId)?.role ?? null;
}

/** Memberships in which the user's role allows a permission (for lists and menus). */
export function membershipsAllowing(locals: App.Locals, permission: Permission): Membership[] {
	return locals.memberships.filter((m) => roleAllows(m.role, permission));
}
