// People of an organization and their roles.
import type { Knex } from 'knex';
import type { Role } from '../../roles';

export interface MemberRow {
	userId: number;
	name: string;
	email: string;
	role: Role;
	since: Date;
}

export async function listMembers(k: Knex, organizationId: number): Promise<MemberRow[]> {
	return k('memberships as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.organization_id', organizationId)
		.orderBy('u.name')
		.select({ userId: 'u.id', name: 'u.name', email: 'u.email', role: 'm.role', since: 'm.created_at' });
}

/** The member with this address and their role, if they belong to the organization. */
export async function findMemberByEmail(k: Knex, organizationId: number, email: string): Promise<{ userId: number; role: Role } | undefined> {
	return k('memberships as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where({ 'u.email': email, 'm.organization_id': organizationId })
		.first({ userId: 'u.id', role: 'm.role' });
}

/** A member's role, locked until the transaction ends (so two changes cannot both remove the last admin). */
export async function lockMemberRole(trx: Knex.Transaction, organizationId: number, userId: number): Promise<Role | undefined> {
	const r = await trx('memberships').where({ organization_id: organizationId, user_id: userId }).forUpdate().first('role');
	return r?.role;
}

export async function setRole(k: Knex, organizationId: number, userId: number, role: Role): Promise<boolean> {
	const n = await k('memberships').where({ organization_id: organizationId, user_id: userId }).update({ role });
	return n > 0;
}

export async function countAdmins(k: Knex, organizationId: number): Promise<number> {
	const r = await k('memberships').where({ organization_id: organizationId, role: 'admin' }).count({ n: '*' }).first();
	return Number(r?.n ?? 0);
}

/** Make the user a member with this role; a membership they already have is kept as it is. */
export async function addMembership(k: Knex, m: { userId: number; organizationId: number; role: Role }): Promise<void> {
	await k('memberships').insert({ user_id: m.userId, organization_id: m.organizationId, role: m.role }).onConflict(['user_id', 'organization_id']).ignore();
}

/** Remove the membership, and the person's access as a client to the organization's projects. */
export async function removeMembership(k: Knex, organizationId: number, userId: number): Promise<void> {
	await k('project_members')
		.where({ user_id: userId })
		.whereIn('project_id', k('projects').where({ organization_id: organizationId }).select('id'))
		.delete();
	await k('memberships').where({ organization_id: organizationId, user_id: userId }).delete();
}
