import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { loadReportDocument } from '$lib/server/reports/load';
import { renderReportPdf } from '$lib/server/reports/pdf';
import type { RequestHandler } from './$types';

/** The report as a PDF, rendered on the server (clients: published reports only). */
export const GET: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const comparisonId = Number(params.comparisonId);
		const scope = await authorize(locals, 'project:read', { comparisonId });
		const { document, fileName } = await loadReportDocument(scope, comparisonId);
		const pdf = await renderReportPdf(document);
		return new Response(pdf as Uint8Array<ArrayBuffer>, {
			headers: { 'content-type': 'application/pdf', 'content-disposition': `attachment; filename="${fileName}"`, 'content-length': String(pdf.byteLength) }
		});
	});
