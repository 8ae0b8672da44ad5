// The report's sections, in reading order, each drawn into the flow of the document.
import {
	capitalise,
	formatBand,
	formatDb,
	formatHzRange,
	formatMsRange,
	formatNumber,
	formatRange,
	formatRoomSize,
	formatSeconds,
	formatSigned,
	formatVolume,
	MISSING
} from '../../format';
import type { ProblemBandView, SessionSummary } from '../../results/types';
import type { GradeAssessment } from '../../results/grade';
import type { DifferenceVerdict } from '../../results/spread';
import { reverberationJudgement } from '../../results/statistics';
import { formatSpread, GRADE_NAMES, gradeHeadline, gradeSentences } from '../../results/statistics-text';
import { sameBand } from '../../analysis/targets';
import type { ReportContent, ReportPlan, ReportQualityNote } from './document';
import { drawBandChart } from './band-chart';
import { drawBullets, drawFactPanel, drawHeading, drawParagraphs } from './blocks';
import { formatPublishedDate, splitParagraphs, verdictWords } from './wording';
import type { ReportPen } from './pen';
import { reportBandRows, smoothedResponse, usesT20Fallback, type ReportBandRow, type ReverberationValue } from './report-data';
import { methodParagraphs, SAFETY_PARAGRAPHS } from './report-text';
import { drawResponseChart } from './response-chart';
import { drawTable, type TableColumn } from './table';
import { COLOURS, TYPE } from './theme';

export type { ReportContent, ReportPlan };

const RESPONSE_CHART_HEIGHT = 200;
const BAND_CHART_HEIGHT = 178;
const CHART_GAP = 16;
const LEGEND_LABEL_CHARS = 44;

function shorten(text: string, maxChars: number): string {
	return text.length <= maxChars ? text : `${text.slice(0, maxChars - 1).trimEnd()}…`;
}

function visitLabel(side: 'Before' | 'After', session: SessionSummary, drawn: boolean): string {
	const label = shorten(`${side}: ${session.conditionLabel}`, LEGEND_LABEL_CHARS);
	return drawn ? label : `${label} (not measured)`;
}

function orMissing(text: string): string {
	return text.trim().length > 0 ? text : MISSING;
}

function visitFact(session: SessionSummary): string {
	return `${session.conditionLabel}, measured ${session.measuredOn}`;
}

export function drawTitleBlock(pen: ReportPen, report: ReportContent): void {
	const { room, baseline, treated, matchedPositions } = report.comparison;
	pen.use('monoBold', TYPE.small, COLOURS.after).flow('RINGDOWN  ·  CLIENT REPORT', { characterSpacing: 1.2 });
	pen.gap(8);
	pen.use('proseBold', TYPE.title, COLOURS.ink).flow(report.title);
	pen.gap(2);
	pen.use('prose', TYPE.subtitle, COLOURS.inkSoft).flow(room.name);
	pen.gap(12);
	const dimensions = formatRoomSize(room, report.unitSystem);
	drawFactPanel(pen, [
		[
			{ label: 'Project', value: orMissing(report.projectName) },
			{ label: 'Client', value: orMissing(report.clientName) },
			{ label: 'Prepared by', value: report.practiceName },
			{ label: 'Published', value: formatPublishedDate(report.publishedAt) }
		],
		[
			{ label: 'Room (L×W×H)', value: dimensions, face: 'mono' },
			{ label: 'Volume', value: formatVolume(room.volumeM3, report.unitSystem), face: 'mono' },
			{ label: 'Use', value: orMissing(room.roomUse) },
			{ label: 'Before', value: visitFact(baseline) },
			{ label: 'After', value: visitFact(treated) },
			{ label: 'Positions', value: `${matchedPositions.length} compared` },
			{ label: 'Grade (ISO 3382-2)', value: gradesFact(report) }
		]
	]);
}

function gradeName(grade: GradeAssessment): string {
	return grade.grade === null ? 'below survey' : GRADE_NAMES[grade.grade];
}

function gradesFact(report: ReportContent): string {
	const { baseline, treated } = report.comparison.matchedStatistics;
	const before = gradeName(baseline.grade);
	const after = gradeName(treated.grade);
	return before === after ? capitalise(before) : `${capitalise(before)} before, ${after} after`;
}

const SPREAD_VERDICT: Record<DifferenceVerdict, string> = {
	'within-spread': 'Within the spread',
	'within-jnd': 'Below the JND',
	beyond: 'A real change',
	unknown: MISSING
};

