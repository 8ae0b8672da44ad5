// JSON answers of results that change only when an analysis, a label or the room changes: each
// carries the entity tag of the results it comes from, and a browser revalidates it every time
// (private, no-cache) and is answered 304 without a body while it holds the same.
import { json } from '@sveltejs/kit';
import { matchesTag } from '../captures/analysis-tag';

export function taggedJson(request: Request, tag: string, body: () => unknown): Response {
	const headers = { etag: tag, 'cache-control': 'private, no-cache' };
	if (matchesTag(request.headers.get('if-none-match'), tag)) return new Response(null, { status: 304, headers });
	return json(body(), { headers });
}
