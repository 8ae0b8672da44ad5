import { describe, expect, it } from 'vitest';
import { PERMISSIONS, ROLES, roleAllows, roleNeedsProjectMembership, type Permission, type Role } from '../../src/lib/roles';

// The intended grants, written out independently of the implementation's table.
const expected: Record<Role, Permission[]> = {
	admin: [...PERMISSIONS],
	acoustician: ['project:read', 'project:internal', 'project:create', 'project:edit', 'capture:write', 'review:write'],
	consultant: ['project:read', 'project:internal', 'project:edit', 'review:write', 'report:publish'],
	client: ['project:read']
};

describe('role rules', () => {
	for (const role of ROLES) {
		for (const permission of PERMISSIONS) {
			const allowed = expected[role].includes(permission);
			it(`${role} ${allowed ? 'may' : 'may not'} ${permission}`, () => {
				expect(roleAllows(role, permission)).toBe(allowed);
			});
		}
	}

	it('only clients are limited to the projects they belong to', () => {
		expect(ROLES.filter(roleNeedsProjectMembership)).toEqual(['client']);
	});

	it('a client can neither upload nor publish nor manage people', () => {
		for (const p of ['capture:write', 'report:publish', 'members:manage', 'project:internal'] as const) expect(roleAllows('client', p)).toBe(false);
	});
});
