import { authorize } from '$lib/server/auth/access';
import { download, exportFormat } from '$lib/server/exports';
import { visitAverage } from '$lib/server/sessions/service';
import { sessionAverageCsv, sessionAverageJson } from '$lib/results/exports';
import type { RequestHandler } from './$types';

/** A visit's spatial average per band, as CSV or JSON. */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const sessionId = Number(params.sessionId);
	await authorize(locals, 'project:internal', { sessionId });
	const format = exportFormat(url);
	const summary = await visitAverage(sessionId);
	return download(format, `${summary.conditionLabel}-${summary.measuredOn}-average`, () => sessionAverageCsv(summary), () => sessionAverageJson(summary));
};
