import { describe, expect, it } from 'vitest';
import { planBuilds, planCutList, separateParts } from '../../../src/lib/plans/build';
import { cutListCsv, cutPieceRows, type CutPieceRow } from '../../../src/lib/plans/exports';
import { item, POROUS, QRD7, STOCK } from './fixtures';
import { csvTable as table, parseCsv } from '../../helpers/rfc4180';

// Two absorbers and a high diffuser whose s = 5 well is a shim (see build.test.ts): one label has
// a comma and quotes, to be quoted in the file.
const items = [
	item({ label: 'Side absorbers, "left"', quantity: 2, params: POROUS }),
	item({ label: 'High diffuser', quantity: 2, heightMm: 600, params: { ...QRD7, sequence: 'primitive-root', designFrequencyHz: 2000, wellWidthMm: 30 } })
];
const { builds } = planBuilds(items);
const cut = planCutList(builds, STOCK, 3);
if (!cut.ok) throw new Error(cut.error);
const separate = separateParts(builds);
const rows = cutPieceRows(cut.cutList, separate);
const placements = cut.cutList.sheets.flatMap((s) => s.placements);

describe('cut pieces', () => {
	it('one row per placed piece, then one per separately cut piece', () => {
		const separateCount = separate.reduce((n, p) => n + p.quantity, 0);
		expect(separateCount).toBe(2); // one shim per diffuser
		expect(rows).toHaveLength(placements.length + separateCount);
		expect(rows.slice(placements.length).every((r) => r.sheet === null && r.xMm === null && r.rotated === null)).toBe(true);
		expect(rows.slice(0, placements.length).every((r) => r.sheet !== null && r.xMm !== null)).toBe(true);
	});

	it('names the sheet as "<stock> #<n>" and keeps each piece’s position', () => {
		const sheet = cut.cutList.sheets[0];
		const p = sheet.placements[0];
		expect(rows[0]).toMatchObject({ sheet: `${sheet.stock.id} #${sheet.sheetNumber}`, part: p.name, xMm: p.x, yMm: p.y, rotated: p.rotated, lengthMm: p.part.lengthMm, widthMm: p.part.widthMm });
	});

	it('without a cut list only the separate pieces are listed', () => {
		expect(cutPieceRows(null, separate)).toHaveLength(2);
	});
});

describe('cut list CSV (RFC 4180)', () => {
	it('metric: header, one record per piece, CRLF line ends, no inch columns', () => {
		const csv = cutListCsv(rows, 'mm');
		expect(csv.endsWith('\r\n')).toBe(true);
		const [header] = parseCsv(csv);
		expect(header).toEqual(['Sheet', 'Part', 'Length (mm)', 'Width (mm)', 'Thickness (mm)', 'Good faces', 'Grain', 'X on sheet (mm)', 'Y on sheet (mm)', 'Turned', 'Note']);
		const t = table(csv);
		expect(t).toHaveLength(rows.length);
		t.forEach((r, i) => {
			expect(Number(r['Length (mm)'])).toBe(rows[i].lengthMm);
			expect(r.Part).toBe(rows[i].part);
		});
	});

	it('quotes a part name with a comma and quotes, and reads back the same', () => {
		const t = table(cutListCsv(rows, 'mm'));
		expect(t.some((r) => r.Part === 'Side absorbers, "left": frame side')).toBe(true);
	});

	it('separate pieces: "cut separately", empty position, their note', () => {
		const t = table(cutListCsv(rows, 'mm'));
		const shims = t.filter((r) => r.Sheet === 'cut separately');
		expect(shims).toHaveLength(2);
		for (const s of shims) {
			expect(s['X on sheet (mm)']).toBe('');
			expect(s.Turned).toBe('');
			expect(s.Note).toMatch(/stock or plane down/);
		}
	});

	it('imperial: adds inch columns after the mm ones, to the nearest 1/16 in', () => {
		const one: CutPieceRow = { sheet: 'S #1', part: 'frame side', lengthMm: 1200, widthMm: 600, thicknessMm: 18, finishedFaces: 0, grain: 'along-length', xMm: 0, yMm: 603, rotated: false, note: null };
		const csv = cutListCsv([one], 'in');
		const [header] = parseCsv(csv);
		expect(header.slice(2, 8)).toEqual(['Length (mm)', 'Width (mm)', 'Thickness (mm)', 'Length (in)', 'Width (in)', 'Thickness (in)']);
		const [r] = table(csv);
		// 1200 mm = 47.244 in → 47 4/16; 600 mm = 23.622 in → 23 10/16; 18 mm = 0.709 in → 11/16 (1 in = 25.4 mm exactly, the international inch of 1959).
		expect([r['Length (in)'], r['Width (in)'], r['Thickness (in)']]).toEqual(['47 1/4', '23 5/8', '11/16']);
		expect(r['Y on sheet (mm)']).toBe('603');
		expect(r.Turned).toBe('no');
		expect(r.Note).toBe('');
	});
});
