// Canvas marks of the response chart: room-mode ticks along the bottom and problem bands.
import type uPlot from 'uplot';
import { shadeXRange, smallLabel, textWidth } from './canvas-marks';
import { CHART_COLOURS, SEVERITY_STYLE, type Severity } from './palette';
import { pixelRatio } from './plot-options';
import { MODE_TICK_PX, type ModeMarker } from './response-data';

const MODE_COLOURS = { axial: CHART_COLOURS.ink, tangential: CHART_COLOURS.inkSoft, oblique: CHART_COLOURS.inkFaint } as const;

export function drawModeTicks(u: uPlot, modes: readonly ModeMarker[]): void {
	if (modes.length === 0) return;
	const ratio = pixelRatio(u);
	const bottom = u.bbox.top + u.bbox.height;
	const ctx = u.ctx;
	ctx.save();
	ctx.lineWidth = 1.5 * ratio;
	for (const mode of modes) {
		const x = u.valToPos(mode.freqHz, 'x', true);
		if (x < u.bbox.left || x > u.bbox.left + u.bbox.width) continue;
		ctx.strokeStyle = MODE_COLOURS[mode.kind];
		ctx.beginPath();
		ctx.moveTo(x, bottom);
		ctx.lineTo(x, bottom - MODE_TICK_PX[mode.kind] * ratio);
		ctx.stroke();
	}
	ctx.restore();
}

export interface ShadedBand {
	id: number;
	fLoHz: number;
	fHiHz: number;
	severity: Severity;
	label: string;
}

/** Shades each band and writes "#id note" (or just "#id") at its top when it fits. */
export function shadeProblemBands(u: uPlot, bands: readonly ShadedBand[]): void {
	const ratio = pixelRatio(u);
	for (const band of bands) {
		const style = SEVERITY_STYLE[band.severity];
		const span = shadeXRange(u, band.fLoHz, band.fHiHz, style.fill, style.edge);
		if (!span) continue;
		const room = span[1] - span[0] - 6 * ratio;
		const full = `#${band.id} ${band.label}`;
		const text = textWidth(u, full) <= room ? full : textWidth(u, `#${band.id}`) <= room ? `#${band.id}` : null;
		if (text) smallLabel(u, text, span[0] + 3 * ratio, u.bbox.top + 3 * ratio, style.edge);
	}
}
