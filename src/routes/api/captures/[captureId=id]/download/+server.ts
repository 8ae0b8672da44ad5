import { redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { originalFileLink } from '$lib/server/captures/read';
import type { RequestHandler } from './$types';

/** The original file, through a short-lived presigned link (the object key itself is random). */
export const GET: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		await authorize(locals, 'project:internal', { captureId });
		redirect(302, await originalFileLink(captureId));
	});
