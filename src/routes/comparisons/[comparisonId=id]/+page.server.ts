import { redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import { loadComparisonPage } from '$lib/server/results/comparison-page';
import * as reviews from '$lib/server/reviews/service';
import { adviceSchema, problemBandSchema } from '$lib/schemas/reviews';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params }) => {
	const comparisonId = Number(params.comparisonId);
	const scope = await authorize(locals, 'project:internal', { comparisonId });
	return loadComparisonPage(scope, comparisonId);
}) satisfies PageServerLoad;

export const actions = {
	addProblemBand: async ({ locals, params, request }) => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'review:write', { comparisonId });
		return formAction(request, problemBandSchema, async (input) => {
			await reviews.addProblemBandOfComparison(scope, comparisonId, input);
			return { bandAdded: true };
		});
	},

	saveAdvice: async ({ locals, params, request }) => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'review:write', { comparisonId });
		return formAction(request, adviceSchema, async (input) => {
			await reviews.saveAdvice(scope, comparisonId, input);
			return { adviceSaved: true };
		});
	},

	publish: async ({ locals, params }) => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'report:publish', { comparisonId });
		await reviews.publishReport(scope, comparisonId);
		redirect(303, `/reports/${comparisonId}?published=1`);
	}
} satisfies Actions;
