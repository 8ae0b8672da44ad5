import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { authorize, type Scope } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import { addPosition, editPosition, removePosition, visitPage } from '$lib/server/sessions/service';
import { calibrationSummary } from '$lib/server/calibrations/service';
import { visitPhotos } from '$lib/server/photos/service';
import { formUnitSystem, positionSchemaFor } from '$lib/schemas/projects';
import type { Actions, PageServerLoad } from './$types';

const positionId = z.coerce.number({ error: 'Say which position.' }).int().positive({ error: 'Say which position.' });
const removePositionSchema = z.object({ positionId });
// Coordinates are typed in the unit system the form was shown in.
const positionFormSchema = (scope: Scope) => (form: FormData) => positionSchemaFor(formUnitSystem(form, scope.user.unitSystem));
const editPositionFormSchema = (scope: Scope) => (form: FormData) => positionSchemaFor(formUnitSystem(form, scope.user.unitSystem)).extend({ positionId });

export const load = (async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	const scope = await authorize(locals, 'project:read', { sessionId });
	const page = await visitPage(scope, sessionId);
	return { ...page, calibration: page.can.internal ? await calibrationSummary(sessionId) : null, photos: await visitPhotos(sessionId) };
}) satisfies PageServerLoad;

export const actions = {
	createPosition: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, positionFormSchema(scope), async (input) => {
			await addPosition(scope, sessionId, input);
			redirect(303, `/sessions/${sessionId}`);
		});
	},

	updatePosition: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, editPositionFormSchema(scope), async ({ positionId, ...input }) => {
			await editPosition(scope, sessionId, positionId, input);
			return { positionUpdated: positionId };
		});
	},

	deletePosition: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, removePositionSchema, async ({ positionId }) => {
			await removePosition(scope, sessionId, positionId);
			return { positionRemoved: true };
		});
	}
} satisfies Actions;
