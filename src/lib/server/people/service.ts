// People: an organization's members and invitations, joining by invitation, resetting a
// password, and a user's own preferences. Changes run in one transaction with their audit
// record and the mail they send.
import type { z } from 'zod';
import { audit } from '../audit';
import { config } from '../config';
import { db } from '../db';
import { enqueueMail } from '../mail';
import { invitationMail, passwordResetMail } from '../messages';
import { conflict, invalid, notFound, Problem } from '../problem';
import { transaction } from '../transaction';
import { hashPassword } from '../auth/password';
import { clearBucket, takeAttempts } from '../auth/rate-limit';
import { raiseSessionVersion } from '../queries/auth-sessions';
import { formatWait } from '../../format';
import type { Scope, SessionUser } from '../auth/access';
import { getOrganization } from '../queries/organizations';
import { addMembership, countAdmins, findMemberByEmail, listMembers, lockMemberRole, removeMembership, setRole } from '../queries/members';
import { addProjectClient, isProjectOf, listProjectNames } from '../queries/projects';
import { claimInvitation, claimPasswordReset, createInvitation, createPasswordReset, findUsableInvitation, findUsableReset, listPendingInvitations } from '../queries/tokens';
import { createUser, findAccount, getUser, setPasswordHash, setUnitSystem } from '../queries/users';
import type { invitationSchema, roleChangeSchema } from '../../schemas/projects';

type InvitationInput = z.output<typeof invitationSchema>;
type RoleChange = z.output<typeof roleChangeSchema>;

const linkTo = (path: string) => `${config().PUBLIC_BASE_URL}${path}`;

/** What the people page shows: members, open invitations, and the projects a client can be invited to. */
export async function organizationOverview(organizationId: number) {
	const k = db();
	const [organization, members, invitations, projects] = await Promise.all([
		getOrganization(k, organizationId),
		listMembers(k, organizationId),
		listPendingInvitations(k, organizationId),
		listProjectNames(k, organizationId)
	]);
	return { organization: organization!, members, invitations, projects };
}

/** Invite someone by e-mail: the invitation, its mail and the audit record in one transaction. */
export async function invite(scope: Scope, input: InvitationInput): Promise<void> {
	await transaction(async (trx) => {
		if (input.projectId !== null && !(await isProjectOf(trx, input.projectId, scope.organizationId))) {
			throw invalid('Pick a project of this organization.', 'projectId');
		}
		// A member may still be invited as a client, to give them a project to see.
		if ((await findMemberByEmail(trx, scope.organizationId, input.email)) && input.role !== 'client') {
			throw conflict('That person is already a member of this organization.', { field: 'email' });
		}
		const organization = (await getOrganization(trx, scope.organizationId))!;
		const { id, token } = await createInvitation(trx, { organizationId: scope.organizationId, ...input, invitedBy: scope.user.id });
		const mail = invitationMail({ organizationName: organization.name, role: input.role, inviterName: scope.user.name, link: linkTo(`/invitation/${token}`) });
		await enqueueMail(trx, { to: input.email, kind: 'invitation', ...mail });
		await audit(trx, scope, 'invitation.created', 'invitation', id, { email: input.email, role: input.role });
	});
}

/** Change a member's role; the organization keeps at least one admin. */
export async function changeRole(scope: Scope, input: RoleChange): Promise<void> {
	await transaction(async (trx) => {
		const current = await lockMemberRole(trx, scope.organizationId, input.userId);
		if (!current) throw notFound('That person is not a member.');
		if (current === 'admin' && input.role !== 'admin' && (await countAdmins(trx, scope.organizationId)) <= 1) {
			throw conflict('An organization needs at least one admin.');
		}
		await setRole(trx, scope.organizationId, input.userId, input.role);
		await audit(trx, scope, 'membership.role_changed', 'user', input.userId, { from: current, to: input.role });
	});
}

