import { beforeAll, describe, expect, it } from 'vitest';
import { renderReportPdf } from '../../../src/lib/server/reports/pdf';
import { methodParagraphs } from '../../../src/lib/server/reports/report-text';
import { reportBandRows } from '../../../src/lib/server/reports/report-data';
import { typicalComparison, typicalReport } from './helpers/comparison-factory';
import { inspectPdf, normaliseSpace, requirePoppler } from './helpers/poppler';

// The typical comparison: 'Mix seat', 'Sofa left', 'Sofa right' in both visits, one loudspeaker pair
// as one source label, a microphone each — 1 source, 3 microphones, 3 combinations: survey grade,
// short of engineering's 2 sources and 6 combinations (ISO 3382-2:2008 Table 1, from memory).
describe('the report says how sure its numbers are', () => {
	let text = '';
	beforeAll(async () => {
		requirePoppler();
		text = normaliseSpace(inspectPdf(await renderReportPdf(typicalReport())).text);
	});

	it('names the grade of each visit and what the next grade needs', () => {
		expect(text).toContain('How sure these numbers are');
		expect(text).toContain('Before: Survey grade (ISO 3382-2).');
		expect(text).toContain('For the engineering grade: 2 source positions (this visit has 1) and 6 source–microphone combinations (this visit has 3).');
	});

	it('prints the 500 Hz T30 with its 95 % interval over the three positions (worked by hand)', () => {
		// Before at 500 Hz: 0.50, 0.48, 0.49 s → mean 0.49, s = 0.01, t(0.975, 2) = 4.303 (NIST t table): ±0.0248 → "0.49 ± 0.02".
		// After: 0.21, 0.22, 0.21 s → mean 0.2133, s = 0.00577, ±0.0143 → "0.21 ± 0.01".
		expect(text).toMatch(/500 Hz 0\.49 ± 0\.02 0\.21 ± 0\.01/);
	});

	it('states the grade in the method instead of claiming one', () => {
		const comparison = typicalComparison();
		const [first] = methodParagraphs(comparison, reportBandRows(comparison), 'ITU-R BS.1116-3');
		expect(first).toMatch(/^Measured following ISO 3382-2; the positions compared \(1 source position, 3 microphone positions, 3 source–microphone combinations\) reach its survey grade\./);
		expect(first).not.toContain('engineering method');
	});
});
