import { redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { formFail, parseForm, problemToFailure } from '$lib/server/forms';
import { getComparison } from '$lib/server/queries/reviews';
import { loadComparisonPage } from '$lib/server/results/comparison-page';
import { addProblemBand, publishReport, saveAdvice } from '$lib/server/reviews';
import { adviceSchema, problemBandSchema } from '$lib/schemas/reviews';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params }) => {
	const comparisonId = Number(params.comparisonId);
	const scope = await authorize(locals, 'project:internal', { comparisonId });
	return loadComparisonPage(db(), scope, comparisonId);
}) satisfies PageServerLoad;

export const actions = {
	addProblemBand: async ({ locals, params, request }) => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'review:write', { comparisonId });
		const form = await request.formData();
		form.set('comparisonId', String(comparisonId));
		const parsed = parseForm(problemBandSchema, form);
		if (!parsed.ok) return parsed.failure;
		const comparison = (await getComparison(db(), comparisonId))!;
		try {
			await addProblemBand(scope, comparison.roomId, parsed.data);
		} catch (e) {
			return problemToFailure(e, form);
		}
		return { bandAdded: true };
	},

	saveAdvice: async ({ locals, params, request }) => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'review:write', { comparisonId });
		const parsed = parseForm(adviceSchema, await request.formData());
		if (!parsed.ok) return parsed.failure;
		await saveAdvice(scope, comparisonId, parsed.data.advice, parsed.data.shareQualityNotes);
		return { adviceSaved: true };
	},

	publish: async ({ locals, params }) => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'report:publish', { comparisonId });
		await publishReport(scope, comparisonId);
		redirect(303, `/reports/${comparisonId}?published=1`);
	}
} satisfies Actions;
