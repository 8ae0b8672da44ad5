import type { Knex } from 'knex';
import type { Membership, SessionUser } from './access';
import { getUser, listMemberships } from '../queries/users';

/** Load the signed-in user and their memberships, or null if the account no longer exists. */
export async function loadSessionUser(
	k: Knex,
	userId: number
): Promise<{ user: SessionUser; memberships: Membership[] } | null> {
	const user = await getUser(k, userId);
	if (!user) return null;
	return { user, memberships: await listMemberships(k, userId) };
}
