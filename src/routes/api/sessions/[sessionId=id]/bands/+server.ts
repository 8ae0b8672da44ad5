import { authorize } from '$lib/server/auth/access';
import { answer, parseJson } from '$lib/server/api';
import { taggedJson } from '$lib/server/results/tagged';
import { visitBandsOf } from '$lib/server/sessions/service';
import { bandsQuerySchema } from '$lib/schemas/results';
import type { RequestHandler } from './$types';

/** A visit's band tables of one kind (each position's values, the average, the spread), with an entity tag. */
export const GET: RequestHandler = async ({ locals, params, request, url }) =>
	answer(async () => {
		const sessionId = Number(params.sessionId);
		await authorize(locals, 'project:internal', { sessionId });
		const { kind } = parseJson(bandsQuerySchema, Object.fromEntries(url.searchParams));
		const { tag, answer: body } = await visitBandsOf(sessionId, kind);
		return taggedJson(request, tag, body);
	});