/** How sure the numbers are: each visit's grade, T_mid, and per band the means with their 95 % intervals and the change judged against the spread. */
export function drawSpread(pen: ReportPen, report: ReportContent): void {
	const { matchedStatistics, judgements, matchedPositions } = report.comparison;
	drawHeading(pen, 'How sure these numbers are', 60);
	const paragraphs: string[] = [];
	for (const [side, stats] of [
		['Before', matchedStatistics.baseline],
		['After', matchedStatistics.treated]
	] as const) {
		paragraphs.push(`${side}: ${gradeHeadline(stats.grade)}. ${gradeSentences(stats.grade).join(' ')}`);
	}
	const midBefore = matchedStatistics.baseline.midFrequency;
	const midAfter = matchedStatistics.treated.midFrequency;
	if (midBefore || midAfter) {
		paragraphs.push(`Mid-frequency reverberation time Tmid (mean of 500 Hz and 1 kHz): ${formatSeconds(midBefore?.valueS)} s before, ${formatSeconds(midAfter?.valueS)} s after.`);
	}
	drawParagraphs(pen, paragraphs);
	if (matchedPositions.length === 0) return;
	const s = (v: number) => formatSeconds(v);
	const rows = matchedStatistics.baseline.bands.map((before) => {
		const after = matchedStatistics.treated.bands.find((b) => sameBand(b.centerHz, before.centerHz));
		const judged = reverberationJudgement(judgements.find((j) => sameBand(j.centerHz, before.centerHz)));
		return [
			formatBand(before.centerHz),
			formatSpread(before.metrics.t30S, s),
			formatSpread(after?.metrics.t30S, s),
			formatSeconds(before.metrics.t20S.mean),
			formatSeconds(after?.metrics.t20S.mean),
			formatNumber(after?.uncertainty.t30S ?? after?.uncertainty.t20S, 3),
			judged ? `${SPREAD_VERDICT[judged.verdict]}${judged.metric === 't20S' ? ' (T20)' : ''}` : MISSING
		];
	});
	pen.gap(4);
	drawTable(
		pen,
		[
			{ header: 'Band', weight: 0.8, face: 'mono' },
			{ header: 'T30 before (s, 95 %)', weight: 1.35, align: 'right', face: 'mono' },
			{ header: 'T30 after (s, 95 %)', weight: 1.35, align: 'right', face: 'mono' },
			{ header: 'T20 before (s)', weight: 1, align: 'right', face: 'mono' },
			{ header: 'T20 after (s)', weight: 1, align: 'right', face: 'mono' },
			{ header: 'ISO uncertainty after (s)', weight: 1.2, align: 'right', face: 'mono' },
			{ header: 'The change', weight: 1.3 }
		],
		rows
	);
	pen.gap(4);
	for (const note of [
		'Mean ± half-width of its 95 % confidence interval over the positions (Student t). ISO uncertainty: the standard uncertainty of the averaged T30 (T20 where T30 is missing) from bandwidth and number of decays, ISO 3382-2.',
		'Within the spread: the change is no larger than the scatter between positions (95 % interval of the difference of the means), so it may not be real. Below the JND: larger than that but under what a listener would notice (ISO 3382-1: 5 % for reverberation times).'
	])
		pen.use('prose', TYPE.small, COLOURS.inkSoft).flow(note);
}

export function drawSummary(pen: ReportPen, summary: readonly string[]): void {
	drawHeading(pen, 'In short', 30);
	if (summary.length === 0) drawParagraphs(pen, ['No summary has been written for this comparison.'], COLOURS.inkSoft);
	else drawBullets(pen, summary);
}

