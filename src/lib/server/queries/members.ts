import type { Knex } from 'knex';
import type { Role } from '../../roles';
import { hashToken, newToken } from '../auth/tokens';
import { hashPassword } from '../auth/password';

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

export async function setRole(k: Knex, organizationId: number, userId: number, role: Role): Promise<boolean> {
	const n = await k('memberships').where({ organization_id: organizationId, user_id: userId }).update({ role });
	return n > 0;
}

export async function countAdmins(k: Knex, organizationId: number): Promise<number> {
	const r = await k('memberships').where({ organization_id: organizationId, role: 'admin' }).count({ n: '*' }).first();
	return Number(r?.n ?? 0);
}

export const INVITATION_DAYS = 7;
export const RESET_HOURS = 2;

export interface PendingInvitation {
	id: number;
	email: string;
	role: Role;
	projectId: number | null;
	projectName: string | null;
	expiresAt: Date;
}

export async function listPendingInvitations(k: Knex, organizationId: number): Promise<PendingInvitation[]> {
	return k('invitations as i')
		.leftJoin('projects as p', 'p.id', 'i.project_id')
		.where('i.organization_id', organizationId)
		.whereNull('i.accepted_at')
		.where('i.expires_at', '>', new Date())
		.orderBy('i.created_at', 'desc')
		.select({ id: 'i.id', email: 'i.email', role: 'i.role', projectId: 'i.project_id', projectName: 'p.name', expiresAt: 'i.expires_at' });
}

export async function createInvitation(
	k: Knex,
	inv: { organizationId: number; email: string; role: Role; projectId: number | null; invitedBy: number },
	now = new Date()
): Promise<{ id: number; token: string }> {
	const { token, tokenHash } = newToken();
	const [id] = await k('invitations').insert({
		organization_id: inv.organizationId,
		email: inv.email,
		role: inv.role,
		project_id: inv.projectId,
		token_hash: tokenHash,
		expires_at: new Date(now.getTime() + INVITATION_DAYS * 86400_000),
		invited_by: inv.invitedBy
	});
	return { id, token };
}

export interface InvitationView {
	id: number;
	organizationId: number;
	organizationName: string;
	email: string;
	role: Role;
	projectId: number | null;
	existingUser: boolean;
}

/** A usable invitation for a raw token: not accepted, not expired. */
export async function findUsableInvitation(k: Knex, token: string, now = new Date()): Promise<InvitationView | null> {
	const r = await k('invitations as i')
		.join('organizations as o', 'o.id', 'i.organization_id')
		.where('i.token_hash', hashToken(token))
		.whereNull('i.accepted_at')
		.where('i.expires_at', '>', now)
		.first({
			id: 'i.id',
			organizationId: 'i.organization_id',
			organizationName: 'o.name',
			email: 'i.email',
			role: 'i.role',
			projectId: 'i.project_id'
		});
	if (!r) return null;
	const user = await k('users').where({ email: r.email }).first('id');
	return { ...r, existingUser: Boolean(user) };
}

/**
 * Accept an invitation in one transaction: mark it used (only if still unused, so a token
 * works once even under concurrent requests), create or update the user, add the membership
 * and, for a client, the project access.
 */
export async function acceptInvitation(
	trx: Knex.Transaction,
	token: string,
	input: { name: string; password: string },
	now = new Date()
): Promise<{ userId: number; email: string } | null> {
	const inv = await trx('invitations')
		.where({ token_hash: hashToken(token) })
		.whereNull('accepted_at')
		.where('expires_at', '>', now)
		.forUpdate()
		.first();
	if (!inv) return null;
	await trx('invitations').where({ id: inv.id }).update({ accepted_at: now });

	const passwordHash = await hashPassword(input.password);
	const existing = await trx('users').where({ email: inv.email }).first('id');
	let userId: number;
	if (existing) {
		userId = existing.id;
		await trx('users').where({ id: userId }).update({ password_hash: passwordHash });
	} else {
		[userId] = await trx('users').insert({ email: inv.email, name: input.name, password_hash: passwordHash });
	}
	const membership = await trx('memberships').where({ user_id: userId, organization_id: inv.organization_id }).first('id');
	if (!membership) await trx('memberships').insert({ user_id: userId, organization_id: inv.organization_id, role: inv.role });
	if (inv.project_id) {
		await trx('project_members').insert({ project_id: inv.project_id, user_id: userId }).onConflict(['project_id', 'user_id']).ignore();
	}
	return { userId, email: inv.email };
}

export async function createPasswordReset(k: Knex, userId: number, now = new Date()): Promise<string> {
	const { token, tokenHash } = newToken();
	await k('password_resets').insert({
		user_id: userId,
		token_hash: tokenHash,
		expires_at: new Date(now.getTime() + RESET_HOURS * 3600_000)
	});
	return token;
}

export async function findUsableReset(k: Knex, token: string, now = new Date()): Promise<{ userId: number; email: string } | null> {
	const r = await k('password_resets as pr')
		.join('users as u', 'u.id', 'pr.user_id')
		.where('pr.token_hash', hashToken(token))
		.whereNull('pr.used_at')
		.where('pr.expires_at', '>', now)
		.first({ userId: 'u.id', email: 'u.email' });
	return r ?? null;
}

/** Use a reset token once: set the new password and retire every open reset of that user. */
export async function usePasswordReset(trx: Knex.Transaction, token: string, password: string, now = new Date()): Promise<number | null> {
	const r = await trx('password_resets')
		.where({ token_hash: hashToken(token) })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.forUpdate()
		.first();
	if (!r) return null;
	await trx('password_resets').where({ user_id: r.user_id }).whereNull('used_at').update({ used_at: now });
	await trx('users').where({ id: r.user_id }).update({ password_hash: await hashPassword(password) });
	return r.user_id;
}
