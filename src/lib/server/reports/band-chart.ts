// Charts (b) and (c): one value per octave band for both visits on a log-frequency axis,
// optionally with the target tolerance shaded and the target line.
import { linearTicks, niceStep, paddedRange } from '../../charts/ticks';
import { formatHzAxis, formatNumber } from '../../format';
import type { TargetBand } from '../../analysis/targets';
import { clipToPlot, drawChartTitle, drawFrame, drawLegend, drawLine, drawMarkers, drawNoData, plotAreaOf, type ChartBox, type LegendEntry } from './chart-frame';
import type { ReportPen } from './pen';
import { extent, linearScale, logScale } from './scales';
import { BEFORE_DASH, COLOURS } from './theme';

export interface BandPoint {
	centerHz: number;
	value: number | null;
}

export interface BandChartInput {
	title: string;
	yTitle: string;
	before: BandPoint[];
	after: BandPoint[];
	beforeLabel: string;
	afterLabel: string;
	/** Target tolerance per band; empty for none. */
	target: TargetBand[];
	/** Tick label decimals on the value axis. */
	decimals: number;
	/** Times start at zero; levels get a range around their data. */
	axisFromZero: boolean;
}

const HALF_OCTAVE = Math.SQRT2;
const MAX_VALUE_TICKS = 5;
/** Narrowest spacing, in points, that still takes a frequency label under every band. */
const MIN_LABEL_SPACING = 22;

function valueRange(input: BandChartInput): { lo: number; hi: number; step: number } | null {
	const values = [input.before, input.after].map((series) => series.map((p) => p.value));
	values.push(input.target.flatMap((t) => [t.lowerS, t.upperS]));
	const found = extent(values);
	if (found === null) return null;
	if (input.axisFromZero) {
		const top = Math.max(found[1] * 1.1, 0.1);
		const step = niceStep(top, MAX_VALUE_TICKS);
		return { lo: 0, hi: Math.ceil(top / step) * step, step };
	}
	const lo = Math.min(found[0], 0);
	const hi = Math.max(found[1], 0);
	const step = niceStep(Math.max(hi - lo, 1), MAX_VALUE_TICKS);
	const [paddedLo, paddedHi] = paddedRange(lo, hi, step);
	return { lo: paddedLo, hi: paddedHi, step };
}

export function drawBandChart(pen: ReportPen, box: ChartBox, input: BandChartInput): void {
	const plot = plotAreaOf(box);
	const centres = [...input.before, ...input.after, ...input.target]
		.map((p) => p.centerHz)
		.filter((f, i, all) => f > 0 && all.findIndex((g) => Math.abs(Math.log2(g / f)) < 1 / 12) === i)
		.sort((a, b) => a - b);

	drawChartTitle(pen, box, input.title);
	const legend: LegendEntry[] = [
		{ label: input.beforeLabel, colour: COLOURS.before, style: 'dashed' },
		{ label: input.afterLabel, colour: COLOURS.after, style: 'line' }
	];
	if (input.target.length > 0) legend.push({ label: 'Target', colour: COLOURS.target, style: 'band' });
	drawLegend(pen, box, legend);

	const range = valueRange(input);
	const domain: [number, number] = centres.length > 0 ? [centres[0] / HALF_OCTAVE, centres[centres.length - 1] * HALF_OCTAVE] : [44.2, 11314];
	const x = logScale(domain, [plot.x, plot.x + plot.width]);
	const yDomain: [number, number] = range ? [range.lo, range.hi] : [0, 1];
	const y = linearScale(yDomain, [plot.y + plot.height, plot.y]);

	if (input.target.length > 0) {
		const target = [...input.target].sort((a, b) => a.centerHz - b.centerHz);
		const first = target[0];
		const last = target[target.length - 1];
		const edgeLo = first.centerHz / HALF_OCTAVE;
		const edgeHi = last.centerHz * HALF_OCTAVE;
		const unclip = clipToPlot(pen, plot);
		const { doc } = pen;
		doc.save().moveTo(x(edgeLo), y(first.upperS));
		for (const band of target) doc.lineTo(x(band.centerHz), y(band.upperS));
		doc.lineTo(x(edgeHi), y(last.upperS)).lineTo(x(edgeHi), y(last.lowerS));
		for (const band of [...target].reverse()) doc.lineTo(x(band.centerHz), y(band.lowerS));
		doc.lineTo(x(edgeLo), y(first.lowerS)).closePath().fillOpacity(0.16).fill(COLOURS.target).restore();
		const line = [{ x: x(edgeLo), y: y(first.targetS) }, ...target.map((b) => ({ x: x(b.centerHz), y: y(b.targetS) })), { x: x(edgeHi), y: y(last.targetS) }];
		drawLine(pen, line, { colour: COLOURS.target, width: 0.9, dash: [2, 1.5] });
		unclip();
	}

	const pxPerBand = centres.length > 1 ? (x(centres[centres.length - 1]) - x(centres[0])) / (centres.length - 1) : plot.width;
	const labelStride = Math.max(1, Math.ceil(MIN_LABEL_SPACING / pxPerBand));
	drawFrame(
		pen,
		plot,
		{ scale: x, title: 'Octave band (Hz)', ticks: centres.map((f, i) => ({ value: f, label: i % labelStride === 0 ? formatHzAxis(f) : '' })) },
		{
			scale: y,
			title: input.yTitle,
			ticks: range ? linearTicks(range.lo, range.hi, range.step).map((v) => ({ value: v, label: formatNumber(v, input.decimals) })) : []
		}
	);
	if (range && !input.axisFromZero && range.lo < 0 && range.hi > 0) {
		pen.doc.save().moveTo(plot.x, y(0)).lineTo(plot.x + plot.width, y(0)).lineWidth(0.7).stroke(COLOURS.inkFaint).restore();
	}

	const pointsOf = (series: BandPoint[]) =>
		[...series].sort((a, b) => a.centerHz - b.centerHz).map((p) => (p.value === null || !Number.isFinite(p.value) ? null : { x: x(p.centerHz), y: y(p.value) }));
	const beforePoints = pointsOf(input.before);
	const afterPoints = pointsOf(input.after);
	drawLine(pen, beforePoints, { colour: COLOURS.before, width: 1.1, dash: BEFORE_DASH });
	drawLine(pen, afterPoints, { colour: COLOURS.after, width: 1.5 });
	const present = (points: ({ x: number; y: number } | null)[]) => points.filter((p): p is { x: number; y: number } => p !== null);
	drawMarkers(pen, present(beforePoints), COLOURS.before, false);
	drawMarkers(pen, present(afterPoints), COLOURS.after, true);

	if (range === null) drawNoData(pen, plot, 'No band values were measured.');
}
