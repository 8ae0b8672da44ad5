// Who may do what. Pure rules, shared by the server's access helper and the UI (to hide
// controls a role cannot use — the server still checks every request).
export const ROLES = ['admin', 'acoustician', 'consultant', 'client'] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = [
	'project:read', // see a project, its rooms, sessions and published results
	'project:internal', // see drafts, raw quality flags, captures and jobs
	'project:create', // create projects
	'project:edit', // edit projects, rooms and sessions
	'capture:write', // upload, relabel, delete and re-run captures; sweep definitions
	'review:write', // comparisons, problem bands, advice, targets, treatment plans
	'report:publish', // publish a comparison as a client report
	'members:manage' // invite people, change roles, grant client access
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const GRANTS: Record<Role, readonly Permission[]> = {
	admin: PERMISSIONS,
	acoustician: ['project:read', 'project:internal', 'project:create', 'project:edit', 'capture:write', 'review:write'],
	consultant: ['project:read', 'project:internal', 'project:edit', 'review:write', 'report:publish'],
	client: ['project:read']
};

export function roleAllows(role: Role, permission: Permission): boolean {
	return GRANTS[role].includes(permission);
}

/** Clients reach only the projects they are members of; staff reach every project of their organization. */
export function roleNeedsProjectMembership(role: Role): boolean {
	return role === 'client';
}

export const ROLE_LABELS: Record<Role, string> = {
	admin: 'Admin',
	acoustician: 'Acoustician',
	consultant: 'Consultant',
	client: 'Client'
};

/**
 * What a personal API token may do: each scope opens a set of permissions, and a token's request
 * needs both its user's role and one of its scopes to allow a permission. No scope opens creating
 * projects, editing projects, rooms and visits, or managing people: those stay in the browser.
 */
export const TOKEN_SCOPES = ['read', 'upload', 'review'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

const SCOPE_GRANTS: Record<TokenScope, readonly Permission[]> = {
	read: ['project:read', 'project:internal'],
	upload: ['capture:write'],
	review: ['review:write', 'report:publish']
};

export function scopesAllow(scopes: readonly TokenScope[], permission: Permission): boolean {
	return scopes.some((s) => SCOPE_GRANTS[s].includes(permission));
}

export const SCOPE_LABELS: Record<TokenScope, string> = {
	read: 'Read projects, visits, captures and results',
	upload: 'Upload, relabel, delete and re-run captures',
	review: 'Comparisons, problem bands, plans and publishing'
};
