// Shared uPlot settings in our look: axes in JetBrains Mono, octave ticks on log-frequency
// axes, whole-decibel ticks, and faint grids.
import uPlot from 'uplot';
import { CHART_COLOURS } from './palette';
import { dbTickStep, linearTicks, octaveLabelStride, octaveTickLabels, octaveTicks } from './ticks';
import { withAlpha } from './colour';

/** uPlot options without the size, which the plot takes from its container. */
export type PlotOptions = Omit<uPlot.Options, 'width' | 'height'>;

export const AXIS_FONT = '11px "JetBrains Mono", ui-monospace, monospace';
export const LABEL_FONT = '12px ui-sans-serif, system-ui, sans-serif';
/** Width reserved per frequency label ("31.5", "12.5k" at 11 px mono plus a gap). */
const FREQUENCY_LABEL_PX = 40;

const GRID = { stroke: withAlpha(CHART_COLOURS.ink, 0.08), width: 1 };
const TICKS = { stroke: withAlpha(CHART_COLOURS.ink, 0.25), width: 1, size: 4 };

function baseAxis(): uPlot.Axis {
	return { stroke: CHART_COLOURS.inkSoft, font: AXIS_FONT, labelFont: LABEL_FONT, grid: GRID, ticks: TICKS, gap: 4 };
}

/** x axis on a log scale with octave ticks; labels thin out to every second or third octave on narrow plots. */
export function logFrequencyAxis(label = 'Frequency (Hz)'): uPlot.Axis {
	return {
		...baseAxis(),
		label,
		labelSize: 18,
		size: 30,
		splits: (_u, _axis, min, max) => octaveTicks(min, max),
		// uPlot's own filter for log axes keeps only decade-like labels; ours thins by stride instead.
		filter: (_u, splits) => splits,
		values: (u, splits) => {
			const scale = u.scales.x;
			const octaves = Math.log2((scale.max ?? 20000) / (scale.min ?? 20));
			return octaveTickLabels(splits, octaveLabelStride(plotWidthCss(u) / Math.max(octaves, 1e-6), FREQUENCY_LABEL_PX));
		}
	};
}

/** y axis in whole decibels with a step that keeps ticks ≥ 28 px apart. */
export function levelAxis(label = 'Level (dB)', scale = 'y'): uPlot.Axis {
	return {
		...baseAxis(),
		scale,
		label,
		labelSize: 18,
		size: 44,
		splits: (u, _axis, min, max) => linearTicks(min, max, dbTickStep(max - min, plotHeightCss(u))),
		values: (_u, splits) => splits.map((v) => (v < 0 ? `\u2212${Math.abs(v)}` : String(v)))
	};
}

/** Linear axis with uPlot's own steps, in our look. */
export function plainAxis(label: string, scale?: string, side?: 0 | 1 | 2 | 3): uPlot.Axis {
	return { ...baseAxis(), label, labelSize: 18, size: side === 2 || side === undefined ? 30 : 48, ...(scale ? { scale } : {}), ...(side !== undefined ? { side } : {}) };
}

/** uPlot draws in device pixels; its bbox is the CSS box scaled by this ratio. */
export function pixelRatio(_u?: uPlot): number {
	return uPlot.pxRatio || 1;
}

/**
 * Plot-area size in CSS px estimated from the chart's own size less the axes (about 60 px
 * across, 50 px down). Tick callbacks run while uPlot is still laying out, when bbox is not
 * final yet, so they use these instead.
 */
function plotWidthCss(u: uPlot): number {
	return Math.max(40, u.width - 60);
}

function plotHeightCss(u: uPlot): number {
	return Math.max(40, u.height - 50);
}
