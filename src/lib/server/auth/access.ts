// The one authorization helper. Every load, action and API route calls `authorize` (or
// `requireUser`) before touching data; nothing is reachable by default.
import { error } from '@sveltejs/kit';
import type { Knex } from 'knex';
import { db } from '../db';
import { findOwner } from '../queries/ownership';
import { isProjectMember } from '../queries/projects';
import { roleAllows, roleNeedsProjectMembership, scopesAllow, type Permission, type Role } from '../../roles';

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
	| { photoId: number }
	| { comparisonId: number }
	| { problemBandId: number }
	| { sweepId: number };

export interface Scope {
	organizationId: number;
	projectId: number | null;
	role: Role;
	user: SessionUser;
}

export function requireUser(locals: App.Locals): SessionUser {
	if (!locals.user) error(401, 'Sign in to continue.');
	return locals.user;
}

/**
 * Check that the signed-in user may do `permission` on `target`. Throws 401 when signed out,
 * 404 when the target does not exist or lies outside the user's reach (so its existence is
 * not revealed), 403 when the user can see it but their role — or, for a request with an API
 * token, the token's scopes — may not do this.
 */
export async function authorize(
	locals: App.Locals,
	permission: Permission,
	target: Target,
	k: Knex = db()
): Promise<Scope> {
	const user = requireUser(locals);
	const owner = await findOwner(k, target);
	if (!owner) error(404, 'Not found.');
	const membership = locals.memberships.find((m) => m.organizationId === owner.organizationId);
	if (!membership) error(404, 'Not found.');
	const role = membership.role;

	if (roleNeedsProjectMembership(role)) {
		// A client reaches only their own projects; an organization-wide target is beyond them.
		if (owner.projectId === null) error(404, 'Not found.');
		if (!(await isProjectMember(k, owner.projectId, user.id))) error(404, 'Not found.');
	}
	if (!roleAllows(role, permission)) error(403, 'Your role does not allow this.');
	// A request with an API token does what the role allows and the token's scopes allow, no more.
	if (locals.apiToken && !scopesAllow(locals.apiToken.scopes, permission)) error(403, 'This API token’s scopes do not allow this.');
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
