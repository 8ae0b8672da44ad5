// Text blocks of the report: section headings, bulleted lists, paragraphs, a label/value grid.
import type { FontRole } from './fonts';
import type { ReportPen } from './pen';
import { COLOURS, TYPE } from './theme';

const BULLET_INDENT = 12;
const PARAGRAPH_GAP = 5;

/** Heading with a hairline under it, kept together with the first lines that follow. */
export function drawHeading(pen: ReportPen, text: string, keepWithNext = 60): void {
	pen.gap(14);
	pen.ensureSpace(TYPE.heading + 8 + keepWithNext);
	pen.use('proseBold', TYPE.heading, COLOURS.ink).flow(text);
	const y = pen.y + 2;
	pen.doc.save().moveTo(pen.left, y).lineTo(pen.left + pen.width, y).lineWidth(0.6).stroke(COLOURS.rule).restore();
	pen.y = y + 7;
}

export function drawParagraphs(pen: ReportPen, paragraphs: readonly string[], colour: string = COLOURS.ink): void {
	for (const paragraph of paragraphs) {
		pen.use('prose', TYPE.body, colour);
		pen.ensureSpace(Math.min(pen.heightOf(paragraph, pen.width, { lineGap: 1.5 }), 3 * TYPE.body * 1.4));
		pen.flow(paragraph, { lineGap: 1.5 });
		pen.gap(PARAGRAPH_GAP);
	}
}

export function drawBullets(pen: ReportPen, items: readonly string[], bulletColour: string = COLOURS.after): void {
	for (const item of items) {
		pen.use('prose', TYPE.body, COLOURS.ink);
		const height = pen.heightOf(item, pen.width - BULLET_INDENT, { lineGap: 1.5 });
		pen.ensureSpace(Math.min(height, 2 * TYPE.body * 1.4));
		const top = pen.y;
		pen.doc.save().circle(pen.left + 3, top + TYPE.body * 0.42, 1.8).fill(bulletColour).restore();
		pen.flow(item, { x: pen.left + BULLET_INDENT, lineGap: 1.5 });
		pen.gap(3);
	}
}

export interface Fact {
	label: string;
	value: string;
	face?: Extract<FontRole, 'prose' | 'mono'>;
}

/** The mono face looks larger than the prose face at one size; it is set a little smaller. */
function valueSize(fact: Fact): number {
	return fact.face === 'mono' ? TYPE.body - 1 : TYPE.body;
}

/** Label/value pairs in columns on a light panel. */
export function drawFactPanel(pen: ReportPen, columns: readonly (readonly Fact[])[]): void {
	const pad = 10;
	const gutter = 16;
	const columnWidth = (pen.width - 2 * pad - gutter * (columns.length - 1)) / columns.length;
	const labelWidth = 62;
	const valueWidth = columnWidth - labelWidth;
	const lineHeights = columns.map((facts) =>
		facts.map((fact) => {
			pen.use(fact.face ?? 'prose', valueSize(fact), COLOURS.ink);
			return pen.heightOf(fact.value, valueWidth) + 4;
		})
	);
	const panelHeight = Math.max(...lineHeights.map((heights) => heights.reduce((a, b) => a + b, 0))) + 2 * pad - 4;
	pen.ensureSpace(panelHeight);
	const top = pen.y;
	pen.doc.save().roundedRect(pen.left, top, pen.width, panelHeight, 3).fill(COLOURS.panel).restore();
	columns.forEach((facts, c) => {
		const x = pen.left + pad + c * (columnWidth + gutter);
		let y = top + pad;
		facts.forEach((fact, i) => {
			const valueAscent = pen.use(fact.face ?? 'prose', valueSize(fact), COLOURS.ink).ascent();
			pen.text(fact.value, x + labelWidth, y, { width: valueWidth });
			// The label sits on the value's first baseline.
			const labelAscent = pen.use('prose', TYPE.small, COLOURS.inkSoft).ascent();
			pen.text(fact.label, x, y + valueAscent - labelAscent, { width: labelWidth - 4, lineBreak: false });
			y += lineHeights[c][i];
		});
	});
	pen.y = top + panelHeight;
}
