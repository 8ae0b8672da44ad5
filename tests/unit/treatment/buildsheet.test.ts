import { describe, expect, it } from 'vitest';
import { diffuserBuildSheet, membraneTrapBuildSheet, porousFrameBuildSheet } from '../../../src/lib/treatment/buildsheet';
import { designDiffuser } from '../../../src/lib/treatment/diffuser';
import type { Part } from '../../../src/lib/treatment/parts';

const count = (parts: Part[], re: RegExp) => parts.filter((p) => re.test(p.name)).reduce((n, p) => n + p.quantity, 0);

describe('QRD build sheet (N = 7, f0 = 500 Hz, c = 343: depths 0, 49, 196, 98, 98, 196, 49 mm; 18 mm board)', () => {
	const design = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.018, speedOfSound: 343 });
	const bs = diffuserBuildSheet(design, { heightMm: 1200 });
	const inner = 1200 - 2 * 18;

	it('has N + 1 fins (two of them the sides) as deep as the deepest well, finished on both faces', () => {
		expect(count(bs.parts, /^fin$/)).toBe(6);
		expect(count(bs.parts, /^side$/)).toBe(2);
		for (const p of bs.parts.filter((q) => q.name === 'fin' || q.name === 'side')) {
			expect(p.widthMm).toBe(196);
			expect(p.lengthMm).toBe(inner);
			expect(p.finishedFaces).toBe(2);
		}
	});

	it('a back and two caps spanning the panel width N·w + (N + 1)·t = 494 mm', () => {
		const back = bs.parts.find((p) => p.name === 'back');
		expect(back).toMatchObject({ quantity: 1, lengthMm: 1200, widthMm: 494, finishedFaces: 0 });
		expect(bs.parts.find((p) => p.name === 'top/bottom cap')).toMatchObject({ quantity: 2, lengthMm: 494, widthMm: 196 });
		expect(bs.overallMm).toEqual({ widthMm: 494, heightMm: 1200, depthMm: 214 });
	});

	it('a well-bottom strip for every well shallower than the deepest (5 of 7), none for the two 196 mm wells', () => {
		expect(count(bs.parts, /^well bottom/)).toBe(5);
		expect(count(bs.parts, /depth 196/)).toBe(0);
	});

	it.each([
		[0, 178],
		[49, 129],
		[98, 80]
	])('the %i mm wells rest on blocks of %i mm (196 − depth − 18 mm strip), three per strip (ends + one per 600 mm)', (depth, blockLength) => {
		expect(196 - depth - 18).toBe(blockLength);
		const blocks = bs.parts.find((p) => p.name === `spacer block ${blockLength} mm`);
		const strips = count(bs.parts, new RegExp(`^well bottom \\(depth ${depth} mm\\)`));
		expect(blocks?.lengthMm).toBe(blockLength);
		expect(blocks?.quantity).toBe(3 * strips);
		expect(blocks?.finishedFaces).toBe(0);
	});

	it('a well bottom closer to the back than one board becomes a shim of the exact gap', () => {
		// N = 13 at 500 Hz: depth step λ0/(2N) = 343/(26·500) m = 26.4 mm; the s = 10 wells sit one
		// step·2 = 52.8 mm in front of the s = 12 (deepest) wells — less than a 60 mm board.
		const d13 = designDiffuser({ kind: 'quadratic-residue', prime: 13, designFrequencyHz: 500, wellWidthM: 0.04, finThicknessM: 0.018, speedOfSound: 343 });
		const sheet = diffuserBuildSheet(d13, { heightMm: 1200, boardThicknessMm: 60 });
		const shim = sheet.parts.find((p) => p.name === 'well shim');
		expect(shim?.thicknessMm).toBeCloseTo((2 * 343 * 1000) / (26 * 500), 1); // rounded to 0.1 mm
		expect(shim?.quantity).toBe(2); // s = 10 occurs at n = 6 and n = 7
		expect(shim?.note).toMatch(/plane down/);
	});

	it('notes the board saved against a solid fill', () => {
		expect(bs.notes[0]).toMatch(/saves \d+ %/);
	});

	it.each([
		[{ heightMm: 0 }, /panel height/],
		[{ heightMm: 30 }, /no room between/],
		[{ heightMm: 1200, boardThicknessMm: -1 }, /board thickness/]
	])('rejects %o', (o, message) => {
		expect(() => diffuserBuildSheet(design, o)).toThrow(message);
	});
});

describe('porous absorber frame', () => {
	const o = { widthMm: 600, heightMm: 1200, absorberThicknessMm: 100, airGapMm: 50, frameThicknessMm: 18 };

	it('sides and top/bottom as deep as fibre + gap, top/bottom between the sides; fabric as a note', () => {
		const bs = porousFrameBuildSheet(o);
		expect(bs.parts.find((p) => p.name === 'frame side')).toMatchObject({ quantity: 2, lengthMm: 1200, widthMm: 150 });
		expect(bs.parts.find((p) => p.name === 'frame top/bottom')).toMatchObject({ quantity: 2, lengthMm: 564, widthMm: 150 });
		expect(bs.parts.some((p) => p.name === 'back')).toBe(false);
		expect(bs.notes.join(' ')).toMatch(/Fabric .* 1000 × 1600 mm/);
	});

	it('an optional back, and wrapped frames need no finished face', () => {
		const bs = porousFrameBuildSheet({ ...o, withBack: true, fabricWrapped: true });
		expect(bs.parts.find((p) => p.name === 'back')).toMatchObject({ lengthMm: 1200, widthMm: 600, finishedFaces: 0 });
		expect(bs.parts.filter((p) => p.name.startsWith('frame')).every((p) => p.finishedFaces === 0)).toBe(true);
		expect(bs.overallMm.depthMm).toBe(168);
	});

	it.each([
		[{ ...o, airGapMm: -5 }, /air gap/],
		[{ ...o, widthMm: 30 }, /too small/],
		[{ ...o, absorberThicknessMm: 0 }, /absorber thickness/]
	])('rejects %o', (bad, message) => {
		expect(() => porousFrameBuildSheet(bad)).toThrow(message);
	});
});

describe('membrane trap box', () => {
	it('panel, frame as deep as the cavity, back; sealing and fill as notes', () => {
		const bs = membraneTrapBuildSheet({ widthMm: 600, heightMm: 1200, cavityDepthMm: 298, panelThicknessMm: 6, frameThicknessMm: 18 });
		expect(bs.parts.find((p) => p.name === 'panel (membrane)')).toMatchObject({ lengthMm: 1200, widthMm: 600, thicknessMm: 6 });
		expect(bs.parts.find((p) => p.name === 'frame side')).toMatchObject({ quantity: 2, widthMm: 298 });
		expect(bs.parts.find((p) => p.name === 'frame top/bottom')).toMatchObject({ quantity: 2, lengthMm: 564 });
		expect(bs.overallMm.depthMm).toBe(298 + 18 + 6);
		expect(bs.notes.join(' ')).toMatch(/airtight/);
	});

	it('rejects a box smaller than its frame', () => {
		expect(() => membraneTrapBuildSheet({ widthMm: 30, heightMm: 1200, cavityDepthMm: 100, panelThicknessMm: 6, frameThicknessMm: 18 })).toThrow(/too small/);
	});
});
