import { authorize } from '$lib/server/auth/access';
import { download, exportFormat } from '$lib/server/exports';
import { loadComparisonDocument } from '$lib/server/results/comparison-page';
import { comparisonCsv, comparisonJson } from '$lib/results/exports';
import type { RequestHandler } from './$types';

/** The comparison band by band, as CSV or JSON (clients: published reports only). */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const comparisonId = Number(params.comparisonId);
	const scope = await authorize(locals, 'project:read', { comparisonId });
	const format = exportFormat(url);
	const page = await loadComparisonDocument(scope, comparisonId);
	return download(format, `${page.room.name}-comparison`, () => comparisonCsv(page.model), () => comparisonJson(page.model));
};
