import type { Knex } from 'knex';
import type { Membership, SessionUser } from './access';

/** Load the signed-in user and their memberships, or null if the account no longer exists. */
export async function loadSessionUser(
	k: Knex,
	userId: number
): Promise<{ user: SessionUser; memberships: Membership[] } | null> {
	const row = await k('users').where({ id: userId }).first('id', 'email', 'name', 'unit_system');
	if (!row) return null;
	const memberships = await k('memberships as m')
		.join('organizations as o', 'o.id', 'm.organization_id')
		.where('m.user_id', userId)
		.orderBy('o.name')
		.select({ organizationId: 'm.organization_id', organizationName: 'o.name', role: 'm.role' });
	return {
		user: { id: row.id, email: row.email, name: row.name, unitSystem: row.unit_system },
		memberships
	};
}
