import { authorize } from '$lib/server/auth/access';
import { answer, parseJson } from '$lib/server/api';
import { taggedJson } from '$lib/server/results/tagged';
import { visitResponsesAt } from '$lib/server/sessions/service';
import { responsesQuerySchema } from '$lib/schemas/results';
import type { RequestHandler } from './$types';

/** A visit's responses (each position's and their average) at one smoothing, with an entity tag. */
export const GET: RequestHandler = async ({ locals, params, request, url }) =>
	answer(async () => {
		const sessionId = Number(params.sessionId);
		await authorize(locals, 'project:internal', { sessionId });
		const { smoothing } = parseJson(responsesQuerySchema, Object.fromEntries(url.searchParams));
		const { tag, answer: body } = await visitResponsesAt(sessionId, smoothing);
		return taggedJson(request, tag, body);
	});
