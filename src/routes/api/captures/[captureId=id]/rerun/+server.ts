import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { requeueCaptures } from '$lib/server/captures/service';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, params }) => {
	const captureId = Number(params.captureId);
	const scope = await authorize(locals, 'capture:write', { captureId });
	const queued = await requeueCaptures(scope, [captureId]);
	return json({ queued }, { status: queued ? 202 : 409 });
};
