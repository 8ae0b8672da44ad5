import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { loadComparisonDocument } from '$lib/server/results/comparison-page';
import type { RequestHandler } from './$types';

/** The comparison model (averages, differences, verdicts, summary) for charts and scripts. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const comparisonId = Number(params.comparisonId);
	const scope = await authorize(locals, 'project:read', { comparisonId });
	const page = await loadComparisonDocument(scope, comparisonId);
	return json({ comparison: page.comparison, room: page.room, model: page.model, problemBands: page.problemBands });
};
