import { authorize } from '$lib/server/auth/access';
import { loadComparisonPage } from '$lib/server/results/comparison-page';
import type { PageServerLoad } from './$types';

// The client-facing report: published comparisons only for clients (404 for drafts).
export const load = (async ({ locals, params }) => {
	const comparisonId = Number(params.comparisonId);
	const scope = await authorize(locals, 'project:read', { comparisonId });
	return loadComparisonPage(scope, comparisonId, { withPlan: true });
}) satisfies PageServerLoad;
