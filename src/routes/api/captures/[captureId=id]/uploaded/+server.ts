import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { confirmUpload } from '$lib/server/captures/service';
import { toView } from '$lib/server/captures/views';
import type { RequestHandler } from './$types';

/** The browser finished its PUT: the server checks the object and queues the analysis. */
export const POST: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		return json({ capture: toView(await confirmUpload(scope, captureId)) });
	});
