import { error, redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { formFail, parseForm } from '$lib/server/forms';
import { getProject, listProjectClients, addProjectClient } from '$lib/server/queries/projects';
import { createRoom, listRooms } from '$lib/server/queries/rooms';
import { recordAudit } from '$lib/server/audit';
import { transaction } from '$lib/server/transaction';
import { projectMemberSchema, roomSchema } from '$lib/schemas/projects';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params }) => {
	const projectId = Number(params.projectId);
	const scope = await authorize(locals, 'project:read', { projectId });
	const k = db();
	const project = await getProject(k, projectId);
	if (!project) error(404, 'Not found.');
	const staff = roleAllows(scope.role, 'project:internal');
	return {
		project,
		rooms: await listRooms(k, projectId),
		clients: staff ? await listProjectClients(k, projectId) : [],
		can: {
			editRooms: roleAllows(scope.role, 'project:edit'),
			manageMembers: roleAllows(scope.role, 'members:manage')
		}
	};
}) satisfies PageServerLoad;

export const actions = {
	createRoom: async ({ locals, params, request }) => {
		const projectId = Number(params.projectId);
		const scope = await authorize(locals, 'project:edit', { projectId });
		const parsed = parseForm(roomSchema, await request.formData());
		if (!parsed.ok) return parsed.failure;
		const id = await transaction(async (trx) => {
			const id = await createRoom(trx, projectId, parsed.data);
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'room.created', entityType: 'room', entityId: id });
			return id;
		});
		redirect(303, `/rooms/${id}`);
	},

	addClient: async ({ locals, params, request }) => {
		const projectId = Number(params.projectId);
		const scope = await authorize(locals, 'members:manage', { projectId });
		const form = await request.formData();
		const parsed = parseForm(projectMemberSchema, form);
		if (!parsed.ok) return parsed.failure;
		const k = db();
		const user = await k('users as u')
			.join('memberships as m', 'm.user_id', 'u.id')
			.where({ 'u.email': parsed.data.email, 'm.organization_id': scope.organizationId, 'm.role': 'client' })
			.first('u.id');
		if (!user) {
			return formFail(400, form, 'No client of this organization has that address. Invite them from People first.', {
				email: 'Not a client of this organization.'
			});
		}
		await transaction(async (trx) => {
			await addProjectClient(trx, projectId, user.id);
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'project.client_added', entityType: 'project', entityId: projectId, details: { userId: user.id } });
		});
		return { clientAdded: true };
	}
} satisfies Actions;
