// Fitting a square panel into a recess that is not: from the recess's widths at top and bottom
// and heights at left and right (and, if measured, one diagonal), its corners; the largest level
// panel that fits with a clearance all round; the shim at each corner of the unit set against the
// left side; and the trim strips that hide the gaps. Plane geometry (circle intersections); the
// clearance and the trim's lap are the builder's (common practice, no source). Millimetres,
// x to the right from the bottom-left corner, y up.
import { DRAWING_FONT, escapeXml, line, PALETTE, px, rect, text } from './svg';
import { formatLength, type LengthUnit } from './units';

export interface OpeningMeasurements {
	widthTopMm: number;
	widthBottomMm: number;
	heightLeftMm: number;
	heightRightMm: number;
	/** Bottom left to top right; without it the bottom is taken as level and the left side plumb. */
	diagonalMm: number | null;
	clearanceMm: number;
}

export interface Pt {
	x: number;
	y: number;
}

export type Corner = 'bottom left' | 'bottom right' | 'top right' | 'top left';

export interface OpeningFit {
	corners: Record<Corner, Pt>;
	/** Largest level panel that fits with the clearance all round, and where it sits. */
	largest: { x: number; y: number; widthMm: number; heightMm: number };
	/** The unit as placed: against the left side at the clearance, on the bottom clearance. */
	unit: { x: number; y: number; widthMm: number; heightMm: number };
	fits: boolean;
	/** Gap between the unit's side and the recess at each corner: the shim that packs it. */
	shims: { corner: Corner; thicknessMm: number }[];
	/** Trim strips, a picture frame round the unit: the top and bottom run over the ends of the sides. */
	trims: { side: 'top' | 'bottom' | 'left' | 'right'; lengthMm: number; widthMm: number; gapMm: number }[];
}

/** How far a trim strip laps over the unit's face and over the wall beyond the gap (common practice, no source). */
export const TRIM_LAP_MM = 10;

/** Both intersections of two circles, or null when they do not meet. */
export function circleIntersections(p0: Pt, r0: number, p1: Pt, r1: number): [Pt, Pt] | null {
	const dx = p1.x - p0.x;
	const dy = p1.y - p0.y;
	const d = Math.hypot(dx, dy);
	if (d === 0) return null;
	const a = (r0 * r0 - r1 * r1 + d * d) / (2 * d);
	const h2 = r0 * r0 - a * a;
	if (h2 < -1e-9) return null;
	const h = Math.sqrt(Math.max(0, h2));
	const mx = p0.x + (a * dx) / d;
	const my = p0.y + (a * dy) / d;
	return [
		{ x: mx - (h * dy) / d, y: my + (h * dx) / d },
		{ x: mx + (h * dy) / d, y: my - (h * dx) / d }
	];
}

function positive(v: number, what: string): void {
	if (!(Number.isFinite(v) && v > 0)) throw new Error(`${what} must be a positive number of mm, got ${v}`);
}

const NOT_CLOSING = 'these measurements do not close into a four-sided opening; measure again';

/** The four corners from the measurements. */
export function openingCorners(m: OpeningMeasurements): Record<Corner, Pt> {
	positive(m.widthTopMm, 'the width at the top');
	positive(m.widthBottomMm, 'the width at the bottom');
	positive(m.heightLeftMm, 'the height at the left');
	positive(m.heightRightMm, 'the height at the right');
	const bl = { x: 0, y: 0 };
	const br = { x: m.widthBottomMm, y: 0 };
	let tl: Pt;
	let tr: Pt;
	const upper = (pts: [Pt, Pt] | null) => {
		if (!pts) throw new Error(NOT_CLOSING);
		return pts[0].y >= pts[1].y ? pts[0] : pts[1];
	};
	if (m.diagonalMm === null) {
		tl = { x: 0, y: m.heightLeftMm };
		tr = upper(circleIntersections(tl, m.widthTopMm, br, m.heightRightMm));
	} else {
		positive(m.diagonalMm, 'the diagonal');
		tr = upper(circleIntersections(bl, m.diagonalMm, br, m.heightRightMm));
		const pts = circleIntersections(bl, m.heightLeftMm, tr, m.widthTopMm);
		if (!pts) throw new Error(NOT_CLOSING);
		// The top-left corner lies left of the diagonal from bottom left to top right.
		const left = (p: Pt) => tr.x * p.y - tr.y * p.x;
		tl = left(pts[0]) >= left(pts[1]) ? pts[0] : pts[1];
	}
	if (!(tr.y > 0 && tl.y > 0 && tr.x > tl.x)) throw new Error(NOT_CLOSING);
	return { 'bottom left': bl, 'bottom right': br, 'top right': tr, 'top left': tl };
}

