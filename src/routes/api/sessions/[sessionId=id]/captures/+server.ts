import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer, parseJsonBody } from '$lib/server/api';
import { createCapture } from '$lib/server/captures/service';
import { sessionCaptures } from '$lib/server/captures/read';
import { toView } from '$lib/server/captures/views';
import { config } from '$lib/server/config';
import { createCaptureSchema } from '$lib/schemas/captures';
import type { RequestHandler } from './$types';

/** The visit's captures and their states (polled by the visit page while work is pending). */
export const GET: RequestHandler = async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	await authorize(locals, 'project:internal', { sessionId });
	return json(await sessionCaptures(sessionId));
};

/** Announce a file: validates the metadata, creates the capture and returns presigned upload URL(s). */
export const POST: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'capture:write', { sessionId });
		const input = await parseJsonBody(request, createCaptureSchema(config().UPLOAD_MAX_BYTES));
		const created = await createCapture(scope, sessionId, input);
		return json({ capture: toView(created.capture), upload: created.upload, referenceUpload: created.referenceUpload }, { status: 201 });
	});
