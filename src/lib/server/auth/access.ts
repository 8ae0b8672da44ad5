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

/** Find the organization (and project) that owns a target, or null if it does not exist. */
async function ownerOf(k: Knex, target: Target): Promise<Owner | null> {
	const viaProject = (q: Knex.QueryBuilder) =>
		q.first({ organizationId: 'p.organization_id', projectId: 'p.id' }) as Promise<Owner | undefined>;
	let row: Owner | undefined;
	if ('organizationId' in target) {
		const org = await k('organizations').where({ id: target.organizationId }).first('id');
		return org ? { organizationId: org.id, projectId: null } : null;
	} else if ('projectId' in target) {
		row = await viaProject(k('projects as p').where('p.id', target.projectId));
	} else if ('roomId' in target) {
		row = await viaProject(k('rooms as r').join('projects as p', 'p.id', 'r.project_id').where('r.id', target.roomId));
	} else if ('sessionId' in target) {
		row = await viaProject(
			k('sessions as s')
				.join('rooms as r', 'r.id', 's.room_id')
				.join('projects as p', 'p.id', 'r.project_id')
				.where('s.id', target.sessionId)
		);
	} else if ('positionId' in target) {
		row = await viaProject(
			k('positions as po')
				.join('sessions as s', 's.id', 'po.session_id')
				.join('rooms as r', 'r.id', 's.room_id')
				.join('projects as p', 'p.id', 'r.project_id')
				.where('po.id', target.positionId)
		);
	} else if ('captureId' in target) {
		row = await viaProject(
			k('captures as c')
				.join('sessions as s', 's.id', 'c.session_id')
				.join('rooms as r', 'r.id', 's.room_id')
				.join('projects as p', 'p.id', 'r.project_id')
				.where('c.id', target.captureId)
		);
	} else if ('comparisonId' in target) {
		row = await viaProject(
			k('comparisons as cm')
				.join('rooms as r', 'r.id', 'cm.room_id')
				.join('projects as p', 'p.id', 'r.project_id')
				.where('cm.id', target.comparisonId)
		);
	} else if ('problemBandId' in target) {
		row = await viaProject(
			k('problem_bands as pb')
				.join('rooms as r', 'r.id', 'pb.room_id')
				.join('projects as p', 'p.id', 'r.project_id')
				.where('pb.id', target.problemBandId)
		);
	} else if ('sweepId' in target) {
		const sweep = await k('sweep_definitions').where({ id: target.sweepId }).first('organization_id');
		return sweep ? { organizationId: sweep.organization_id, projectId: null } : null;
	}
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
