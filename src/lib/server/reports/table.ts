// A plain report table: a shaded header row, hairlines between rows, cells that wrap, mono
// and prose cells on one baseline, and the header repeated when the table runs onto a new page.
import type { FontRole } from './fonts';
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

interface RowLayout {
	height: number;
	/** Per cell, how far below the row's text top it starts so all first lines share a baseline. */
	offsets: number[];
	roles: FontRole[];
}

function columnWidths(pen: ReportPen, columns: readonly TableColumn[]): number[] {
	const total = columns.reduce((sum, c) => sum + c.weight, 0);
	if (!(total > 0)) throw new RangeError('table columns need positive weights');
	return columns.map((c) => (pen.width * c.weight) / total);
}

function layoutRow(pen: ReportPen, cells: readonly string[], columns: readonly TableColumn[], widths: number[], header: boolean): RowLayout {
	const roles = columns.map((column): FontRole => (header ? 'proseBold' : column.face === 'mono' ? 'mono' : 'prose'));
	const ascents = roles.map((role) => pen.use(role, TYPE.table, COLOURS.ink).ascent());
	const top = Math.max(...ascents);
	const offsets = ascents.map((ascent) => top - ascent);
	const height = Math.max(
		...cells.map((cell, i) => offsets[i] + pen.use(roles[i], TYPE.table, COLOURS.ink).heightOf(cell, widths[i] - 2 * CELL_PAD_X))
	);
	return { height: height + 2 * CELL_PAD_Y, offsets, roles };
}

function drawRow(pen: ReportPen, cells: readonly string[], columns: readonly TableColumn[], widths: number[], header: boolean, layout: RowLayout): void {
	const top = pen.y;
	const { doc } = pen;
	if (header) doc.save().rect(pen.left, top, pen.width, layout.height).fill(COLOURS.panel).restore();
	let x = pen.left;
	cells.forEach((cell, i) => {
		pen.use(layout.roles[i], TYPE.table, header ? COLOURS.inkSoft : COLOURS.ink);
		pen.text(cell, x + CELL_PAD_X, top + CELL_PAD_Y + layout.offsets[i], { width: widths[i] - 2 * CELL_PAD_X, align: columns[i].align ?? 'left' });
		x += widths[i];
	});
	doc.save().moveTo(pen.left, top + layout.height).lineTo(pen.left + pen.width, top + layout.height).lineWidth(header ? 0.8 : 0.4).stroke(COLOURS.rule).restore();
	pen.y = top + layout.height;
}

export function drawTable(pen: ReportPen, columns: readonly TableColumn[], rows: readonly (readonly string[])[]): void {
	rows.forEach((row, i) => {
		if (row.length !== columns.length) throw new RangeError(`table row ${i} has ${row.length} cells for ${columns.length} columns`);
	});
	const widths = columnWidths(pen, columns);
	const headers = columns.map((c) => c.header);
	const headerLayout = layoutRow(pen, headers, columns, widths, true);
	const rowLayouts = rows.map((row) => layoutRow(pen, row, columns, widths, false));
	// The header never stands alone at the foot of a page.
	pen.ensureSpace(headerLayout.height + (rowLayouts[0]?.height ?? 0));
	drawRow(pen, headers, columns, widths, true, headerLayout);
	rows.forEach((row, i) => {
		if (pen.y + rowLayouts[i].height > pen.bottom) {
			pen.newPage();
			drawRow(pen, headers, columns, widths, true, headerLayout);
		}
		drawRow(pen, row, columns, widths, false, rowLayouts[i]);
	});
}
