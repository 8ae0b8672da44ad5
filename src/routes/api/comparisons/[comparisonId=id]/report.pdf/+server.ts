import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { loadComparisonPage } from '$lib/server/results/comparison-page';
import { renderReportPdf } from '$lib/server/reports/pdf';
import type { RequestHandler } from './$types';

/** The report as a PDF, rendered on the server (clients: published reports only). */
export const GET: RequestHandler = async ({ locals, params }) => {
	const comparisonId = Number(params.comparisonId);
	const scope = await authorize(locals, 'project:read', { comparisonId });
	const page = await loadComparisonPage(db(), scope, comparisonId, { withPlan: true });
	const pdf = await renderReportPdf({
		practiceName: page.practiceName,
		projectName: page.project.name,
		clientName: page.project.clientName,
		publishedAt: page.comparison.publishedAt ? new Date(page.comparison.publishedAt) : new Date(),
		title: page.comparison.title,
		comparison: page.model,
		advice: page.comparison.advice,
		problemBands: page.problemBands,
		plan: page.plan
	});
	const name = `ringdown-report-${page.room.name.replace(/[^\w-]+/g, '-').toLowerCase()}.pdf`;
	return new Response(pdf as Uint8Array<ArrayBuffer>, {
		headers: { 'content-type': 'application/pdf', 'content-disposition': `attachment; filename="${name}"`, 'content-length': String(pdf.byteLength) }
	});
};
