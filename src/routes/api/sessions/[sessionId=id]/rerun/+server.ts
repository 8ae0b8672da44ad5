import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { rerunSession } from '$lib/server/captures/service';
import type { RequestHandler } from './$types';

/** Re-run the analysis of every settled capture of a visit (e.g. after an engine update). */
export const POST: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'capture:write', { sessionId });
		return json({ queued: await rerunSession(scope, sessionId) });
	});
