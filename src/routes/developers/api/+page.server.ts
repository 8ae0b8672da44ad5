import { apiDescription } from '$lib/server/openapi/document';
import { apiPageView, type ApiDocument } from '$lib/server/openapi/view';
import type { PageServerLoad } from './$types';

// Public, like /api/openapi.json: the page is the same document, made readable.
export const load = (async () => {
	return { api: apiPageView(apiDescription() as unknown as ApiDocument) };
}) satisfies PageServerLoad;
