import { beforeAll, describe, expect, it } from 'vitest';
import { renderReportPdf, type ReportDocument } from '../../../src/lib/server/reports/pdf';
import { Problem } from '../../../src/lib/server/problem';
import type { ProblemBandView } from '../../../src/lib/results/types';
import { idealC80Db, sparseComparison, typicalReport } from './helpers/comparison-factory';
import { inspectPdf, normaliseSpace, requirePoppler, type InspectedPdf } from './helpers/poppler';

const MINUS = '\u2212';
/** The table's number format: fixed decimals, typographic minus. */
const fixed = (value: number, decimals: number) => value.toFixed(decimals).replace('-', MINUS);
const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;

/** Last bytes of the file as text, to find the end-of-file marker. */
function tail(bytes: Uint8Array, count = 32): string {
	return Buffer.from(bytes.subarray(Math.max(0, bytes.length - count))).toString('latin1');
}

function pageCount(pdf: InspectedPdf): number {
	return Number(pdf.info.Pages);
}

describe('renderReportPdf: a typical before/after report', () => {
	let report: ReportDocument;
	let pdf: InspectedPdf;
	let text: string;

	beforeAll(async () => {
		requirePoppler();
		report = typicalReport();
		pdf = inspectPdf(await renderReportPdf(report), { rasterise: true });
		text = normaliseSpace(pdf.text);
	});

	it('is a complete PDF file', () => {
		// ISO 32000-1:2008 §7.5.2: the file starts with the header "%PDF-1.n".
		expect(Buffer.from(pdf.bytes.subarray(0, 8)).toString('latin1')).toMatch(/^%PDF-1\.\d/);
		// ISO 32000-1:2008 §7.5.5: the last line of the file holds only "%%EOF".
		expect(tail(pdf.bytes)).toMatch(/%%EOF\s*$/);
		// poppler complains on stderr about damaged cross-reference tables or content streams.
		expect(pdf.warnings).toBe('');
	});

	it('is A4 and has at least two pages', () => {
		// ISO 216: A4 is 210 × 297 mm; 72 pt per inch, 25.4 mm per inch. pdfinfo prints two decimals.
		const size = /^([\d.]+) x ([\d.]+) pts/.exec(pdf.info['Page size']);
		expect(size).not.toBeNull();
		expect(Number(size?.[1])).toBeCloseTo((210 / 25.4) * 72, 1);
		expect(Number(size?.[2])).toBeCloseTo((297 / 25.4) * 72, 1);
		expect(pageCount(pdf)).toBeGreaterThanOrEqual(2);
	});

	it('carries title, author and subject in the document information', () => {
		const room = report.comparison.room.name;
		expect(pdf.info.Title).toBe(`${report.title} — ${room}`);
		expect(pdf.info.Author).toBe(report.practiceName);
		expect(pdf.info.Subject).toContain(room);
		expect(pdf.info.Subject).toContain(report.clientName);
	});

	it('embeds JetBrains Mono for the numbers', () => {
		// pdffonts: "name type encoding emb sub uni"; the mono face must be embedded with a Unicode map.
		const monoLines = pdf.fonts.split('\n').filter((line) => line.includes('JetBrainsMono'));
		expect(monoLines.length).toBeGreaterThanOrEqual(1);
		for (const line of monoLines) expect(line).toMatch(/yes\s+yes\s+yes\s+\d+\s+\d+\s*$/);
	});

	it('shows the room, the title block and every summary sentence', () => {
		const { room } = report.comparison;
		expect(text).toContain(report.title);
		expect(text).toContain(room.name);
		expect(text).toContain(report.projectName);
		expect(text).toContain(report.clientName);
		expect(text).toContain(report.practiceName);
		expect(text).toContain('10 March 2025');
		expect(text).toContain(`${fixed(room.lengthM, 2)} × ${fixed(room.widthM, 2)} × ${fixed(room.heightM, 2)} m`);
		// V = L·W·H.
		expect(text).toContain(`${fixed(room.lengthM * room.widthM * room.heightM, 1)} m³`);
		for (const sentence of report.comparison.summary) expect(text).toContain(normaliseSpace(sentence));
	});

	it('has the sections in reading order', () => {
		const order = ['In short', 'Before and after', 'Band by band', 'Problem bands', 'Advice', 'Next steps', 'Method', 'Safety'];
		const positions = order.map((heading) => text.indexOf(heading));
		positions.forEach((position, i) => expect(position, order[i]).toBeGreaterThanOrEqual(0));
		expect([...positions].sort((a, b) => a - b)).toEqual(positions);
	});

	it('labels the chart axes with units', () => {
		for (const label of ['Frequency (Hz)', 'Level, dB (relative)', 'T30 (s)', 'C80 (dB)', 'Octave band (Hz)']) expect(text).toContain(label);
		// Octave ticks of the frequency axis, ISO 266 nominal values.
		for (const tick of ['31.5', '63', '125', '250', '500', '1k', '2k', '4k', '8k', '16k']) expect(pdf.text).toMatch(new RegExp(`(^|\\s)${tick.replace('.', '\\.')}(\\s|$)`, 'm'));
	});

	it('prints the 125 Hz row with the averages, change, BS.1116-3 target and verdict', () => {
		const before = mean([0.64, 0.6, 0.62]); // matched positions only: Mix seat, Sofa left, Sofa right
		const after = mean([0.33, 0.31, 0.34]);
		// ITU-R BS.1116-3 (formula and mask from memory): Tm = 0.25·(V/100 m³)^(1/3); −0.05 s below;
		// above, +0.05 s at 200 Hz widening linearly in log frequency to +0.3 s at 63 Hz.
		const { lengthM, widthM, heightM } = report.comparison.room;
		const tm = 0.25 * Math.cbrt((lengthM * widthM * heightM) / 100);
		const upper = tm + 0.05 + (0.25 * Math.log(125 / 200)) / Math.log(63 / 200);
		const lower = tm - 0.05;
		expect(after).toBeLessThan(upper); // so the verdict below must read "within target"
		expect(after).toBeGreaterThan(lower);
		// C80 of each position's ideal exponential decay, averaged in dB (Cabrera, Xun & Guski 2016 closed form).
		const c80Before = mean([0.64, 0.6, 0.62].map(idealC80Db));
		const c80After = mean([0.33, 0.31, 0.34].map(idealC80Db));
		const cells = [
			'125 Hz',
			fixed(before, 2),
			fixed(after, 2),
			fixed(after - before, 2),
			fixed(((after - before) / before) * 100, 0), // relative change, (after − before)/before
			`${fixed(lower, 2)}–${fixed(upper, 2)}`,
			'within target',
			fixed(c80Before, 1),
			fixed(c80After, 1)
		];
		const row = pdf.layoutText.split('\n').find((line) => line.trimStart().startsWith('125 Hz'));
		expect(row, 'a table line starting with 125 Hz').toBeDefined();
		expect(normaliseSpace(row as string)).toBe(cells.join(' '));
	});

	it('marks a band above the target as such', () => {
		// 63 Hz after: mean(0.52, 0.55, 0.50) = 0.523 s; BS.1116-3 upper limit at 63 Hz is Tm + 0.3 s = 0.508 s.
		const row = pdf.layoutText.split('\n').find((line) => line.trimStart().startsWith('63 Hz'));
		expect(row).toContain('above target');
	});

	it('numbers the problem bands from low to high frequency, with time range and status', () => {
		const rows = ['1 42–48 Hz — Severe', '2 110–130 Hz — Moderate', '3 2–4 kHz 20–120 ms Minor'];
		const at = rows.map((row) => text.indexOf(row));
		at.forEach((position, i) => expect(position, rows[i]).toBeGreaterThanOrEqual(0));
		expect([...at].sort((a, b) => a - b)).toEqual(at);
		expect(text).toContain('Addressed');
	});

	it('shows the advice paragraphs, the plan and the method for the matched positions', () => {
		expect(text).toContain('The remaining low-frequency peak at 45 Hz is a room mode along the length.');
		expect(text).toContain('Keep the sofa at least 60 cm from the rear wall.');
		for (const line of report.plan?.lines ?? []) expect(text).toContain(line);
		expect(text).toContain('ISO 3382-2');
		expect(text).toContain('IEC 61260-1');
		expect(text).toContain('Schroeder backward integration');
		expect(text).toContain('3 positions measured in both visits: Mix seat, Sofa left and Sofa right.');
		expect(text).toContain('Door (before only)');
		expect(text).toContain('ITU-R BS.1116-3');
	});

	it('states the safety cautions', () => {
		for (const phrase of ['local building and fire codes', 'fire rating', 'licensed professionals', 'Measurement sweeps are loud', 'protect your own hearing']) {
			expect(text).toContain(phrase);
		}
	});

	it('puts "page N of M" on every page, M being the page count poppler reads', () => {
		const pages = pageCount(pdf);
		for (let n = 1; n <= pages; n++) expect(text).toContain(`Ringdown report — Control Room B — page ${n} of ${pages}`);
		expect(text).not.toContain(`page ${pages + 1} of`);
	});

	it('rasterises every page', () => {
		expect(pdf.pagePngs).toHaveLength(pageCount(pdf));
		// PNG signature, ISO/IEC 15948 §5.2.
		for (const png of pdf.pagePngs) expect(Buffer.from(png.subarray(0, 8)).toString('hex')).toBe('89504e470d0a1a0a');
	});
});

