// Marks drawn straight onto a uPlot canvas in its draw hooks: shaded ranges, reference lines
// and small labels. Coordinates are canvas (device) pixels.
import type uPlot from 'uplot';
import { AXIS_FONT, pixelRatio } from './plot-options';

/** Shades [from, to] of the x scale over the plot's full height; returns the pixel span drawn, or null if off the plot. */
export function shadeXRange(u: uPlot, from: number, to: number, fill: string, edge?: string): [number, number] | null {
	const { left, top, width, height } = u.bbox;
	const a = Math.max(left, Math.min(u.valToPos(from, 'x', true), u.valToPos(to, 'x', true)));
	const b = Math.min(left + width, Math.max(u.valToPos(from, 'x', true), u.valToPos(to, 'x', true)));
	if (!(b > a)) return null;
	const ctx = u.ctx;
	ctx.save();
	ctx.fillStyle = fill;
	ctx.fillRect(a, top, b - a, height);
	if (edge) {
		ctx.strokeStyle = edge;
		ctx.lineWidth = pixelRatio(u);
		ctx.beginPath();
		ctx.moveTo(a, top);
		ctx.lineTo(a, top + height);
		ctx.moveTo(b, top);
		ctx.lineTo(b, top + height);
		ctx.stroke();
	}
	ctx.restore();
	return [a, b];
}

export interface LineStyle {
	colour: string;
	dash?: number[];
	width?: number;
}

function strokeLine(u: uPlot, x0: number, y0: number, x1: number, y1: number, style: LineStyle): void {
	const ratio = pixelRatio(u);
	const ctx = u.ctx;
	ctx.save();
	ctx.strokeStyle = style.colour;
	ctx.lineWidth = (style.width ?? 1) * ratio;
	ctx.setLineDash((style.dash ?? []).map((d) => d * ratio));
	ctx.beginPath();
	ctx.moveTo(x0, y0);
	ctx.lineTo(x1, y1);
	ctx.stroke();
	ctx.restore();
}

/** Vertical line at x on the x scale; returns its pixel x, or null off the plot. */
export function verticalLine(u: uPlot, x: number, style: LineStyle): number | null {
	const px = u.valToPos(x, 'x', true);
	const { left, top, width, height } = u.bbox;
	if (!(px >= left && px <= left + width)) return null;
	strokeLine(u, px, top, px, top + height, style);
	return px;
}

/** Horizontal line at y on the given scale; returns its pixel y, or null off the plot. */
export function horizontalLine(u: uPlot, y: number, scale: string, style: LineStyle): number | null {
	const py = u.valToPos(y, scale, true);
	const { left, top, width, height } = u.bbox;
	if (!(py >= top && py <= top + height)) return null;
	strokeLine(u, left, py, left + width, py, style);
	return py;
}

/** Small text in the axis font on a paper-coloured backing so it reads over curves. */
export function smallLabel(u: uPlot, text: string, x: number, y: number, colour: string, align: CanvasTextAlign = 'left', backing?: string): void {
	const ratio = pixelRatio(u);
	const ctx = u.ctx;
	ctx.save();
	ctx.font = AXIS_FONT.replace(/^(\d+)px/, (_m, size: string) => `${Number(size) * ratio}px`);
	ctx.textAlign = align;
	ctx.textBaseline = 'top';
	if (backing) {
		const width = ctx.measureText(text).width;
		const startX = align === 'left' ? x : align === 'right' ? x - width : x - width / 2;
		ctx.fillStyle = backing;
		ctx.fillRect(startX - 2 * ratio, y - 1 * ratio, width + 4 * ratio, 13 * ratio);
	}
	ctx.fillStyle = colour;
	ctx.fillText(text, x, y);
	ctx.restore();
}

/** Width of text in the axis font, in canvas pixels. */
export function textWidth(u: uPlot, text: string): number {
	const ratio = pixelRatio(u);
	const ctx = u.ctx;
	ctx.save();
	ctx.font = AXIS_FONT.replace(/^(\d+)px/, (_m, size: string) => `${Number(size) * ratio}px`);
	const width = ctx.measureText(text).width;
	ctx.restore();
	return width;
}
