// The PDF report of a comparison, made from what its report page shows.
import type { Scope } from '../auth/access';
import { loadComparisonDocument } from '../results/comparison-page';
import type { ReportDocument } from './pdf';

export async function loadReportDocument(scope: Scope, comparisonId: number): Promise<{ document: ReportDocument; fileName: string }> {
	const page = await loadComparisonDocument(scope, comparisonId, { withPlan: true });
	return {
		document: {
			practiceName: page.practiceName,
			projectName: page.project.name,
			clientName: page.project.clientName,
			publishedAt: page.comparison.publishedAt ? new Date(page.comparison.publishedAt) : new Date(),
			title: page.comparison.title,
			comparison: page.model,
			advice: page.comparison.advice,
			problemBands: page.problemBands,
			plan: page.plan,
			qualityNotes: page.qualityNotes,
			unitSystem: scope.user.unitSystem
		},
		fileName: `ringdown-report-${page.room.name.replace(/[^\w-]+/g, '-').toLowerCase()}.pdf`
	};
}