describe('renderReportPdf: a report with gaps', () => {
	let pdf: InspectedPdf;
	let text: string;

	beforeAll(async () => {
		requirePoppler();
		const report = typicalReport({ comparison: sparseComparison(), problemBands: [], plan: null, advice: '  \n\n ' });
		pdf = inspectPdf(await renderReportPdf(report));
		text = normaliseSpace(pdf.text);
	});

	it('is still a complete PDF with its footer', () => {
		expect(Buffer.from(pdf.bytes.subarray(0, 5)).toString('latin1')).toBe('%PDF-');
		expect(tail(pdf.bytes)).toMatch(/%%EOF\s*$/);
		expect(pdf.warnings).toBe('');
		const pages = pageCount(pdf);
		expect(pages).toBeGreaterThanOrEqual(1);
		expect(text).toContain(`Ringdown report — Rehearsal Room 2 — page ${pages} of ${pages}`);
	});

	it('says what is missing instead of leaving it out', () => {
		expect(text).toContain('No target reverberation time was set for this room.');
		expect(text).toContain('No problem bands were marked for this room.');
		expect(text).toContain('No advice has been written yet.');
		expect(text).toContain('Before: as found (not measured)');
		expect(text).not.toContain('Next steps');
		expect(text).not.toContain('After vs target');
		expect(text).not.toContain('ITU-R BS.1116-3');
	});

	it('fills unmeasurable bands with dashes and marks T20 stand-ins', () => {
		const line = (band: string) => normaliseSpace(pdf.layoutText.split('\n').find((l) => l.trimStart().startsWith(band)) ?? '');
		expect(line('63 Hz')).toBe('63 Hz — — — — — —');
		// 125 Hz before has T20 only (1.30 s); after has nothing.
		expect(line('125 Hz')).toBe(`125 Hz 1.30* — — — ${fixed(idealC80Db(1.3), 1)} —`);
		expect(text).toContain('* T20: the dynamic range of this band did not allow T30.');
		// Position B was measured after only and is not part of the average.
		expect(text).toContain('1 position measured in both visits: A.');
		expect(text).toContain('B (after only)');
	});
});