export function fitOpening(m: OpeningMeasurements, unitSize?: { widthMm: number; heightMm: number }): OpeningFit {
	if (!(Number.isFinite(m.clearanceMm) && m.clearanceMm >= 0)) throw new Error(`the clearance must be zero or more, got ${m.clearanceMm} mm`);
	const corners = openingCorners(m);
	const { 'bottom left': bl, 'bottom right': br, 'top right': tr, 'top left': tl } = corners;
	const c = m.clearanceMm;
	const xL = (y: number) => bl.x + ((tl.x - bl.x) * y) / tl.y;
	const xR = (y: number) => br.x + ((tr.x - br.x) * y) / tr.y;
	const topY = (x: number) => tl.y + ((tr.y - tl.y) * (x - tl.x)) / (tr.x - tl.x);
	// Largest level rectangle on the bottom clearance: the sides are straight, so the narrowest
	// width is at one end of the panel's height and the lowest top at one end of its width.
	const y0 = c;
	let h = Math.min(tl.y, tr.y) - 2 * c;
	let x0 = 0;
	let x1 = 0;
	for (let i = 0; i < 50; i++) {
		x0 = Math.max(xL(y0), xL(y0 + h)) + c;
		x1 = Math.min(xR(y0), xR(y0 + h)) - c;
		const next = Math.min(topY(x0), topY(x1)) - c - y0;
		if (Math.abs(next - h) < 1e-9) break;
		h = next;
	}
	if (!(h > 0 && x1 > x0)) throw new Error('the clearance leaves no room for a panel in this opening');
	const largest = { x: x0, y: y0, widthMm: x1 - x0, heightMm: h };
	const size = unitSize ?? { widthMm: largest.widthMm, heightMm: largest.heightMm };
	positive(size.widthMm, 'the unit width');
	positive(size.heightMm, 'the unit height');
	const unit = { x: x0, y: y0, ...size };
	const fits = size.widthMm <= largest.widthMm + 1e-6 && size.heightMm <= largest.heightMm + 1e-6;
	const ux1 = unit.x + unit.widthMm;
	const uy1 = unit.y + unit.heightMm;
	const shims: OpeningFit['shims'] = [
		{ corner: 'bottom left', thicknessMm: unit.x - xL(unit.y) },
		{ corner: 'top left', thicknessMm: unit.x - xL(uy1) },
		{ corner: 'bottom right', thicknessMm: xR(unit.y) - ux1 },
		{ corner: 'top right', thicknessMm: xR(uy1) - ux1 }
	];
	const gap = {
		left: Math.max(shims[0].thicknessMm, shims[1].thicknessMm),
		right: Math.max(shims[2].thicknessMm, shims[3].thicknessMm),
		top: Math.max(topY(unit.x), topY(ux1)) - uy1,
		bottom: unit.y
	};
	const width = (g: number) => Math.ceil(Math.max(0, g) + 2 * TRIM_LAP_MM);
	const w = { left: width(gap.left), right: width(gap.right), top: width(gap.top), bottom: width(gap.bottom) };
	const trims: OpeningFit['trims'] = [
		{ side: 'top', lengthMm: unit.widthMm + w.left + w.right, widthMm: w.top, gapMm: gap.top },
		{ side: 'bottom', lengthMm: unit.widthMm + w.left + w.right, widthMm: w.bottom, gapMm: gap.bottom },
		{ side: 'left', lengthMm: unit.heightMm, widthMm: w.left, gapMm: gap.left },
		{ side: 'right', lengthMm: unit.heightMm, widthMm: w.right, gapMm: gap.right }
	];
	return { corners, largest, unit, fits, shims, trims };
}

