import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { storedAnalysis } from '$lib/server/captures/read';
import { analysisEntityTag, matchesTag } from '$lib/server/captures/analysis-tag';
import type { RequestHandler } from './$types';

/**
 * The whole stored result of a capture: metrics, warnings and chart curves. It changes only when
 * the capture is analysed again, so it carries an entity tag and a browser revalidates each time
 * (private, no-cache): an unchanged result is answered 304 without being read.
 */
export const GET: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		await authorize(locals, 'project:internal', { captureId });
		const tag = await analysisEntityTag(captureId);
		const headers: Record<string, string> = tag ? { etag: tag, 'cache-control': 'private, no-cache' } : {};
		if (tag && matchesTag(request.headers.get('if-none-match'), tag)) return new Response(null, { status: 304, headers });
		return json(await storedAnalysis(captureId), { headers });
	});
