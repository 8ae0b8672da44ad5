import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { discardRequestBody } from '$lib/server/body-limit';
import { uploadThroughServer } from '$lib/server/captures/service';
import { toView } from '$lib/server/captures/views';
import type { RequestHandler } from './$types';

/**
 * Upload through the server, for scripted clients: multipart/form-data with the file in `file`
 * (and optionally the played sweep in `reference`), and the same metadata fields as the JSON
 * route (numbers as text), best sent before the file so a bad one is refused before the file
 * is read. The body is streamed to storage; size and SHA-256 are measured on the way (a
 * `sha256` field, when given, must match).
 */
export const POST: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'capture:write', { sessionId }).catch((e: unknown) => {
			discardRequestBody(request); // so the client reads the refusal instead of a reset
			throw e;
		});
		const capture = await uploadThroughServer(scope, sessionId, request);
		return json({ capture: toView(capture) }, { status: 201 });
	});
