import { json } from '@sveltejs/kit';
import { apiDescription } from '$lib/server/openapi/document';
import type { RequestHandler } from './$types';

/** The OpenAPI 3.1 description of this API; public, since it holds no one's data. */
export const GET: RequestHandler = async () => json(apiDescription(), { headers: { 'cache-control': 'public, max-age=300' } });
