import { authorize } from '$lib/server/auth/access';
import { capturePage } from '$lib/server/captures/read';
import { setCaptureNote } from '$lib/server/captures/service';
import { captureLevels } from '$lib/server/calibrations/service';
import { formAction } from '$lib/server/forms';
import { captureNoteSchema } from '$lib/schemas/capture-notes';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

// The page shell; the charts' data comes from /api/captures/[id]/analysis in the browser.
export const load = (async ({ locals, params }) => {
	const captureId = Number(params.captureId);
	const scope = await authorize(locals, 'project:internal', { captureId });
	return { ...(await capturePage(captureId)), levels: await captureLevels(captureId), canNote: roleAllows(scope.role, 'project:edit') };
}) satisfies PageServerLoad;

export const actions = {
	/** Write, change or clear the capture's note (the visit page's list sends it here too). */
	note: async ({ locals, params, request }) => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'project:edit', { captureId });
		return formAction(request, captureNoteSchema, async ({ note }) => {
			await setCaptureNote(scope, captureId, note);
			return { noteSaved: true };
		});
	}
} satisfies Actions;
