import { authorize } from '$lib/server/auth/access';
import { answer, parseJson } from '$lib/server/api';
import { comparisonResponsesOf } from '$lib/server/results/comparison-page';
import { taggedJson } from '$lib/server/results/tagged';
import { responsesQuerySchema } from '$lib/schemas/results';
import type { RequestHandler } from './$types';

/** A comparison's averaged responses, before and after, at one smoothing, with an entity tag (clients: published only). */
export const GET: RequestHandler = async ({ locals, params, request, url }) =>
	answer(async () => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'project:read', { comparisonId });
		const { smoothing } = parseJson(responsesQuerySchema, Object.fromEntries(url.searchParams));
		const { tag, answer: body } = await comparisonResponsesOf(scope, comparisonId, smoothing);
		return taggedJson(request, tag, body);
	});
