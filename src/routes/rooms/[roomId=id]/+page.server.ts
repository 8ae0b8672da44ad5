import { error, redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import { getProject } from '$lib/server/queries/projects';
import { getRoom, updateRoom } from '$lib/server/queries/rooms';
import { createSession, listSessions } from '$lib/server/queries/sessions';
import { recordAudit } from '$lib/server/audit';
import { transaction } from '$lib/server/transaction';
import { roomSchema, sessionSchema } from '$lib/schemas/projects';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:read', { roomId });
	const k = db();
	const room = await getRoom(k, roomId);
	if (!room) error(404, 'Not found.');
	const project = await getProject(k, room.projectId);
	return {
		room,
		project: { id: project!.id, name: project!.name },
		sessions: await listSessions(k, roomId),
		can: { edit: roleAllows(scope.role, 'project:edit') }
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'project:edit', { roomId });
		const parsed = parseForm(roomSchema, await request.formData());
		if (!parsed.ok) return parsed.failure;
		await transaction(async (trx) => {
			await updateRoom(trx, roomId, parsed.data);
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'room.updated', entityType: 'room', entityId: roomId });
		});
		return { updated: true };
	},

	createSession: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'project:edit', { roomId });
		const parsed = parseForm(sessionSchema, await request.formData());
		if (!parsed.ok) return parsed.failure;
		const id = await transaction(async (trx) => {
			const id = await createSession(trx, roomId, { ...parsed.data, acousticianId: scope.role === 'acoustician' ? scope.user.id : null });
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'session.created', entityType: 'session', entityId: id });
			return id;
		});
		redirect(303, `/sessions/${id}`);
	}
} satisfies Actions;
