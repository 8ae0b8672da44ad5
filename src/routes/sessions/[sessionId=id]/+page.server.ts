import { error, redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { formFail, parseForm, problemToFailure } from '$lib/server/forms';
import { getRoom } from '$lib/server/queries/rooms';
import { getSession } from '$lib/server/queries/sessions';
import { checkPositionInRoom, createPosition, listPositions } from '$lib/server/queries/positions';
import { getProject } from '$lib/server/queries/projects';
import { recordAudit } from '$lib/server/audit';
import { mapDbErrors } from '$lib/server/db-errors';
import { transaction } from '$lib/server/transaction';
import { positionSchema } from '$lib/schemas/projects';
import { roleAllows } from '$lib/roles';
import { sessionCaptureViews } from '$lib/server/captures/views';
import { listSweeps } from '$lib/server/sweeps';
import { loadSessionSummary } from '$lib/server/results/load';
import { listProblemBands } from '$lib/server/queries/reviews';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	const scope = await authorize(locals, 'project:read', { sessionId });
	const k = db();
	const session = await getSession(k, sessionId);
	if (!session) error(404, 'Not found.');
	const room = (await getRoom(k, session.roomId))!;
	const project = (await getProject(k, room.projectId))!;
	const internal = roleAllows(scope.role, 'project:internal');
	const upload = roleAllows(scope.role, 'capture:write');
	return {
		captures: internal ? await sessionCaptureViews(k, sessionId) : [],
		summary: internal ? await loadSessionSummary(k, sessionId) : null,
		problemBands: await listProblemBands(k, room.id),
		sweeps: upload ? (await listSweeps(k, scope.organizationId)).map((s) => ({ id: s.id, name: s.name })) : [],
		session,
		room: { id: room.id, name: room.name, lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM },
		project: { id: project.id, name: project.name },
		positions: await listPositions(k, sessionId),
		can: {
			edit: roleAllows(scope.role, 'project:edit'),
			upload,
			internal
		}
	};
}) satisfies PageServerLoad;

export const actions = {
	createPosition: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		const form = await request.formData();
		const parsed = parseForm(positionSchema, form);
		if (!parsed.ok) return parsed.failure;
		const k = db();
		const session = (await getSession(k, sessionId))!;
		const room = (await getRoom(k, session.roomId))!;
		const placeErrors = checkPositionInRoom(parsed.data, room);
		if (Object.keys(placeErrors).length) return formFail(400, form, 'Check the coordinates.', placeErrors);
		try {
			await transaction(async (trx) => {
				const id = await mapDbErrors(createPosition(trx, sessionId, parsed.data), { duplicate: 'This visit already has a position with that label.', field: 'label' });
				await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'position.created', entityType: 'position', entityId: id });
			});
		} catch (e) {
			return problemToFailure(e, form);
		}
		redirect(303, `/sessions/${sessionId}`);
	}
} satisfies Actions;
