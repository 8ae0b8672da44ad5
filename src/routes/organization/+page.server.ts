import { error } from '@sveltejs/kit';
import { authorize, membershipsAllowing } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { formFail, parseForm } from '$lib/server/forms';
import { countAdmins, createInvitation, listMembers, listPendingInvitations, setRole } from '$lib/server/queries/members';
import { enqueueMail } from '$lib/server/mail';
import { invitationMail } from '$lib/server/messages';
import { config } from '$lib/server/config';
import { recordAudit } from '$lib/server/audit';
import { transaction } from '$lib/server/transaction';
import { invitationSchema, roleChangeSchema } from '$lib/schemas/projects';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/** The organization being managed: ?org=ID, else the first one the user administers. */
function organizationOf(event: RequestEvent | Parameters<PageServerLoad>[0]): number {
	const fromQuery = Number(event.url.searchParams.get('org'));
	if (Number.isInteger(fromQuery) && fromQuery > 0) return fromQuery;
	const first = membershipsAllowing(event.locals, 'members:manage')[0];
	if (!first) error(403, 'Only an admin can manage people.');
	return first.organizationId;
}

export const load = (async (event) => {
	const organizationId = organizationOf(event);
	await authorize(event.locals, 'members:manage', { organizationId });
	const k = db();
	const organization = await k('organizations').where({ id: organizationId }).first('id', 'name');
	return {
		organization,
		members: await listMembers(k, organizationId),
		invitations: await listPendingInvitations(k, organizationId),
		projects: await k('projects').where({ organization_id: organizationId }).orderBy('name').select('id', 'name')
	};
}) satisfies PageServerLoad;

export const actions = {
	invite: async (event) => {
		const organizationId = organizationOf(event);
		const scope = await authorize(event.locals, 'members:manage', { organizationId });
		const form = await event.request.formData();
		const parsed = parseForm(invitationSchema, form);
		if (!parsed.ok) return parsed.failure;
		const k = db();
		if (parsed.data.projectId !== null) {
			const project = await k('projects').where({ id: parsed.data.projectId, organization_id: organizationId }).first('id');
			if (!project) return formFail(400, form, 'Pick a project of this organization.', { projectId: 'Pick a project of this organization.' });
		}
		const already = await k('memberships as m')
			.join('users as u', 'u.id', 'm.user_id')
			.where({ 'u.email': parsed.data.email, 'm.organization_id': organizationId })
			.first('m.id');
		if (already && parsed.data.role !== 'client') {
			return formFail(409, form, 'That person is already a member.', { email: 'Already a member of this organization.' });
		}
		const org = await k('organizations').where({ id: organizationId }).first('name');
		await transaction(async (trx) => {
			const { id, token } = await createInvitation(trx, { organizationId, ...parsed.data, invitedBy: scope.user.id });
			const mail = invitationMail({
				organizationName: org.name,
				role: parsed.data.role,
				inviterName: scope.user.name,
				link: `${config().PUBLIC_BASE_URL}/invitation/${token}`
			});
			await enqueueMail(trx, { to: parsed.data.email, kind: 'invitation', ...mail });
			await recordAudit(trx, { organizationId, userId: scope.user.id, action: 'invitation.created', entityType: 'invitation', entityId: id, details: { email: parsed.data.email, role: parsed.data.role } });
		});
		return { invited: parsed.data.email };
	},

	setRole: async (event) => {
		const organizationId = organizationOf(event);
		const scope = await authorize(event.locals, 'members:manage', { organizationId });
		const form = await event.request.formData();
		const parsed = parseForm(roleChangeSchema, form);
		if (!parsed.ok) return parsed.failure;
		const result = await transaction(async (trx) => {
			const current = await trx('memberships').where({ organization_id: organizationId, user_id: parsed.data.userId }).forUpdate().first('role');
			if (!current) return 'missing' as const;
			if (current.role === 'admin' && parsed.data.role !== 'admin' && (await countAdmins(trx, organizationId)) <= 1) return 'last-admin' as const;
			await setRole(trx, organizationId, parsed.data.userId, parsed.data.role);
			await recordAudit(trx, { organizationId, userId: scope.user.id, action: 'membership.role_changed', entityType: 'user', entityId: parsed.data.userId, details: { from: current.role, to: parsed.data.role } });
			return 'ok' as const;
		});
		if (result === 'missing') return formFail(404, form, 'That person is not a member.');
		if (result === 'last-admin') return formFail(409, form, 'An organization needs at least one admin.');
		return { roleChanged: true };
	}
} satisfies Actions;
