import { authorize } from '$lib/server/auth/access';
import { answer, parseJson } from '$lib/server/api';
import { comparisonBandsOf } from '$lib/server/results/comparison-page';
import { taggedJson } from '$lib/server/results/tagged';
import { bandsQuerySchema } from '$lib/schemas/results';
import type { RequestHandler } from './$types';

/** A comparison's band-by-band differences and judgements of one kind, with an entity tag (clients: published only). */
export const GET: RequestHandler = async ({ locals, params, request, url }) =>
	answer(async () => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'project:read', { comparisonId });
		const { kind } = parseJson(bandsQuerySchema, Object.fromEntries(url.searchParams));
		const { tag, answer: body } = await comparisonBandsOf(scope, comparisonId, kind);
		return taggedJson(request, tag, body);
	});
