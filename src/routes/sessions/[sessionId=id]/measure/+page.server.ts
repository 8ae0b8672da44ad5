import { authorize } from '$lib/server/auth/access';
import { measurePage } from '$lib/server/measure/service';
import type { PageServerLoad } from './$types';

// Measuring in the browser records and uploads captures: acousticians and admins.
export const load = (async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	const scope = await authorize(locals, 'capture:write', { sessionId });
	return measurePage(scope, sessionId);
}) satisfies PageServerLoad;
