import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { authorize } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import * as projects from '$lib/server/projects/service';
import * as reviews from '$lib/server/reviews/service';
import { formUnitSystem, roomSchemaFor, sessionSchema } from '$lib/schemas/projects';
import { comparisonSchema, problemBandSchema, problemBandStatusSchema } from '$lib/schemas/reviews';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

const bandId = z.coerce.number({ error: 'Say which problem band.' }).int().positive({ error: 'Say which problem band.' });
const bandStatusSchema = problemBandStatusSchema.extend({ bandId });
const bandSchema = z.object({ bandId });

export const load = (async ({ locals, params }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:read', { roomId });
	return {
		...(await projects.roomOverview(scope, roomId)),
		can: { edit: roleAllows(scope.role, 'project:edit'), review: roleAllows(scope.role, 'review:write'), internal: roleAllows(scope.role, 'project:internal') }
	};
}) satisfies PageServerLoad;

export const actions = {
	update: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'project:edit', { roomId });
		return formAction(request, (form) => roomSchemaFor(formUnitSystem(form, scope.user.unitSystem)), async (input) => {
			await projects.updateRoom(scope, roomId, input);
			return { updated: true };
		});
	},

	createSession: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'project:edit', { roomId });
		return formAction(request, sessionSchema, async (input) => {
			const id = await projects.createSession(scope, roomId, input);
			redirect(303, `/sessions/${id}`);
		});
	},

	createComparison: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		return formAction(request, comparisonSchema, async (input) => {
			const id = await reviews.startComparison(scope, roomId, input);
			redirect(303, `/comparisons/${id}`);
		});
	},

	addProblemBand: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		return formAction(request, problemBandSchema, async (input) => {
			await reviews.addProblemBand(scope, roomId, input);
			return { bandAdded: true };
		});
	},

	setBandStatus: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		return formAction(request, bandStatusSchema, async (input) => {
			await reviews.setProblemBandStatus(scope, roomId, input.bandId, input.status);
			return { bandUpdated: true };
		});
	},

	deleteBand: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		return formAction(request, bandSchema, async (input) => {
			await reviews.removeProblemBand(scope, roomId, input.bandId);
			return { bandDeleted: true };
		});
	}
} satisfies Actions;
