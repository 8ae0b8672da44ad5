// Drawing of one cut sheet: parts labelled, saw cuts as thin lines, offcuts hatched.
import type { Placement, SheetLayout } from './cutlist';
import { DRAWING_FONT, escapeXml, line, PALETTE, px, rect, text } from './svg';
import { formatLength, type LengthUnit } from './units';

export interface CuttingDiagramOptions {
	unit?: LengthUnit;
	/** Drawing width of the sheet in pixels; the height follows the sheet's proportions. */
	widthPx?: number;
	title?: string;
	/** Short text to mark each piece with (e.g. a key into a parts legend); the part's name by default. */
	labelOf?: (placement: Placement) => string;
}

/** Width of mono text at this size, px (JetBrains Mono advances 0.6 em). */
const textWidth = (text: string, fontSize: number) => text.length * fontSize * 0.6;

export function cuttingDiagramSvg(layout: SheetLayout, options: CuttingDiagramOptions = {}): string {
	const unit = options.unit ?? 'mm';
	const drawWidth = options.widthPx ?? 900;
	if (!(drawWidth > 0)) throw new Error(`drawing width must be positive, got ${drawWidth}`);
	const { stock, kerfMm: kerf } = layout;
	const s = drawWidth / stock.lengthMm;
	const margin = { left: 16, right: 16, top: 40, bottom: 16 };
	const width = margin.left + drawWidth + margin.right;
	const height = margin.top + stock.widthMm * s + margin.bottom;
	const X = (mm: number) => margin.left + mm * s;
	const Y = (mm: number) => margin.top + mm * s;
	const title =
		options.title ??
		`${stock.id} #${layout.sheetNumber}: ${formatLength(stock.lengthMm, unit)} × ${formatLength(stock.widthMm, unit)} × ${formatLength(stock.thicknessMm, unit)}`;
	const out: string[] = [
		`<svg xmlns="http://www.w3.org/2000/svg" width="${px(width)}" height="${px(height)}" viewBox="0 0 ${px(width)} ${px(height)}" role="img" aria-label="${escapeXml(title)}">`,
		'<defs><pattern id="offcut-hatch" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">' +
			`<line x1="0" y1="0" x2="0" y2="8" stroke="${PALETTE.muted}" stroke-width="1"/></pattern></defs>`,
		rect(0, 0, width, height, `fill="${PALETTE.paper}"`),
		text(margin.left, 24, title, `${DRAWING_FONT} font-size="12" fill="${PALETTE.ink}"`),
		rect(X(0), Y(0), stock.lengthMm * s, stock.widthMm * s, `fill="${PALETTE.fill}" stroke="${PALETTE.ink}" stroke-width="1"`)
	];
	for (const o of layout.offcuts) {
		out.push(rect(X(o.x), Y(o.y), o.lengthMm * s, o.widthMm * s, `fill="url(#offcut-hatch)" stroke="${PALETTE.muted}" stroke-width="0.5" stroke-dasharray="3 2"`));
	}
	for (const p of layout.placements) {
		out.push(rect(X(p.x), Y(p.y), p.lengthMm * s, p.widthMm * s, `fill="${PALETTE.wood}" stroke="${PALETTE.woodEdge}" stroke-width="0.75"`));
		const size = `${formatLength(p.rotated ? p.widthMm : p.lengthMm, unit)} × ${formatLength(p.rotated ? p.lengthMm : p.widthMm, unit)}`;
		const name = options.labelOf ? options.labelOf(p) : p.name;
		// The longest text that fits inside the piece, or none.
		const room = p.lengthMm * s - 4;
		const tallEnough = p.widthMm * s > 12;
		const label = !tallEnough ? '' : textWidth(`${name} ${size}`, 10) <= room ? `${name} ${size}` : textWidth(name, 10) <= room ? name : '';
		if (label) {
			out.push(
				text(X(p.x + p.lengthMm / 2), Y(p.y + p.widthMm / 2) + 4, label, `${DRAWING_FONT} font-size="10" fill="${PALETTE.ink}" text-anchor="middle"`)
			);
		}
	}
	// Breakdown cuts first (halves, quarters), drawn heavier; then within each panel the rip cuts
	// below each strip, and crosscuts after each part within its strip.
	const panels = layout.panels ?? [];
	const breakdownCut = `stroke="#7f1d1d" stroke-width="${px(Math.max(kerf * s, 1.5))}" stroke-dasharray="6 3"`;
	for (const panel of panels) {
		const xEnd = panel.x + panel.lengthMm + kerf / 2;
		const yEnd = panel.y + panel.widthMm + kerf / 2;
		if (xEnd < stock.lengthMm) out.push(line(X(xEnd), Y(panel.y), X(xEnd), Y(panel.y + panel.widthMm), breakdownCut));
		if (yEnd < stock.widthMm) out.push(line(X(panel.x), Y(yEnd), X(panel.x + panel.lengthMm), Y(yEnd), breakdownCut));
	}
	const cut = `stroke="#b91c1c" stroke-width="${px(Math.max(kerf * s, 0.75))}" stroke-opacity="0.7"`;
	for (const strip of layout.strips) {
		const x0 = strip.x ?? 0;
		const length = strip.lengthMm ?? stock.lengthMm;
		const panelBottom = panels.find((p) => x0 >= p.x - 1e-6 && x0 < p.x + p.lengthMm && strip.y >= p.y - 1e-6 && strip.y < p.y + p.widthMm);
		const yCut = strip.y + strip.widthMm + kerf / 2;
		const yLimit = panelBottom ? panelBottom.y + panelBottom.widthMm : stock.widthMm;
		if (yCut < yLimit) out.push(line(X(x0), Y(yCut), X(x0 + length), Y(yCut), cut));
		for (const p of layout.placements.filter((q) => q.y === strip.y && q.x >= x0 - 1e-6 && q.x < x0 + length)) {
			const xCut = p.x + p.lengthMm + kerf / 2;
			if (xCut < x0 + length) out.push(line(X(xCut), Y(strip.y), X(xCut), Y(strip.y + strip.widthMm), cut));
		}
	}
	out.push('</svg>');
	return out.join('\n');
}
