// The client report as a PDF: a before/after comparison of a room, drawn on the server with
// pdfkit (vector charts, embedded mono font for numbers), A4, numbered pages.
import PDFDocument from 'pdfkit';
import type { ReportDocument } from './document';
import { Problem } from '../problem';
import { registerReportFonts } from './fonts';
import { stampFooters } from './footer';
import { ReportPen } from './pen';
import { DEFAULT_TARGET_BASIS } from './report-text';
import { drawReport } from './sections';
import { PAGE } from './theme';

export type { ReportDocument };

/** The report cannot be drawn from what it was given (the data behind it is incomplete). */
const incomplete = (message: string) => new Problem(422, message, { code: 'report_incomplete' });

function requireText(name: string, value: unknown): void {
	if (typeof value !== 'string' || value.trim().length === 0) throw incomplete(`${name} must be a non-empty string`);
}

function checkReport(report: ReportDocument): void {
	requireText('title', report.title);
	requireText('practiceName', report.practiceName);
	if (!(report.publishedAt instanceof Date) || Number.isNaN(report.publishedAt.getTime())) {
		throw incomplete(`publishedAt must be a valid Date, got ${String(report.publishedAt)}`);
	}
	if (!report.comparison || !report.comparison.room) throw incomplete('comparison with a room is required');
	requireText('comparison.room.name', report.comparison.room.name);
	if (typeof report.advice !== 'string') throw incomplete('advice must be a string (may be empty)');
	if (!Array.isArray(report.problemBands)) throw incomplete('problemBands must be an array (may be empty)');
	report.problemBands.forEach((band, i) => {
		if (!(band.fLoHz > 0) || !(band.fHiHz > band.fLoHz)) {
			throw incomplete(`problem band ${i} needs 0 < fLoHz < fHiHz, got ${band.fLoHz}…${band.fHiHz} Hz`);
		}
	});
}

/** PDF document information (ISO 32000-1 §14.3.3). */
export function reportInfo(report: ReportDocument): PDFKit.DocumentInfo {
	const room = report.comparison.room.name;
	return {
		Title: `${report.title} — ${room}`,
		Author: report.practiceName,
		Subject: `Room acoustics before and after treatment: ${room}, ${report.projectName}, for ${report.clientName}`,
		Creator: 'Ringdown'
	};
}

export async function renderReportPdf(report: ReportDocument): Promise<Uint8Array> {
	checkReport(report);
	const doc = new PDFDocument({
		size: 'A4',
		margins: { top: PAGE.marginTop, bottom: PAGE.marginBottom, left: PAGE.marginLeft, right: PAGE.marginRight },
		bufferPages: true,
		info: reportInfo(report),
		lang: 'en'
	});
	const chunks: Buffer[] = [];
	const finished = new Promise<Uint8Array>((resolve, reject) => {
		doc.on('data', (chunk: Buffer) => chunks.push(chunk));
		doc.on('end', () => resolve(new Uint8Array(Buffer.concat(chunks))));
		doc.on('error', reject);
	});
	const pen = new ReportPen(doc, registerReportFonts(doc));
	drawReport(pen, {
		practiceName: report.practiceName,
		projectName: report.projectName,
		clientName: report.clientName,
		publishedAt: report.publishedAt,
		title: report.title,
		comparison: report.comparison,
		advice: report.advice,
		// Numbered low to high, the same in the chart and the table.
		problemBands: [...report.problemBands].sort((a, b) => a.fLoHz - b.fLoHz || a.fHiHz - b.fHiHz),
		plan: report.plan ?? null,
		targetBasis: report.targetBasis ?? DEFAULT_TARGET_BASIS,
		qualityNotes: report.qualityNotes ?? [],
		unitSystem: report.unitSystem ?? 'metric'
	});
	stampFooters(pen, report.comparison.room.name);
	doc.end();
	return finished;
}
