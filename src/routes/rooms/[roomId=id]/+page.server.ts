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
import { listComparisons, listProblemBands, getProblemBand } from '$lib/server/queries/reviews';
import { addProblemBand, removeProblemBand, setProblemBandStatus, startComparison } from '$lib/server/reviews';
import { comparisonSchema, problemBandSchema, problemBandStatusSchema } from '$lib/schemas/reviews';
import { formFail, problemToFailure } from '$lib/server/forms';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

const bandIdSchema = z.object({ bandId: z.coerce.number().int().positive() });

/** The problem band a form names, if it belongs to this room. */
async function bandOfRoom(form: FormData, roomId: number) {
	const ids = bandIdSchema.safeParse(Object.fromEntries(form));
	if (!ids.success) return null;
	const band = await getProblemBand(db(), ids.data.bandId);
	return band && band.roomId === roomId ? band : null;
}

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
		comparisons: await listComparisons(k, roomId, !roleAllows(scope.role, 'project:internal')),
		problemBands: await listProblemBands(k, roomId),
		can: { edit: roleAllows(scope.role, 'project:edit'), review: roleAllows(scope.role, 'review:write'), internal: roleAllows(scope.role, 'project:internal') }
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
	},

	createComparison: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		const form = await request.formData();
		const parsed = parseForm(comparisonSchema, form);
		if (!parsed.ok) return parsed.failure;
		try {
			const id = await startComparison(db(), scope, roomId, parsed.data);
			redirect(303, `/comparisons/${id}`);
		} catch (e) {
			return problemToFailure(e, form);
		}
	},

	addProblemBand: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		const form = await request.formData();
		const parsed = parseForm(problemBandSchema, form);
		if (!parsed.ok) return parsed.failure;
		try {
			await addProblemBand(scope, roomId, parsed.data);
		} catch (e) {
			return problemToFailure(e, form);
		}
		return { bandAdded: true };
	},

	setBandStatus: async ({ locals, params, request }) => {
		const scope = await authorize(locals, 'review:write', { roomId: Number(params.roomId) });
		const form = await request.formData();
		const band = await bandOfRoom(form, Number(params.roomId));
		if (!band) return formFail(404, form, 'No such problem band in this room.');
		const parsed = parseForm(problemBandStatusSchema, form);
		if (!parsed.ok) return parsed.failure;
		await setProblemBandStatus(scope, band.id, parsed.data.status);
		return { bandUpdated: true };
	},

	deleteBand: async ({ locals, params, request }) => {
		const scope = await authorize(locals, 'review:write', { roomId: Number(params.roomId) });
		const form = await request.formData();
		const band = await bandOfRoom(form, Number(params.roomId));
		if (!band) return formFail(404, form, 'No such problem band in this room.');
		await removeProblemBand(scope, band.id);
		return { bandDeleted: true };
	}
} satisfies Actions;
