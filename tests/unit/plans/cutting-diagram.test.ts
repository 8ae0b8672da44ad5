import { describe, expect, it } from 'vitest';
import { cuttingDiagramSvg } from '../../../src/lib/treatment/cutting-diagram-svg';
import type { Part } from '../../../src/lib/treatment/parts';
import type { Placement, SheetLayout } from '../../../src/lib/treatment/cutlist';

// Drawing 900 px wide for a 2440 mm sheet: s = 900/2440 = 0.36885 px/mm. Text at font-size 10 in
// a monospace face is estimated at 0.6 em = 6 px per character (JetBrains Mono advance, as the
// drawing assumes); a label must fit inside its piece.
const S = 900 / 2440;
const CHAR_PX = 6;

const part = (name: string, lengthMm: number, widthMm: number): Part => ({ name, quantity: 1, lengthMm, widthMm, thicknessMm: 18, finishedFaces: 0, grain: 'none' });
const place = (i: number, name: string, x: number, y: number, lengthMm: number, widthMm: number): Placement => ({
	pieceIndex: i,
	name,
	x,
	y,
	lengthMm,
	widthMm,
	rotated: false,
	part: part(name, lengthMm, widthMm)
});

// Long piece: 1000 mm → 368.9 px long, 100 mm → 36.9 px tall.
// Narrow piece: 60 mm → 22.1 px long: room for 3 characters (18 px), not 4 (24 px), even without margin.
// Flat piece: 30 mm → 11.1 px tall: too low for 10 px text.
const layout: SheetLayout = {
	stock: { id: 'Ply 18', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 1, grain: 'none' },
	sheetNumber: 1,
	strips: [
		{ y: 0, widthMm: 100, usedLengthMm: 1063 },
		{ y: 103, widthMm: 30, usedLengthMm: 1000 }
	],
	placements: [place(0, 'frame side', 0, 0, 1000, 100), place(1, 'frame side', 1003, 0, 60, 100), place(2, 'frame side', 0, 103, 1000, 30)],
	offcuts: [],
	kerfMm: 3,
	partsAreaMm2: 1000 * 100 + 60 * 100 + 1000 * 30
};

/** The piece labels: text at font-size 10 (the title is 12), with their x position. */
function labels(svg: string): { x: number; text: string }[] {
	return [...svg.matchAll(/<text x="([\d.]+)" y="[\d.]+" [^>]*font-size="10"[^>]*>([^<]*)<\/text>/g)].map((m) => ({ x: Number(m[1]), text: m[2] }));
}

describe('cutting diagram labels', () => {
	it('by default the part name and size where it fits, nothing where it does not', () => {
		const found = labels(cuttingDiagramSvg(layout, { widthPx: 900 }));
		// "frame side 1000 mm × 100 mm" is 27 characters = 162 px, inside 368.9 px; the narrow piece
		// cannot hold "frame side" (60 px in 22.1 px); the flat piece is too low for any text.
		expect(found.map((l) => l.text)).toEqual(['frame side 1000 mm × 100 mm']);
	});

	it('labelOf replaces the name: the key and size on the long piece, the key alone on the narrow one', () => {
		const keys = ['1', '12', '3'];
		const found = labels(cuttingDiagramSvg(layout, { widthPx: 900, labelOf: (p) => keys[p.pieceIndex] }));
		expect(found.map((l) => l.text)).toEqual(['1 1000 mm × 100 mm', '12']);
		// Centred on its piece: x = 16 px margin + (1003 + 30) mm · s.
		expect(found[1].x).toBeCloseTo(16 + (1003 + 30) * S, 1);
	});

	it('every label drawn fits its piece at 0.6 em per character', () => {
		const pieceLengthPx = [1000 * S, 60 * S];
		const found = labels(cuttingDiagramSvg(layout, { widthPx: 900, labelOf: (p) => ['1', '12', '3'][p.pieceIndex] }));
		found.forEach((l, i) => expect(l.text.length * CHAR_PX).toBeLessThanOrEqual(pieceLengthPx[i]));
	});

	it('a key too long for the narrow piece is left out rather than overflowing', () => {
		// "1234" = 24 px > 22.1 px, the whole length of the piece.
		const found = labels(cuttingDiagramSvg(layout, { widthPx: 900, labelOf: () => '1234' }));
		expect(found.map((l) => l.text)).toEqual(['1234 1000 mm × 100 mm']);
	});

	it('escapes the label for XML', () => {
		const svg = cuttingDiagramSvg(layout, { widthPx: 900, labelOf: () => 'A&B' });
		expect(svg).toContain('A&amp;B 1000 mm × 100 mm');
		expect(svg).not.toContain('A&B');
	});

	it('sizes in inches when asked: 1000 mm = 39 3/8″, 100 mm = 3 15/16″ (25.4 mm/in, nearest 1/16)', () => {
		const found = labels(cuttingDiagramSvg(layout, { widthPx: 900, unit: 'in', labelOf: () => '7' }));
		expect(found[0].text).toBe('7 39 3/8″ × 3 15/16″');
	});
});
