import { authorize } from '$lib/server/auth/access';
import { capturePage } from '$lib/server/captures/read';
import { captureLevels } from '$lib/server/calibrations/service';
import type { PageServerLoad } from './$types';

// The page shell; the charts' data comes from /api/captures/[id]/analysis in the browser.
export const load = (async ({ locals, params }) => {
	const captureId = Number(params.captureId);
	await authorize(locals, 'project:internal', { captureId });
	return { ...(await capturePage(captureId)), levels: await captureLevels(captureId) };
}) satisfies PageServerLoad;
