import { beforeAll, describe, expect, it } from 'vitest';
import { renderReportPdf } from '../../../src/lib/server/reports/pdf';
import { typicalReport } from './helpers/comparison-factory';
import { inspectPdf, normaliseSpace, requirePoppler } from './helpers/poppler';

// The report's quality notes reach the PDF as they reach the report page: the notes handed to the
// document are printed under their own heading, and no heading is printed without notes.
describe('quality notes in the PDF', () => {
	beforeAll(() => requirePoppler());

	it('prints each capture\'s notes with its visit and position', async () => {
		const qualityNotes = [
			{ condition: 'Before treatment', positionLabel: 'P2', messages: ['125 Hz: T30 not reached before the noise; T20 shown', 'clipped samples: 3'] },
			{ condition: 'After treatment', positionLabel: 'P1', messages: ['broadband: the direct sound dominates EDT and C50'] }
		];
		const text = normaliseSpace(inspectPdf(await renderReportPdf(typicalReport({ qualityNotes }))).text);
		expect(text).toContain('Notes on the measurements');
		expect(text).toContain('Before treatment, P2: 125 Hz: T30 not reached before the noise; T20 shown · clipped samples: 3');
		expect(text).toContain('After treatment, P1: broadband: the direct sound dominates EDT and C50');
	});

	it('prints no notes section when none are shared', async () => {
		const text = normaliseSpace(inspectPdf(await renderReportPdf(typicalReport({ qualityNotes: [] }))).text);
		expect(text).not.toContain('Notes on the measurements');
	});
});
