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
