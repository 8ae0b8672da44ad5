import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { requeueCaptures } from '$lib/server/captures/service';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** Re-run the analysis of every settled capture of a visit (e.g. after an engine update). */
export const POST: RequestHandler = async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	const scope = await authorize(locals, 'capture:write', { sessionId });
	const ids = (await db()('captures').where({ session_id: sessionId }).select('id')).map((r) => r.id as number);
	return json({ queued: await requeueCaptures(scope, ids) });
};
