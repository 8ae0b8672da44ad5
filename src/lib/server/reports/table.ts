// A plain report table: a shaded header row, hairlines between rows, cells that wrap, and the
// header repeated when the table runs onto a new page.
import type { ReportPen } from './pen';
import { COLOURS, TYPE } from './theme';

export interface TableColumn {
	header: string;
	/** Share of the content width; the shares are scaled to fill it. */
	weight: number;
	align?: 'left' | 'right';
	/** Numbers in the mono face, words in the prose face. */
	face?: 'mono' | 'prose';
}

const CELL_PAD_X = 4;
const CELL_PAD_Y = 3.5;

function columnWidths(pen: ReportPen, columns: readonly TableColumn[]): number[] {
	const total = columns.reduce((sum, c) => sum + c.weight, 0);
	if (!(total > 0)) throw new RangeError('table columns need positive weights');
	return columns.map((c) => (pen.width * c.weight) / total);
}

function rowHeight(pen: ReportPen, cells: readonly string[], columns: readonly TableColumn[], widths: number[], header: boolean): number {
	let tallest = 0;
	cells.forEach((cell, i) => {
		pen.use(header ? 'proseBold' : columns[i].face === 'mono' ? 'mono' : 'prose', TYPE.table, COLOURS.ink);
		tallest = Math.max(tallest, pen.heightOf(cell, widths[i] - 2 * CELL_PAD_X));
	});
	return tallest + 2 * CELL_PAD_Y;
}

function drawRow(pen: ReportPen, cells: readonly string[], columns: readonly TableColumn[], widths: number[], header: boolean): void {
	const height = rowHeight(pen, cells, columns, widths, header);
	const top = pen.y;
	const { doc } = pen;
	if (header) doc.save().rect(pen.left, top, pen.width, height).fill(COLOURS.panel).restore();
	let x = pen.left;
	cells.forEach((cell, i) => {
		const column = columns[i];
		pen.use(header ? 'proseBold' : column.face === 'mono' ? 'mono' : 'prose', TYPE.table, header ? COLOURS.inkSoft : COLOURS.ink);
		pen.text(cell, x + CELL_PAD_X, top + CELL_PAD_Y, { width: widths[i] - 2 * CELL_PAD_X, align: column.align ?? 'left' });
		x += widths[i];
	});
	doc.save().moveTo(pen.left, top + height).lineTo(pen.left + pen.width, top + height).lineWidth(header ? 0.8 : 0.4).stroke(COLOURS.rule).restore();
	pen.y = top + height;
}

export function drawTable(pen: ReportPen, columns: readonly TableColumn[], rows: readonly (readonly string[])[]): void {
	rows.forEach((row, i) => {
		if (row.length !== columns.length) throw new RangeError(`table row ${i} has ${row.length} cells for ${columns.length} columns`);
	});
	const widths = columnWidths(pen, columns);
	const headers = columns.map((c) => c.header);
	const headerHeight = rowHeight(pen, headers, columns, widths, true);
	// The header never stands alone at the foot of a page.
	pen.ensureSpace(headerHeight + (rows.length > 0 ? rowHeight(pen, rows[0], columns, widths, false) : 0));
	drawRow(pen, headers, columns, widths, true);
	for (const row of rows) {
		const height = rowHeight(pen, row, columns, widths, false);
		if (pen.y + height > pen.bottom) {
			pen.newPage();
			drawRow(pen, headers, columns, widths, true);
		}
		drawRow(pen, row, columns, widths, false);
	}
}
