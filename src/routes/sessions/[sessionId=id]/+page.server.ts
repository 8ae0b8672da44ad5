import { redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import { addPosition, visitPage } from '$lib/server/sessions/service';
import { calibrationSummary } from '$lib/server/calibrations/service';
import { positionSchema } from '$lib/schemas/projects';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	const scope = await authorize(locals, 'project:read', { sessionId });
	const page = await visitPage(scope, sessionId);
	return { ...page, calibration: page.can.internal ? await calibrationSummary(sessionId) : null };
}) satisfies PageServerLoad;

export const actions = {
	createPosition: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, positionSchema, async (input) => {
			await addPosition(scope, sessionId, input);
			redirect(303, `/sessions/${sessionId}`);
		});
	}
} satisfies Actions;
