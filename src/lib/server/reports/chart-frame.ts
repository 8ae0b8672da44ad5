// The parts every report chart shares: title, legend, plot frame with grid, tick labels and
// axis titles, series lines that break at missing values, and an empty-chart message.
import type { ReportPen } from './pen';
import type { PlotArea, Scale } from './scales';
import { COLOURS, TYPE } from './theme';

export interface AxisTick {
	value: number;
	label: string;
}

export interface Axis {
	scale: Scale;
	ticks: AxisTick[];
	title: string;
}

export interface LegendEntry {
	label: string;
	colour: string;
	style: 'line' | 'dashed' | 'band' | 'shade';
}

export interface ChartBox {
	x: number;
	y: number;
	width: number;
	height: number;
}

// Room around the plot for its labels, in points.
const TITLE_HEIGHT = 13;
const LEGEND_HEIGHT = 12;
const LEFT_LABELS = 34;
const BOTTOM_LABELS = 24;
const RIGHT_PAD = 6;

/** The plot area inside a chart box, leaving room for title, legend and axis labels. */
export function plotAreaOf(box: ChartBox): PlotArea {
	const top = box.y + TITLE_HEIGHT + LEGEND_HEIGHT + 4;
	return {
		x: box.x + LEFT_LABELS,
		y: top,
		width: box.width - LEFT_LABELS - RIGHT_PAD,
		height: box.y + box.height - BOTTOM_LABELS - top
	};
}

export function drawChartTitle(pen: ReportPen, box: ChartBox, title: string): void {
	pen.use('proseBold', TYPE.body, COLOURS.ink).text(title, box.x, box.y, { width: box.width, lineBreak: false });
}

/** Legend entries in one row under the title, left to right. */
export function drawLegend(pen: ReportPen, box: ChartBox, entries: LegendEntry[]): void {
	const { doc } = pen;
	const y = box.y + TITLE_HEIGHT + 2;
	let x = box.x + LEFT_LABELS;
	pen.use('prose', TYPE.small, COLOURS.inkSoft);
	for (const entry of entries) {
		const swatchY = y + 4;
		doc.save();
		if (entry.style === 'band' || entry.style === 'shade') {
			doc.rect(x, swatchY - 3.5, 14, 7).fillOpacity(entry.style === 'band' ? 0.18 : 0.1).fill(entry.colour);
			if (entry.style === 'band') doc.moveTo(x, swatchY).lineTo(x + 14, swatchY).lineWidth(1).dash(2, { space: 1.5 }).strokeOpacity(1).stroke(entry.colour);
		} else {
			doc.moveTo(x, swatchY).lineTo(x + 14, swatchY).lineWidth(1.6);
			if (entry.style === 'dashed') doc.dash(3.5, { space: 2 });
			doc.stroke(entry.colour);
		}
		doc.restore();
		pen.use('prose', TYPE.small, COLOURS.inkSoft).text(entry.label, x + 18, y, { lineBreak: false });
		x += 18 + pen.widthOf(entry.label) + 12;
	}
}

/** Frame, grid lines at the ticks, tick labels and axis titles. */
export function drawFrame(pen: ReportPen, plot: PlotArea, xAxis: Axis, yAxis: Axis): void {
	const { doc } = pen;
	doc.save().lineWidth(0.5).strokeColor(COLOURS.grid);
	for (const tick of xAxis.ticks) {
		const x = xAxis.scale(tick.value);
		doc.moveTo(x, plot.y).lineTo(x, plot.y + plot.height).stroke();
	}
	for (const tick of yAxis.ticks) {
		const y = yAxis.scale(tick.value);
		doc.moveTo(plot.x, y).lineTo(plot.x + plot.width, y).stroke();
	}
	doc.rect(plot.x, plot.y, plot.width, plot.height).lineWidth(0.7).stroke(COLOURS.rule);
	doc.restore();

	pen.use('mono', TYPE.axis, COLOURS.inkSoft);
	for (const tick of xAxis.ticks) {
		if (tick.label === '') continue;
		const x = xAxis.scale(tick.value);
		pen.text(tick.label, x - 20, plot.y + plot.height + 3, { width: 40, align: 'center', lineBreak: false });
	}
	for (const tick of yAxis.ticks) {
		const y = yAxis.scale(tick.value);
		pen.text(tick.label, plot.x - 32, y - 3, { width: 29, align: 'right', lineBreak: false });
	}

	pen.use('prose', TYPE.small, COLOURS.inkSoft);
	pen.text(xAxis.title, plot.x, plot.y + plot.height + 13, { width: plot.width, align: 'center', lineBreak: false });
	// The y title runs upwards along the left edge.
	const titleX = plot.x - LEFT_LABELS;
	const titleY = plot.y + plot.height;
	doc.save().rotate(-90, { origin: [titleX, titleY] });
	pen.text(yAxis.title, titleX, titleY, { width: plot.height, align: 'center', lineBreak: false });
	doc.restore();
}

/** Confines drawing to the plot area until the returned function is called. */
export function clipToPlot(pen: ReportPen, plot: PlotArea): () => void {
	pen.doc.save().rect(plot.x, plot.y, plot.width, plot.height).clip();
	return () => pen.doc.restore();
}

/** A polyline through the points, broken where a point is missing. */
export function drawLine(
	pen: ReportPen,
	points: ({ x: number; y: number } | null)[],
	style: { colour: string; width: number; dash?: [number, number] }
): void {
	const { doc } = pen;
	doc.save().lineWidth(style.width).lineJoin('round').lineCap('round');
	if (style.dash) doc.dash(style.dash[0], { space: style.dash[1] });
	let open = false;
	let drawn = false;
	for (const point of points) {
		if (point === null) {
			open = false;
			continue;
		}
		if (open) doc.lineTo(point.x, point.y);
		else doc.moveTo(point.x, point.y);
		open = true;
		drawn = true;
	}
	if (drawn) doc.stroke(style.colour);
	doc.restore();
}

export function drawMarkers(pen: ReportPen, points: { x: number; y: number }[], colour: string, filled: boolean): void {
	const { doc } = pen;
	doc.save().lineWidth(1);
	for (const point of points) {
		doc.circle(point.x, point.y, 2.2);
		if (filled) doc.fill(colour);
		else doc.fillAndStroke('#ffffff', colour);
	}
	doc.restore();
}

export function drawNoData(pen: ReportPen, plot: PlotArea, message: string): void {
	pen.use('prose', TYPE.small, COLOURS.inkFaint).text(message, plot.x, plot.y + plot.height / 2 - 4, {
		width: plot.width,
		align: 'center',
		lineBreak: false
	});
}
