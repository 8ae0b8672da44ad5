import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { parseCaptureUpload } from '$lib/server/captures/multipart';
import { uploadThroughServer } from '$lib/server/captures/service';
import { toView } from '$lib/server/captures/views';
import type { RequestHandler } from './$types';

/**
 * Upload through the server, for scripted clients: multipart/form-data with the file in `file`
 * (and optionally `reference`), and the same metadata fields as the JSON route (numbers as text).
 * The SHA-256 is computed here when not given.
 */
export const POST: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'capture:write', { sessionId });
		const { input, file, reference } = await parseCaptureUpload(request);
		const capture = await uploadThroughServer(scope, sessionId, input, file, reference);
		return json({ capture: toView(capture) }, { status: 201 });
	});
