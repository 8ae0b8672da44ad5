import { describe, expect, it } from 'vitest';
import { PERMISSIONS, ROLE_LABELS, ROLES, roleAllows, roleNeedsProjectMembership, type Permission, type Role } from '../../src/lib/roles';

// The policy, worked out from what each role does in the product (README and the design of the
// practice): the admin runs the practice, the acoustician measures, the consultant advises, the
// client reads the published results of their own projects. Each permission names who needs it
// and why; nothing here is read from the table under test.
const STAFF: Role[] = ['admin', 'acoustician', 'consultant'];
const POLICY: Record<Permission, { roles: Role[]; why: string }> = {
	'project:read': { roles: ['admin', 'acoustician', 'consultant', 'client'], why: 'everyone reads a project; a client only their own' },
	'project:internal': { roles: STAFF, why: 'drafts, quality flags, captures and jobs are the practice’s working material, not the client’s' },
	'project:create': { roles: ['admin', 'acoustician'], why: 'the practice opens an engagement; the acoustician sets up the rooms to measure; the consultant advises on existing ones' },
	'project:edit': {
		roles: STAFF,
		why: 'the acoustician enters rooms, visits and positions; the consultant sets what a room is used for, which sets its target'
	},
	'capture:write': { roles: ['admin', 'acoustician'], why: 'uploading and re-running captures is measuring' },
	'review:write': {
		roles: STAFF,
		why: 'the consultant marks problem bands and writes the advice; the acoustician marks what the captures show while checking them'
	},
	'report:publish': { roles: ['admin', 'consultant'], why: 'the advice goes to the client from the one who gives it' },
	'members:manage': { roles: ['admin'], why: 'inviting people and assigning roles is running the practice' }
};

describe('role rules', () => {
	it('the policy above covers every permission there is', () => {
		expect([...PERMISSIONS].sort()).toEqual(Object.keys(POLICY).sort());
		expect([...ROLES].sort()).toEqual(['acoustician', 'admin', 'client', 'consultant']);
	});

	for (const [permission, { roles, why }] of Object.entries(POLICY) as [Permission, { roles: Role[]; why: string }][]) {
		for (const role of ROLES) {
			const allowed = roles.includes(role);
			it(`${role} ${allowed ? 'may' : 'may not'} ${permission} (${why})`, () => {
				expect(roleAllows(role, permission)).toBe(allowed);
			});
		}
	}

	it('the admin may do everything', () => {
		for (const permission of PERMISSIONS) expect(roleAllows('admin', permission)).toBe(true);
	});

	it('only clients are limited to the projects they belong to', () => {
		expect(ROLES.filter(roleNeedsProjectMembership)).toEqual(['client']);
	});

	it('names each role in words for the people and invitation pages', () => {
		expect(ROLE_LABELS).toEqual({ admin: 'Admin', acoustician: 'Acoustician', consultant: 'Consultant', client: 'Client' });
	});
});