/** The recess, the unit set in it, the shims at its corners and the trims, seen from the front. */
export function openingFitSvg(fit: OpeningFit, options: { unit?: LengthUnit; widthPx?: number; title?: string } = {}): string {
	const unit = options.unit ?? 'mm';
	const { corners } = fit;
	const pts = Object.values(corners);
	const maxX = Math.max(...pts.map((p) => p.x));
	const maxY = Math.max(...pts.map((p) => p.y));
	// Fit the drawing in about 360 × 300 px, whichever way the opening is longer.
	const s = Math.min((options.widthPx ?? 360) / maxX, 300 / maxY);
	const margin = { left: 70, right: 70, top: 34, bottom: 40 };
	const width = margin.left + maxX * s + margin.right;
	const height = margin.top + maxY * s + margin.bottom;
	const X = (mm: number) => margin.left + mm * s;
	const Y = (mm: number) => margin.top + (maxY - mm) * s; // y up
	const title = options.title ?? 'Fitting into the opening';
	const out: string[] = [rect(0, 0, width, height, `fill="${PALETTE.paper}"`), text(12, 18, title, `${DRAWING_FONT} font-size="11" fill="${PALETTE.ink}"`)];
	// Trims first (dashed, behind), then the recess, the unit and the shims.
	const u = fit.unit;
	const t = Object.fromEntries(fit.trims.map((tr) => [tr.side, tr]));
	const outer = { x: u.x - t.left.widthMm + TRIM_LAP_MM, y: u.y - t.bottom.widthMm + TRIM_LAP_MM };
	out.push(rect(X(outer.x), Y(outer.y + u.heightMm + t.top.widthMm + t.bottom.widthMm - 2 * TRIM_LAP_MM), t.top.lengthMm * s, (u.heightMm + t.top.widthMm + t.bottom.widthMm - 2 * TRIM_LAP_MM) * s, `fill="none" stroke="${PALETTE.muted}" stroke-width="1" stroke-dasharray="4 3"`));
	const poly = [corners['bottom left'], corners['bottom right'], corners['top right'], corners['top left']].map((p) => `${px(X(p.x))},${px(Y(p.y))}`).join(' ');
	out.push(`<polygon points="${poly}" fill="${PALETTE.fill}" stroke="${PALETTE.ink}" stroke-width="1.5"/>`);
	out.push(rect(X(u.x), Y(u.y + u.heightMm), u.widthMm * s, u.heightMm * s, `fill="${PALETTE.wood}" stroke="${fit.fits ? PALETTE.woodEdge : '#b91c1c'}" stroke-width="1.5"`));
	const shimH = Math.min(60, u.heightMm / 6);
	for (const shim of fit.shims) {
		const left = shim.corner.endsWith('left');
		const bottom = shim.corner.startsWith('bottom');
		const x = left ? u.x - shim.thicknessMm : u.x + u.widthMm;
		const y = bottom ? u.y + 20 : u.y + u.heightMm - 20 - shimH;
		if (shim.thicknessMm > 0) out.push(rect(X(x), Y(y + shimH), Math.max(shim.thicknessMm * s, 1.5), shimH * s, `fill="${PALETTE.accent}"`));
		const tx = left ? X(x) - 4 : X(x + shim.thicknessMm) + 4;
		out.push(text(tx, Y(y + shimH / 2) + 3, formatLength(shim.thicknessMm, unit), `${DRAWING_FONT} font-size="9" fill="${PALETTE.accent}" text-anchor="${left ? 'end' : 'start'}"`));
	}
	out.push(line(X(u.x), Y(0) + 14, X(u.x + u.widthMm), Y(0) + 14, `stroke="${PALETTE.ink}" stroke-width="0.75"`));
	out.push(text(X(u.x + u.widthMm / 2), Y(0) + 28, `unit ${formatLength(u.widthMm, unit)} × ${formatLength(u.heightMm, unit)}`, `${DRAWING_FONT} font-size="10" fill="${PALETTE.ink}" text-anchor="middle"`));
	return [
		`<svg xmlns="http://www.w3.org/2000/svg" width="${px(width)}" height="${px(height)}" viewBox="0 0 ${px(width)} ${px(height)}" role="img" aria-label="${escapeXml(title)}">`,
		...out,
		'</svg>'
	].join('\n');
}
