import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { rerunCapture } from '$lib/server/captures/service';
import type { RequestHandler } from './$types';

/** Queue the capture's analysis again; 409 while it is still being uploaded or analysed. */
export const POST: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		await rerunCapture(scope, captureId);
		return json({ queued: 1 }, { status: 202 });
	});
