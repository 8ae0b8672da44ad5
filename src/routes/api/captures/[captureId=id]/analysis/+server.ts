import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { storedAnalysis } from '$lib/server/captures/read';
import type { RequestHandler } from './$types';

/** The whole stored result of a capture: metrics, warnings and chart curves. */
export const GET: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		await authorize(locals, 'project:internal', { captureId });
		return json(await storedAnalysis(captureId));
	});
