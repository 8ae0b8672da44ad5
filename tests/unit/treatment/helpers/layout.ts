// The properties every cut list must have, checked on the layout itself (shared by the cut-list
// and plan tests).
import { expect } from 'vitest';
import { sameThickness, type CutList } from '../../../../src/lib/treatment/cutlist';
import type { Part } from '../../../../src/lib/treatment/parts';

/** Every property a correct two-stage guillotine layout must have. */
export function expectValidLayout(result: CutList, parts: readonly Part[], kerf: number): void {
	const total = parts.reduce((n, p) => n + p.quantity, 0);
	const placements = result.sheets.flatMap((s) => s.placements.map((p) => ({ ...p, sheet: s })));
	// Each piece exactly once.
	expect(placements).toHaveLength(total);
	expect(new Set(placements.map((p) => p.pieceIndex)).size).toBe(total);
	// Each part's pieces, by name and size, placed exactly as often as its quantity.
	const sameAs = (a: Part, b: Part) => a.name === b.name && a.lengthMm === b.lengthMm && a.widthMm === b.widthMm && a.thicknessMm === b.thicknessMm;
	for (const part of parts) {
		const placed = placements.filter((p) => sameAs(p.part, part)).length;
		expect(placed, part.name).toBe(parts.filter((q) => sameAs(q, part)).reduce((n, q) => n + q.quantity, 0));
	}
	// Area conserved.
	const partsArea = parts.reduce((s, p) => s + p.quantity * p.lengthMm * p.widthMm, 0);
	expect(placements.reduce((s, p) => s + p.lengthMm * p.widthMm, 0)).toBeCloseTo(partsArea, 6);
	expect(result.partsAreaMm2).toBeCloseTo(partsArea, 6);
	for (const p of placements) {
		const { stock } = p.sheet;
		// Inside the sheet.
		expect(p.x).toBeGreaterThanOrEqual(0);
		expect(p.y).toBeGreaterThanOrEqual(0);
		expect(p.x + p.lengthMm).toBeLessThanOrEqual(stock.lengthMm + 1e-9);
		expect(p.y + p.widthMm).toBeLessThanOrEqual(stock.widthMm + 1e-9);
		// Same size as the part, turned only when flagged.
		expect(p.rotated ? [p.widthMm, p.lengthMm] : [p.lengthMm, p.widthMm]).toEqual([p.part.lengthMm, p.part.widthMm]);
		// Rotation only when the grain allows it.
		if (p.part.grain !== 'none' && stock.grain !== 'none') expect(p.rotated).toBe(p.part.grain === 'along-width');
		// Same thickness, enough finished faces.
		expect(sameThickness(stock.thicknessMm, p.part.thicknessMm)).toBe(true);
		expect(stock.finishedFaces).toBeGreaterThanOrEqual(p.part.finishedFaces);
		// Guillotine: each part sits at the top of a strip and no wider than it.
		const strip = p.sheet.strips.find((s) => s.y === p.y);
		expect(strip).toBeDefined();
		expect(p.widthMm).toBeLessThanOrEqual((strip?.widthMm ?? 0) + 1e-9);
	}
	// No overlaps, at least one kerf apart, on each sheet.
	for (const sheet of result.sheets) {
		const ps = sheet.placements;
		for (let i = 0; i < ps.length; i++) {
			for (let j = i + 1; j < ps.length; j++) {
				const a = ps[i];
				const b = ps[j];
				const apart =
					a.x + a.lengthMm + kerf <= b.x + 1e-9 ||
					b.x + b.lengthMm + kerf <= a.x + 1e-9 ||
					a.y + a.widthMm + kerf <= b.y + 1e-9 ||
					b.y + b.widthMm + kerf <= a.y + 1e-9;
				expect(apart).toBe(true);
			}
		}
		// Strips do not overlap and are a kerf apart.
		const strips = [...sheet.strips].sort((a, b) => a.y - b.y);
		for (let i = 1; i < strips.length; i++) expect(strips[i].y).toBeGreaterThanOrEqual(strips[i - 1].y + strips[i - 1].widthMm + kerf - 1e-9);
		// Offcuts inside the sheet and clear of every part.
		for (const o of sheet.offcuts) {
			expect(o.x + o.lengthMm).toBeLessThanOrEqual(sheet.stock.lengthMm + 1e-9);
			expect(o.y + o.widthMm).toBeLessThanOrEqual(sheet.stock.widthMm + 1e-9);
			for (const p of ps) {
				const clear = o.x + o.lengthMm <= p.x + 1e-9 || p.x + p.lengthMm <= o.x + 1e-9 || o.y + o.widthMm <= p.y + 1e-9 || p.y + p.widthMm <= o.y + 1e-9;
				expect(clear).toBe(true);
			}
		}
	}
	// Yield is parts area over sheets area.
	const sheetsArea = result.sheets.reduce((s, l) => s + l.stock.lengthMm * l.stock.widthMm, 0);
	expect(result.yieldPct).toBeCloseTo((partsArea / sheetsArea) * 100, 9);
}
