// Accounts: who signs in, with which preferences, and in which organizations.
import type { Knex } from 'knex';
import type { Membership, SessionUser } from '../auth/access';

export interface AccountRow {
	id: number;
	email: string;
	name: string;
	passwordHash: string | null;
	sessionVersion: number;
}

export async function findAccount(k: Knex, email: string): Promise<AccountRow | undefined> {
	return k('users').where({ email }).first({ id: 'id', email: 'email', name: 'name', passwordHash: 'password_hash', sessionVersion: 'session_version' });
}

export async function getUser(k: Knex, id: number): Promise<SessionUser | undefined> {
	return k('users').where({ id }).first({ id: 'id', email: 'email', name: 'name', unitSystem: 'unit_system' });
}

/** The user's organizations with their role in each, by organization name. */
export async function listMemberships(k: Knex, userId: number): Promise<Membership[]> {
	return k('memberships as m')
		.join('organizations as o', 'o.id', 'm.organization_id')
		.where('m.user_id', userId)
		.orderBy('o.name')
		.select({ organizationId: 'm.organization_id', organizationName: 'o.name', role: 'm.role' });
}

export async function createUser(k: Knex, u: { email: string; name: string; passwordHash: string }): Promise<number> {
	const [id] = await k('users').insert({ email: u.email, name: u.name, password_hash: u.passwordHash });
	return id;
}

/** Set a new password; every session of the account ends with it (its session version moves on). */
export async function setPasswordHash(k: Knex, userId: number, passwordHash: string): Promise<void> {
	await k('users').where({ id: userId }).update({ password_hash: passwordHash, session_version: k.raw('session_version + 1') });
}

export async function setUnitSystem(k: Knex, userId: number, unitSystem: SessionUser['unitSystem']): Promise<void> {
	await k('users').where({ id: userId }).update({ unit_system: unitSystem });
}