/**
 * Remove someone from the organization: the membership, their client access to its projects,
 * and every session they have (it ends at once, on every server). The organization keeps at
 * least one admin.
 */
export async function removeMember(scope: Scope, userId: number): Promise<void> {
	await transaction(async (trx) => {
		const current = await lockMemberRole(trx, scope.organizationId, userId);
		if (!current) throw notFound('That person is not a member.');
		if (current === 'admin' && (await countAdmins(trx, scope.organizationId)) <= 1) {
			throw conflict('An organization needs at least one admin.');
		}
		await removeMembership(trx, scope.organizationId, userId);
		await raiseSessionVersion(trx, userId);
		await audit(trx, scope, 'membership.removed', 'user', userId, { role: current });
	});
}

export function usableInvitation(token: string) {
	return findUsableInvitation(db(), token);
}

/**
 * Accept an invitation: mark it used (once, even under concurrent requests), create the account
 * or set its new password, add the membership and, for a client, the project. The new user's
 * id, or null when the invitation was used or has expired.
 */
export async function acceptInvitation(token: string, input: { name?: string; password: string }): Promise<number | null> {
	return transaction(async (trx) => {
		const inv = await claimInvitation(trx, token);
		if (!inv) return null;
		const existing = await findAccount(trx, inv.email);
		if (!existing && !input.name) throw invalid('Enter your name.', 'name');
		const passwordHash = await hashPassword(input.password);
		const userId = existing?.id ?? (await createUser(trx, { email: inv.email, name: input.name ?? '', passwordHash }));
		if (existing) await setPasswordHash(trx, userId, passwordHash);
		await addMembership(trx, { userId, organizationId: inv.organizationId, role: inv.role });
		if (inv.projectId !== null) await addProjectClient(trx, inv.projectId, userId);
		await audit(trx, { organizationId: null, user: { id: userId } }, 'invitation.accepted', 'user', userId);
		return userId;
	});
}

/**
 * Mail a reset link if the address has an account; the caller answers the same either way.
 * Limited per address asked for (known or not) and per address asking, counted before anything
 * is looked up, so a flood of requests sends a few mails and says nothing about accounts.
 */
export async function requestPasswordReset(email: string, from: string): Promise<void> {
	const verdict = await takeAttempts(db(), [
		{ name: 'resetAccount', who: email },
		{ name: 'resetAddress', who: from }
	]);
	if (!verdict.allowed) {
		throw new Problem(429, `Too many reset requests. Try again in ${formatWait(verdict.retryAfterMs)}; a link already sent still works.`, { code: 'rate_limited' });
	}
	await transaction(async (trx) => {
		const user = await findAccount(trx, email);
		if (!user) return;
		const token = await createPasswordReset(trx, user.id);
		await enqueueMail(trx, { to: user.email, kind: 'password-reset', ...passwordResetMail({ link: linkTo(`/password/reset/${token}`) }) });
	});
}

export function usableReset(token: string) {
	return findUsableReset(db(), token);
}

/**
 * Set a new password with a reset token; false when the token was used or has expired. Every
 * session of the account ends, and its sign-in lockout is lifted (the mailbox is proven).
 */
export async function resetPassword(token: string, password: string): Promise<boolean> {
	const passwordHash = await hashPassword(password);
	const email = await transaction(async (trx) => {
		const userId = await claimPasswordReset(trx, token);
		if (userId === null) return null;
		await setPasswordHash(trx, userId, passwordHash);
		await audit(trx, { organizationId: null, user: { id: userId } }, 'password.reset', 'user', userId);
		return (await getUser(trx, userId))!.email;
	});
	if (email === null) return false;
	await clearBucket(db(), 'signInAccount', email);
	return true;
}

export async function savePreferences(user: SessionUser, prefs: { unitSystem: SessionUser['unitSystem'] }): Promise<void> {
	await setUnitSystem(db(), user.id, prefs.unitSystem);
}
