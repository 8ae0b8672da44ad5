import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer, parseJsonBody } from '$lib/server/api';
import { deleteCapture, updateCapture } from '$lib/server/captures/service';
import { captureView } from '$lib/server/captures/read';
import { updateCaptureSchema } from '$lib/schemas/captures';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const captureId = Number(params.captureId);
	await authorize(locals, 'project:internal', { captureId });
	return json({ capture: await captureView(captureId) });
};

/** Rename the file label, or move the capture to another (or a new) position of its visit. */
export const PATCH: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		await updateCapture(scope, captureId, await parseJsonBody(request, updateCaptureSchema));
		return json({ capture: await captureView(captureId) });
	});

/** Delete the capture: its objects, its analysis, its rows; recorded in the audit log. */
export const DELETE: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		await deleteCapture(scope, captureId);
		return new Response(null, { status: 204 });
	});
