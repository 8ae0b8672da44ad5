// Chart (a): the averaged frequency response of both visits on a log-frequency axis, with the
// consultant's problem bands shaded and numbered as in the problem-band table.
import { linearTicks, octaveTicks } from '../../charts/ticks';
import { formatHzAxis, formatNumber } from '../../format';
import type { ProblemBandView } from '../../results/types';
import { clipToPlot, drawChartTitle, drawFrame, drawLegend, drawLine, drawNoData, plotAreaOf, type ChartBox, type LegendEntry } from './chart-frame';
import type { ReportPen } from './pen';
import type { ResponseCurve } from './report-data';
import { extent, gridRange, linearScale, logScale } from './scales';
import { BEFORE_DASH, COLOURS, PROBLEM_SHADE_OPACITY, TYPE } from './theme';

/** The audio range the axis spans. */
const FREQUENCY_DOMAIN: [number, number] = [20, 20000];
const DB_GRID = 10;
const MIN_SPAN_DB = 30;
const MAX_SPAN_DB = 60;

export interface ResponseChartInput {
	title: string;
	before: ResponseCurve | null;
	after: ResponseCurve | null;
	beforeLabel: string;
	afterLabel: string;
	/** In the order the problem-band table numbers them. */
	problemBands: ProblemBandView[];
}

function levelsInDomain(curve: ResponseCurve | null): number[] {
	if (curve === null) return [];
	return curve.db.filter((_, i) => curve.freqHz[i] >= FREQUENCY_DOMAIN[0] && curve.freqHz[i] <= FREQUENCY_DOMAIN[1]);
}

export function drawResponseChart(pen: ReportPen, box: ChartBox, input: ResponseChartInput): void {
	const plot = plotAreaOf(box);
	const x = logScale(FREQUENCY_DOMAIN, [plot.x, plot.x + plot.width]);
	const dataExtent = extent([levelsInDomain(input.before), levelsInDomain(input.after)]);
	const [dbLo, dbHi] = dataExtent === null ? [-30, 0] : gridRange(dataExtent, DB_GRID, MIN_SPAN_DB, MAX_SPAN_DB);
	const y = linearScale([dbLo, dbHi], [plot.y + plot.height, plot.y]);

	drawChartTitle(pen, box, input.title);
	const legend: LegendEntry[] = [
		{ label: input.beforeLabel, colour: COLOURS.before, style: 'dashed' },
		{ label: input.afterLabel, colour: COLOURS.after, style: 'line' }
	];
	if (input.problemBands.length > 0) legend.push({ label: 'Problem band', colour: COLOURS.problem, style: 'shade' });
	drawLegend(pen, box, legend);

	const unclip = clipToPlot(pen, plot);
	// Numbers of close bands go to a second row; where both rows are taken the number is left out.
	const rowRightEdges = [-Infinity, -Infinity];
	input.problemBands.forEach((band, index) => {
		const lo = Math.max(band.fLoHz, FREQUENCY_DOMAIN[0]);
		const hi = Math.min(band.fHiHz, FREQUENCY_DOMAIN[1]);
		if (!(hi > lo)) return;
		pen.doc.save().rect(x(lo), plot.y, Math.max(x(hi) - x(lo), 1.5), plot.height).fillOpacity(PROBLEM_SHADE_OPACITY[band.severity]).fill(COLOURS.problem).restore();
		const label = String(index + 1);
		const halfWidth = pen.use('monoBold', TYPE.axis, COLOURS.ink).widthOf(label) / 2 + 1;
		const centre = (x(lo) + x(hi)) / 2;
		const row = rowRightEdges.findIndex((right) => centre - halfWidth > right);
		if (row < 0) return;
		rowRightEdges[row] = centre + halfWidth;
		pen.text(label, centre - 10, plot.y + 3 + row * (TYPE.axis + 2), { width: 20, align: 'center', lineBreak: false });
	});
	unclip();

	drawFrame(
		pen,
		plot,
		{ scale: x, title: 'Frequency (Hz)', ticks: octaveTicks(...FREQUENCY_DOMAIN).map((f) => ({ value: f, label: formatHzAxis(f) })) },
		{ scale: y, title: 'Level, dB (relative)', ticks: linearTicks(dbLo, dbHi, DB_GRID).map((v) => ({ value: v, label: formatNumber(v, 0) })) }
	);

	const unclipLines = clipToPlot(pen, plot);
	const pointsOf = (curve: ResponseCurve) =>
		curve.freqHz.map((f, i) => (f > 0 && Number.isFinite(curve.db[i]) ? { x: x(f), y: y(curve.db[i]) } : null));
	if (input.before) drawLine(pen, pointsOf(input.before), { colour: COLOURS.before, width: 1.1, dash: BEFORE_DASH });
	if (input.after) drawLine(pen, pointsOf(input.after), { colour: COLOURS.after, width: 1.5 });
	unclipLines();

	if (dataExtent === null) drawNoData(pen, plot, 'No averaged response was measured for these visits.');
}
