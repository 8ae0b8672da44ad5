// Cross-section drawing of a diffuser's well profile, seen from above.
import { formatHz } from '../format';
import type { DiffuserDesign } from './diffuser';
import type { DiffuserGeometry } from './diffuser-build';
import { DRAWING_FONT, escapeXml, line, PALETTE, px, rect, text } from './svg';
import { formatLength, type LengthUnit } from './units';

export interface DiffuserProfileOptions {
	unit?: LengthUnit;
	/** Drawing scale, pixels per millimetre. */
	pxPerMm?: number;
	/** Thickness of the back board, mm (drawn below the deepest well). */
	backThicknessMm?: number;
	title?: string;
	/** The construction to draw; without it, the full-depth box. */
	geometry?: DiffuserGeometry;
}

/**
 * SVG of the profile: the open front at the top, fins as dark bars running to the back, each
 * well's bottom as a shaded block at its depth, the back board below, depths labelled per well.
 */
export function diffuserProfileSvg(design: DiffuserDesign, options: DiffuserProfileOptions = {}): string {
	const unit = options.unit ?? 'mm';
	const s = options.pxPerMm ?? 1.5;
	const back = options.backThicknessMm ?? 18;
	if (!(s > 0)) throw new Error(`drawing scale must be positive, got ${s}`);
	if (!(back >= 0)) throw new Error(`back thickness must be zero or positive, got ${back}`);
	if (options.geometry?.construction === 'low-waste') return lowWasteProfileSvg(design, options.geometry, unit, s, options.title);
	const w = design.wellWidthM * 1000;
	const t = design.finThicknessM * 1000;
	const deep = design.deepestWellM * 1000;
	const widthMm = design.panelWidthM * 1000;
	const margin = { left: 24, right: 24, top: 48, bottom: 56 };
	const fontSize = 11;
	const width = margin.left + widthMm * s + margin.right;
	const height = margin.top + (deep + back) * s + margin.bottom;
	const X = (mm: number) => margin.left + mm * s;
	const Y = (mm: number) => margin.top + mm * s;
	const parts: string[] = [];
	const title = options.title ?? `${design.kind === 'quadratic-residue' ? 'Quadratic-residue' : 'Primitive-root'} diffuser, N = ${design.prime}, f0 = ${formatHz(design.designFrequencyHz)}`;
	parts.push(rect(0, 0, width, height, `fill="${PALETTE.paper}"`));
	parts.push(text(margin.left, 20, title, `${DRAWING_FONT} font-size="${fontSize + 1}" fill="${PALETTE.ink}"`));
	// Back board.
	parts.push(rect(X(0), Y(deep), widthMm * s, back * s, `fill="${PALETTE.wood}" stroke="${PALETTE.woodEdge}" stroke-width="1"`));
	design.wellDepthsM.forEach((depthM, i) => {
		const d = depthM * 1000;
		const x0 = t + i * (w + t);
		// Solid block behind the well bottom (from its depth to the back).
		if (deep - d > 0) {
			parts.push(rect(X(x0), Y(d), w * s, (deep - d) * s, `fill="${PALETTE.fill}" stroke="${PALETTE.muted}" stroke-width="0.75"`));
		}
		parts.push(line(X(x0), Y(d), X(x0 + w), Y(d), `stroke="${PALETTE.accent}" stroke-width="2"`));
		parts.push(
			text(X(x0 + w / 2), Y(deep + back) + 16, formatLength(d, unit), `${DRAWING_FONT} font-size="${fontSize - 1}" fill="${PALETTE.ink}" text-anchor="middle"`)
		);
		parts.push(
			text(X(x0 + w / 2), Y(0) - 6, String(design.sequence[i]), `${DRAWING_FONT} font-size="${fontSize - 1}" fill="${PALETTE.muted}" text-anchor="middle"`)
		);
	});
	// Fins, one on each side and between wells.
	for (let i = 0; i <= design.wellCount; i++) {
		parts.push(rect(X(i * (w + t)), Y(0), t * s, deep * s, `fill="${PALETTE.woodEdge}"`));
	}
	// Overall width dimension.
	const yDim = Y(deep + back) + 34;
	parts.push(line(X(0), yDim, X(widthMm), yDim, `stroke="${PALETTE.ink}" stroke-width="0.75"`));
	parts.push(line(X(0), yDim - 4, X(0), yDim + 4, `stroke="${PALETTE.ink}" stroke-width="0.75"`));
	parts.push(line(X(widthMm), yDim - 4, X(widthMm), yDim + 4, `stroke="${PALETTE.ink}" stroke-width="0.75"`));
	parts.push(
		text((X(0) + X(widthMm)) / 2, yDim + 14, `panel ${formatLength(widthMm, unit)} × ${formatLength(deep + back, unit)} deep`, `${DRAWING_FONT} font-size="${fontSize}" fill="${PALETTE.ink}" text-anchor="middle"`)
	);
	return [
		`<svg xmlns="http://www.w3.org/2000/svg" width="${px(width)}" height="${px(height)}" viewBox="0 0 ${px(width)} ${px(height)}" role="img" aria-label="${escapeXml(title)}">`,
		...parts,
		'</svg>'
	].join('\n');
}