export function drawCharts(pen: ReportPen, report: ReportContent, rows: readonly ReportBandRow[]): void {
	const { baseline, treated, target } = report.comparison;
	const beforeResponse = smoothedResponse(baseline);
	const afterResponse = smoothedResponse(treated);
	drawHeading(pen, 'Before and after', RESPONSE_CHART_HEIGHT);
	const responseTop = pen.y;
	drawResponseChart(
		pen,
		{ x: pen.left, y: responseTop, width: pen.width, height: RESPONSE_CHART_HEIGHT },
		{
			title: 'Frequency response, average of the positions (1/6-octave smoothing)',
			before: beforeResponse,
			after: afterResponse,
			beforeLabel: visitLabel('Before', baseline, beforeResponse !== null),
			afterLabel: visitLabel('After', treated, afterResponse !== null),
			problemBands: report.problemBands
		}
	);
	pen.y = responseTop + RESPONSE_CHART_HEIGHT + CHART_GAP;

	pen.ensureSpace(BAND_CHART_HEIGHT);
	const bandTop = pen.y;
	const halfWidth = (pen.width - CHART_GAP) / 2;
	const pointsOf = (value: (row: ReportBandRow) => number | null) => rows.map((row) => ({ centerHz: row.centerHz, value: value(row) }));
	drawBandChart(
		pen,
		{ x: pen.left, y: bandTop, width: halfWidth, height: BAND_CHART_HEIGHT },
		{
			title: 'Reverberation time per octave band',
			yTitle: usesT20Fallback(rows) ? 'T30, T20* (s)' : 'T30 (s)',
			before: pointsOf((row) => row.before.valueS),
			after: pointsOf((row) => row.after.valueS),
			beforeLabel: 'Before',
			afterLabel: 'After',
			target,
			decimals: 1,
			axisFromZero: true
		}
	);
	drawBandChart(
		pen,
		{ x: pen.left + halfWidth + CHART_GAP, y: bandTop, width: halfWidth, height: BAND_CHART_HEIGHT },
		{
			title: 'Clarity C80 per octave band',
			yTitle: 'C80 (dB)',
			before: pointsOf((row) => row.c80BeforeDb),
			after: pointsOf((row) => row.c80AfterDb),
			beforeLabel: 'Before',
			afterLabel: 'After',
			target: [],
			decimals: 0,
			axisFromZero: false
		}
	);
	pen.y = bandTop + BAND_CHART_HEIGHT;
}

function reverberationCell(value: ReverberationValue): string {
	const text = formatSeconds(value.valueS);
	return value.metric === 't20S' ? `${text}*` : text;
}

const BAND_COLUMNS: Record<string, TableColumn> = {
	band: { header: 'Band', weight: 0.8, face: 'mono' },
	before: { header: 'T30 before (s)', weight: 1, align: 'right', face: 'mono' },
	after: { header: 'T30 after (s)', weight: 1, align: 'right', face: 'mono' },
	change: { header: 'Change (s)', weight: 0.9, align: 'right', face: 'mono' },
	changePct: { header: 'Change (%)', weight: 0.9, align: 'right', face: 'mono' },
	target: { header: 'Target (s)', weight: 1.1, align: 'right', face: 'mono' },
	verdict: { header: 'After vs target', weight: 1.25 },
	c80Before: { header: 'C80 before (dB)', weight: 1, align: 'right', face: 'mono' },
	c80After: { header: 'C80 after (dB)', weight: 1, align: 'right', face: 'mono' }
};

/** The band table's cells, keyed like BAND_COLUMNS. */
function bandCells(row: ReportBandRow): Record<keyof typeof BAND_COLUMNS, string> {
	return {
		band: formatBand(row.centerHz),
		before: reverberationCell(row.before),
		after: reverberationCell(row.after),
		change: formatSigned(row.differenceS, 2),
		changePct: formatSigned(row.relativeChange === null ? null : row.relativeChange * 100, 0),
		target: row.target ? formatRange(row.target.lowerS, row.target.upperS, formatSeconds) : MISSING,
		verdict: row.target ? verdictWords(row.verdictAfter) : MISSING,
		c80Before: formatDb(row.c80BeforeDb),
		c80After: formatDb(row.c80AfterDb)
	};
}

export function drawBandTable(pen: ReportPen, rows: readonly ReportBandRow[], hasTarget: boolean): void {
	drawHeading(pen, 'Band by band', 50);
	if (rows.length === 0) {
		drawParagraphs(pen, ['No band values were measured for these visits.'], COLOURS.inkSoft);
		return;
	}
	// Without a target its two columns would only hold dashes: they are left out.
	const keys = Object.keys(BAND_COLUMNS).filter((key) => hasTarget || (key !== 'target' && key !== 'verdict'));
	drawTable(
		pen,
		keys.map((key) => BAND_COLUMNS[key]),
		rows.map((row) => {
			const cells = bandCells(row);
			return keys.map((key) => cells[key]);
		})
	);
	const notes: string[] = [];
	if (usesT20Fallback(rows)) notes.push('* T20: the dynamic range of this band did not allow T30.');
	if (!hasTarget) notes.push('No target reverberation time was set for this room.');
	notes.push('Change is after minus before, in seconds and as a share of the time before. — marks a value that could not be measured.');
	pen.gap(4);
	for (const note of notes) pen.use('prose', TYPE.small, COLOURS.inkSoft).flow(note);
}

