// One-time links: invitations and password resets. Only a token's hash is stored; a token is
// claimed once, under a row lock, so concurrent requests cannot both use it.
import type { Knex } from 'knex';
import type { Role } from '../../roles';
import { hashToken, newToken } from '../auth/tokens';
import { findAccount } from './users';

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
	return { ...r, existingUser: Boolean(await findAccount(k, r.email)) };
}

export interface ClaimedInvitation {
	id: number;
	organizationId: number;
	email: string;
	role: Role;
	projectId: number | null;
}

/** Mark a usable invitation accepted and return it; null when it was used or has expired. */
export async function claimInvitation(trx: Knex.Transaction, token: string, now = new Date()): Promise<ClaimedInvitation | null> {
	const inv = await trx('invitations')
		.where({ token_hash: hashToken(token) })
		.whereNull('accepted_at')
		.where('expires_at', '>', now)
		.forUpdate()
		.first({ id: 'id', organizationId: 'organization_id', email: 'email', role: 'role', projectId: 'project_id' });
	if (!inv) return null;
	await trx('invitations').where({ id: inv.id }).update({ accepted_at: now });
	return inv;
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

/** Use a reset token once, retiring every open reset of its user; the user's id, or null. */
export async function claimPasswordReset(trx: Knex.Transaction, token: string, now = new Date()): Promise<number | null> {
	const r = await trx('password_resets')
		.where({ token_hash: hashToken(token) })
		.whereNull('used_at')
		.where('expires_at', '>', now)
		.forUpdate()
		.first('user_id');
	if (!r) return null;
	await trx('password_resets').where({ user_id: r.user_id }).whereNull('used_at').update({ used_at: now });
	return r.user_id;
}