/**
 * The low-waste construction seen from above: fins only as deep as their deeper well, each
 * well's bottom strip between its fins at its depth, no back; the caps' profile dashed.
 */
function lowWasteProfileSvg(design: DiffuserDesign, g: DiffuserGeometry, unit: LengthUnit, s: number, titleText?: string): string {
	const margin = { left: 24, right: 24, top: 48, bottom: 56 };
	const fontSize = 11;
	const width = margin.left + g.panelWidthMm * s + margin.right;
	const height = margin.top + g.overallDepthMm * s + margin.bottom;
	const X = (mm: number) => margin.left + mm * s;
	const Y = (mm: number) => margin.top + mm * s;
	const title = titleText ?? `Low-waste ${design.kind === 'quadratic-residue' ? 'quadratic-residue' : 'primitive-root'} diffuser, N = ${design.prime}, f0 = ${formatHz(design.designFrequencyHz)}`;
	const out: string[] = [rect(0, 0, width, height, `fill="${PALETTE.paper}"`), text(margin.left, 20, title, `${DRAWING_FONT} font-size="${fontSize + 1}" fill="${PALETTE.ink}"`)];
	// Cap profile: the outline the top and bottom are cut to.
	const profile: string[] = [`M ${px(X(0))} ${px(Y(0))}`];
	g.fins.forEach((fin, i) => {
		profile.push(`L ${px(X(fin.xMm))} ${px(Y(fin.depthMm))}`, `L ${px(X(fin.xMm + g.finMm))} ${px(Y(fin.depthMm))}`);
		if (i < g.wells.length) {
			const well = g.wells[i];
			profile.push(`L ${px(X(well.xMm))} ${px(Y(g.capDepthAtWellMm[i]))}`, `L ${px(X(well.xMm + g.wellWidthMm))} ${px(Y(g.capDepthAtWellMm[i]))}`);
		}
	});
	profile.push(`L ${px(X(g.panelWidthMm))} ${px(Y(0))}`);
	out.push(`<path d="${profile.join(' ')}" fill="${PALETTE.fill}" stroke="${PALETTE.muted}" stroke-width="0.75" stroke-dasharray="4 3"/>`);
	for (const well of g.wells) {
		out.push(rect(X(well.xMm), Y(well.depthMm), g.wellWidthMm * s, g.boardMm * s, `fill="${PALETTE.wood}" stroke="${PALETTE.woodEdge}" stroke-width="0.75"`));
		out.push(line(X(well.xMm), Y(well.depthMm), X(well.xMm + g.wellWidthMm), Y(well.depthMm), `stroke="${PALETTE.accent}" stroke-width="2"`));
		out.push(text(X(well.xMm + g.wellWidthMm / 2), Y(g.overallDepthMm) + 16, formatLength(well.depthMm, unit), `${DRAWING_FONT} font-size="${fontSize - 1}" fill="${PALETTE.ink}" text-anchor="middle"`));
		out.push(text(X(well.xMm + g.wellWidthMm / 2), Y(0) - 6, String(design.sequence[well.n]), `${DRAWING_FONT} font-size="${fontSize - 1}" fill="${PALETTE.muted}" text-anchor="middle"`));
	}
	for (const fin of g.fins) out.push(rect(X(fin.xMm), Y(0), g.finMm * s, fin.depthMm * s, `fill="${PALETTE.woodEdge}"`));
	const yDim = Y(g.overallDepthMm) + 34;
	out.push(line(X(0), yDim, X(g.panelWidthMm), yDim, `stroke="${PALETTE.ink}" stroke-width="0.75"`));
	out.push(
		text((X(0) + X(g.panelWidthMm)) / 2, yDim + 14, `panel ${formatLength(g.panelWidthMm, unit)} × ${formatLength(g.overallDepthMm, unit)} deep, no full back`, `${DRAWING_FONT} font-size="${fontSize}" fill="${PALETTE.ink}" text-anchor="middle"`)
	);
	return [
		`<svg xmlns="http://www.w3.org/2000/svg" width="${px(width)}" height="${px(height)}" viewBox="0 0 ${px(width)} ${px(height)}" role="img" aria-label="${escapeXml(title)}">`,
		...out,
		'</svg>'
	].join('\n');
}