export function drawProblemBands(pen: ReportPen, problemBands: readonly ProblemBandView[]): void {
	drawHeading(pen, 'Problem bands', 40);
	if (problemBands.length === 0) {
		drawParagraphs(pen, ['No problem bands were marked for this room.'], COLOURS.inkSoft);
		return;
	}
	drawTable(
		pen,
		[
			{ header: '#', weight: 0.35, face: 'mono' },
			{ header: 'Frequency', weight: 1.3, face: 'mono' },
			{ header: 'Time', weight: 1.05, face: 'mono' },
			{ header: 'Severity', weight: 0.85 },
			{ header: 'Note', weight: 3.4 },
			{ header: 'Status', weight: 0.85 }
		],
		problemBands.map((band, index) => [
			String(index + 1),
			formatHzRange(band.fLoHz, band.fHiHz),
			formatMsRange(band.tLoMs, band.tHiMs),
			capitalise(band.severity),
			band.note.trim().length > 0 ? band.note : MISSING,
			capitalise(band.status)
		])
	);
}

/** The engine's notes on the measurements behind the numbers, per visit and position. */
export function drawQualityNotes(pen: ReportPen, notes: readonly ReportQualityNote[]): void {
	if (notes.length === 0) return;
	drawHeading(pen, 'Notes on the measurements');
	drawBullets(
		pen,
		notes.map((n) => `${n.condition}, ${n.positionLabel}: ${n.messages.join(' · ')}`),
		COLOURS.inkSoft
	);
}

export function drawAdvice(pen: ReportPen, advice: string): void {
	drawHeading(pen, 'Advice');
	const paragraphs = splitParagraphs(advice);
	if (paragraphs.length === 0) drawParagraphs(pen, ['No advice has been written yet.'], COLOURS.inkSoft);
	else drawParagraphs(pen, paragraphs);
}

/** The plan: its items as bullets, then per band the time before, predicted, the target and the result. */
export function drawPlan(pen: ReportPen, plan: ReportPlan): void {
	drawHeading(pen, plan.title, 40);
	if (plan.lines.length === 0) drawParagraphs(pen, ['No steps listed.'], COLOURS.inkSoft);
	else drawBullets(pen, plan.lines, COLOURS.inkSoft);
	if (plan.cost) drawParagraphs(pen, [plan.cost]);
	const bands = plan.bands ?? [];
	if (bands.length > 0) {
		const measuredAfter = bands.some((b) => b.measuredAfterS !== null);
		const columns: TableColumn[] = [
			{ header: 'Band', weight: 0.8, face: 'mono' },
			{ header: 'Before (s)', weight: 1, align: 'right', face: 'mono' },
			{ header: 'Predicted (s)', weight: 1, align: 'right', face: 'mono' },
			{ header: 'Target (s)', weight: 1.1, align: 'right', face: 'mono' },
			...(measuredAfter
				? [
						{ header: 'Measured after (s)', weight: 1.2, align: 'right', face: 'mono' } as TableColumn,
						{ header: 'Difference (s)', weight: 1.1, align: 'right', face: 'mono' } as TableColumn
					]
				: [])
		];
		pen.gap(4);
		drawTable(
			pen,
			columns,
			bands.map((b) => [
				formatBand(b.bandHz),
				formatSeconds(b.measuredBeforeS),
				formatSeconds(b.predictedS),
				b.target ? formatRange(b.target.lowerS, b.target.upperS, formatSeconds) : MISSING,
				...(measuredAfter ? [formatSeconds(b.measuredAfterS), formatSigned(b.differenceS, 2)] : [])
			])
		);
	}
	if (plan.method) {
		pen.gap(4);
		pen.use('prose', TYPE.small, COLOURS.inkSoft).flow(plan.method);
	}
}

export function drawMethod(pen: ReportPen, report: ReportContent, rows: readonly ReportBandRow[]): void {
	drawHeading(pen, 'Method');
	drawParagraphs(pen, methodParagraphs(report.comparison, rows, report.targetBasis));
}

export function drawSafety(pen: ReportPen): void {
	drawHeading(pen, 'Safety');
	drawParagraphs(pen, SAFETY_PARAGRAPHS);
}

/** All sections in order. */
export function drawReport(pen: ReportPen, report: ReportContent): void {
	const rows = reportBandRows(report.comparison);
	drawTitleBlock(pen, report);
	drawSummary(pen, report.comparison.summary);
	drawCharts(pen, report, rows);
	drawBandTable(pen, rows, report.comparison.target.length > 0);
	drawSpread(pen, report);
	drawProblemBands(pen, report.problemBands);
	drawQualityNotes(pen, report.qualityNotes);
	drawAdvice(pen, report.advice);
	if (report.plan) drawPlan(pen, report.plan);
	drawMethod(pen, report, rows);
	drawSafety(pen);
}
