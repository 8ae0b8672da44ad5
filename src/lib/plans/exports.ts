// The cut list as a file for the workshop: one row per piece with its sheet and position, then
// the pieces cut separately (shims). CSV to RFC 4180 via the chart CSV writer.
import { toCsv, type CsvCell } from '../charts/csv';
import type { CutList } from '../treatment/cutlist';
import type { Part } from '../treatment/parts';
import { formatInches, mmToInches, type LengthUnit } from '../treatment/units';

export const CUT_LIST_SCHEMA = 'ringdown.cut-list/1';

export interface CutPieceRow {
	sheet: string | null;
	part: string;
	lengthMm: number;
	widthMm: number;
	thicknessMm: number;
	finishedFaces: number;
	grain: string;
	/** Position of the piece's corner on the sheet, mm from the sheet's corner; null off the sheets. */
	xMm: number | null;
	yMm: number | null;
	rotated: boolean | null;
	note: string | null;
}

/** Every piece, in cutting order: sheet by sheet, then the pieces cut separately. */
export function cutPieceRows(cut: CutList | null, separate: readonly Part[]): CutPieceRow[] {
	const rows: CutPieceRow[] = [];
	for (const sheet of cut?.sheets ?? []) {
		for (const p of sheet.placements) {
			rows.push({
				sheet: `${sheet.stock.id} #${sheet.sheetNumber}`,
				part: p.name,
				lengthMm: p.part.lengthMm,
				widthMm: p.part.widthMm,
				thicknessMm: p.part.thicknessMm,
				finishedFaces: p.part.finishedFaces,
				grain: p.part.grain,
				xMm: p.x,
				yMm: p.y,
				rotated: p.rotated,
				note: p.part.note ?? null
			});
		}
	}
	for (const part of separate) {
		for (let i = 0; i < part.quantity; i++) {
			rows.push({ sheet: null, part: part.name, lengthMm: part.lengthMm, widthMm: part.widthMm, thicknessMm: part.thicknessMm, finishedFaces: part.finishedFaces, grain: part.grain, xMm: null, yMm: null, rotated: null, note: part.note ?? null });
		}
	}
	return rows;
}

export function cutListCsv(rows: readonly CutPieceRow[], unit: LengthUnit): string {
	const inches = unit === 'in';
	const headers = [
		'Sheet',
		'Part',
		'Length (mm)',
		'Width (mm)',
		'Thickness (mm)',
		...(inches ? ['Length (in)', 'Width (in)', 'Thickness (in)'] : []),
		'Good faces',
		'Grain',
		'X on sheet (mm)',
		'Y on sheet (mm)',
		'Turned',
		'Note'
	];
	const inch = (mm: number) => formatInches(mmToInches(mm)).replace('″', '');
	return toCsv(
		headers,
		rows.map((r): CsvCell[] => [
			r.sheet ?? 'cut separately',
			r.part,
			r.lengthMm,
			r.widthMm,
			r.thicknessMm,
			...(inches ? [inch(r.lengthMm), inch(r.widthMm), inch(r.thicknessMm)] : []),
			r.finishedFaces,
			r.grain,
			r.xMm,
			r.yMm,
			r.rotated === null ? null : r.rotated ? 'yes' : 'no',
			r.note
		])
	);
}