describe('renderReportPdf: long content', () => {
	it('runs tables and advice over pages with the header repeated and every page numbered', async () => {
		requirePoppler();
		const problemBands: ProblemBandView[] = Array.from({ length: 40 }, (_, i) => ({
			id: i + 1,
			fLoHz: 40 * 1.1 ** i,
			fHiHz: 40 * 1.1 ** i * 1.08,
			tLoMs: i % 3 === 0 ? 10 : null,
			tHiMs: i % 3 === 0 ? 60 : null,
			severity: (['minor', 'moderate', 'severe'] as const)[i % 3],
			note: `Note ${i + 1}: a longer remark that wraps onto a second line of the note column so rows differ in height.`,
			status: i % 2 === 0 ? 'open' : 'addressed'
		}));
		const advice = Array.from({ length: 14 }, (_, i) => `Paragraph ${i + 1}. ${'The treatment plan continues with further panels and a check measurement. '.repeat(6)}`).join('\n\n');
		const pdf = inspectPdf(await renderReportPdf(typicalReport({ problemBands, advice })));
		const text = normaliseSpace(pdf.text);
		const pages = pageCount(pdf);
		expect(pages).toBeGreaterThanOrEqual(5);
		for (let n = 1; n <= pages; n++) expect(text).toContain(`page ${n} of ${pages}`);
		// The table continues on a new page under a repeated header.
		expect(text.split('Severity').length - 1).toBeGreaterThanOrEqual(2);
		for (const i of [1, 20, 40]) expect(text).toContain(`Note ${i}: a longer remark`);
		expect(text).toContain('Paragraph 14.');
		expect(pdf.warnings).toBe('');
	});
});

describe('renderReportPdf: text outside the standard fonts', () => {
	it('prints look-alikes in prose instead of garbage', async () => {
		requirePoppler();
		const comparison = typicalReport().comparison;
		comparison.summary = ['Bass decay ≈ 0.3 s shorter, level −3 dB → clearer.'];
		const pdf = inspectPdf(await renderReportPdf(typicalReport({ comparison })));
		// Helvetica is set in WinAnsiEncoding (ISO 32000-1 Annex D), which has no ≈, − or →.
		expect(normaliseSpace(pdf.text)).toContain('Bass decay ~ 0.3 s shorter, level -3 dB -> clearer.');
	});
});

describe('renderReportPdf: input checks', () => {
	const cases: { name: string; change: (r: ReportDocument) => void; message: RegExp }[] = [
		{ name: 'empty title', change: (r) => (r.title = '  '), message: /title/ },
		{ name: 'invalid date', change: (r) => (r.publishedAt = new Date('not a date')), message: /publishedAt/ },
		{ name: 'empty practice', change: (r) => (r.practiceName = ''), message: /practiceName/ },
		{ name: 'room without a name', change: (r) => (r.comparison.room.name = ''), message: /room\.name/ },
		{ name: 'problem band upside down', change: (r) => (r.problemBands[0].fHiHz = r.problemBands[0].fLoHz), message: /problem band 0/ },
		{ name: 'problem band at 0 Hz', change: (r) => (r.problemBands[1].fLoHz = 0), message: /problem band 1/ }
	];
	it.each(cases)('rejects $name', async ({ change, message }) => {
		const report = typicalReport();
		change(report);
		await expect(renderReportPdf(report)).rejects.toThrow(Problem);
		await expect(renderReportPdf(report)).rejects.toThrow(message);
	});

	it('accepts the same report unchanged', async () => {
		const bytes = await renderReportPdf(typicalReport());
		expect(bytes.length).toBeGreaterThan(1000);
	});
});
