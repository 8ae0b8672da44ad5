import { describe, expect, it } from 'vitest';
import { diffuserBuildSheet } from '../../../src/lib/treatment/buildsheet';
import { designDiffuser } from '../../../src/lib/treatment/diffuser';
import { diffuserGeometry, profiledCapAreaMm2 } from '../../../src/lib/treatment/diffuser-build';
import type { Part } from '../../../src/lib/treatment/parts';

// Well depths of a quadratic-residue diffuser: s_n = n² mod N, d_n = s_n·λ0/(2N), λ0 = c/f0
// (Cox & D'Antonio, Acoustic Absorbers and Diffusers, 2nd ed., ch. 10; Schroeder, JASA 65:958, 1979).
const C = 343;
const handDepthsMm = (N: number, f0: number) => Array.from({ length: N }, (_, n) => ((n * n) % N) * ((C / f0) * 1000) / (2 * N));

const area = (parts: Part[]) => parts.reduce((s, p) => s + p.quantity * p.lengthMm * p.widthMm, 0);
const qty = (parts: Part[], re: RegExp) => parts.filter((p) => re.test(p.name)).reduce((n, p) => n + p.quantity, 0);

describe('QRD N = 7, f0 = 500 Hz, 50 mm wells, 18 mm fins and board, 1200 mm high', () => {
	// Hand: λ0/(2N) = 343/500/14 m = 49 mm; s = 0 1 4 2 2 4 1 → 0, 49, 196, 98, 98, 196, 49 mm.
	const design = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.018, speedOfSound: C });
	const full = diffuserBuildSheet(design, { heightMm: 1200, boardThicknessMm: 18, construction: 'full-depth' });
	const low = diffuserBuildSheet(design, { heightMm: 1200, boardThicknessMm: 18, construction: 'low-waste' });

	it('the hand depths are the design depths', () => {
		expect(handDepthsMm(7, 500)).toEqual([0, 49, 196, 98, 98, 196, 49].map((d) => expect.closeTo(d, 9)));
		design.wellDepthsM.forEach((d, n) => expect(d * 1000).toBeCloseTo(handDepthsMm(7, 500)[n], 9));
	});

	it('low-waste: every well bottom at its design depth, between fins that reach behind it', () => {
		const g = low.diffuser!.geometry;
		expect(g.construction).toBe('low-waste');
		g.wells.forEach((well, n) => {
			expect(well.depthMm).toBeCloseTo(handDepthsMm(7, 500)[n], 9);
			expect(well.bottom).toBe('strip');
			// Clear width unchanged: 50 mm between the fins on either side.
			expect(g.fins[n + 1].xMm - (g.fins[n].xMm + g.finMm)).toBeCloseTo(50, 9);
			// Both fins reach at least to the back face of the strip (depth + 18 mm).
			expect(g.fins[n].depthMm).toBeGreaterThanOrEqual(well.depthMm + 18 - 1e-9);
			expect(g.fins[n + 1].depthMm).toBeGreaterThanOrEqual(well.depthMm + 18 - 1e-9);
		});
		// One strip per well, each named with its depth: 0, 49 ×2, 98 ×2 well bottoms, 196 ×2 back strips.
		for (const [d, n] of [[0, 1], [49, 2], [98, 2]] as const) expect(qty(low.parts, new RegExp(`^well bottom \\(depth ${d} mm\\)$`))).toBe(n);
		expect(qty(low.parts, /^back strip \(depth 196 mm\)$/)).toBe(2);
		expect(low.parts.some((p) => p.name === 'back' || /spacer/.test(p.name))).toBe(false);
	});

	it('low-waste fins are as deep as the deeper neighbouring well + 18 mm: sides 18 and 67, fins 67, 214 ×4, 116', () => {
		// Hand: sides at wells 0 (0 mm) and 6 (49 mm) → 18, 67; fins between (0,49) 67, (49,196) 214,
		// (196,98) 214, (98,98) 116, (98,196) 214, (196,49) 214.
		expect(low.diffuser!.geometry.fins.map((f) => f.depthMm)).toEqual([18, 67, 214, 214, 116, 214, 214, 67].map((d) => expect.closeTo(d, 9)));
	});

	it('board by hand: full-depth 2.992 m², low-waste 1.927168 m², saving 1.064832 m² (35.6 %)', () => {
		// Full-depth (inner = 1200 − 2·18 = 1164, width W = 7·50 + 8·18 = 494):
		//   back 1200·494 = 592 800; caps 2·494·196 = 193 648; sides + fins 8·1164·196 = 1 825 152;
		//   strips 5·1164·50 = 291 000; blocks (3 per strip) 3·178·50 + 6·129·50 + 6·80·50 = 89 400
		//   → 2 992 000 mm².
		// Low-waste: fins (18 + 67 + 67 + 4·214 + 116)·1164 = 1 308 336; strips 7·1164·50 = 407 400;
		//   cap blanks 2·494·214 = 211 432 → 1 927 168 mm².
		expect(area(full.parts)).toBeCloseTo(2_992_000, 6);
		expect(area(low.parts)).toBeCloseTo(1_927_168, 6);
		expect(low.diffuser!.chosen.boardAreaM2).toBeCloseTo(1.927168, 9);
		expect(low.diffuser!.other.boardAreaM2).toBeCloseTo(2.992, 9);
		expect(low.diffuser!.lowWasteSavingM2).toBeCloseTo(1.064832, 9);
		expect(low.diffuser!.lowWasteSavingPct).toBeCloseTo((1.064832 / 2.992) * 100, 6);
		expect(full.diffuser!.lowWasteSavingM2).toBeCloseTo(1.064832, 9);
		expect(low.notes.join(' ')).toMatch(/Low-waste construction: 36 % less board than the full-depth box/);
	});

	it('the cap is cut to the profile: its area is each slot as deep as what it covers', () => {
		// Hand: wells 50·(18 + 67 + 214 + 116 + 116 + 214 + 67) = 40 600; fins 18·(18 + 67 + 67 + 4·214 + 116) = 20 232.
		expect(profiledCapAreaMm2(low.diffuser!.geometry)).toBeCloseTo(60_832, 6);
		expect(low.parts.find((p) => p.name === 'top/bottom cap')).toMatchObject({ quantity: 2, lengthMm: 494, widthMm: 214, areaMm2: 60_832 });
	});

	it('says on the sheet that the acoustics do not change', () => {
		expect(low.notes.join(' ')).toMatch(/every well bottom at its design depth and keep the clear well width/);
		expect(full.notes.join(' ')).toMatch(/low-waste construction .* would take 36 % less board/);
		expect(low.notes[low.notes.length - 1]).toMatch(/fire rating/);
	});
});

describe('QRD N = 11 (prime), f0 = 500 Hz, 40 mm wells, 12 mm fins, 15 mm board', () => {
	const design = designDiffuser({ kind: 'quadratic-residue', prime: 11, designFrequencyHz: 500, wellWidthM: 0.04, finThicknessM: 0.012, speedOfSound: C });
	const low = diffuserBuildSheet(design, { heightMm: 1000, boardThicknessMm: 15, construction: 'low-waste' });
	const full = diffuserBuildSheet(design, { heightMm: 1000, boardThicknessMm: 15, construction: 'full-depth' });
	// Hand: s = 0 1 4 9 5 3 3 5 9 4 1, step 343/500/22 m = 31.1818 mm.
	const depths = handDepthsMm(11, 500);
	// The parts list writes every dimension to 0.1 mm; the hand sums round the same way.
	const r1 = (mm: number) => Math.round(mm * 10) / 10;

	it('reproduces every well depth, s_n = n² mod 11', () => {
		expect(depths.map((d) => Math.round(d / ((C / 500) * 1000 / 22)))).toEqual([0, 1, 4, 9, 5, 3, 3, 5, 9, 4, 1]);
		low.diffuser!.geometry.wells.forEach((w, n) => expect(w.depthMm).toBeCloseTo(depths[n], 9));
		expect(qty(low.parts, /^(well bottom|back strip)/)).toBe(11);
	});

	it('uses less board than the full-depth box by the area computed by hand', () => {
		const D = Math.max(...depths);
		const W = 11 * 40 + 12 * 12;
		const inner = 1000 - 30;
		// Full-depth: back, caps, 12 fins at D, strips under the 9 wells shallower than D, 3 blocks
		// each (ends + one per 600 mm) of D − d − 15 mm.
		const shallow = depths.filter((d) => D - d > 1e-6);
		const fullHand = 1000 * W + 2 * W * r1(D) + 12 * inner * r1(D) + shallow.length * inner * 40 + shallow.reduce((s, d) => s + 3 * r1(D - d - 15) * 40, 0);
		// Low-waste: fin i as deep as max(d_{i−1}, d_i) + 15 (sides: their one well), 11 strips, caps W × (D + 15).
		const finDepths = Array.from({ length: 12 }, (_, i) => Math.max(i > 0 ? depths[i - 1] : 0, i < 11 ? depths[i] : 0) + 15);
		const lowHand = finDepths.reduce((s, d) => s + r1(d) * inner, 0) + 11 * inner * 40 + 2 * W * r1(D + 15);
		expect(area(full.parts)).toBeCloseTo(fullHand, 0);
		expect(area(low.parts)).toBeCloseTo(lowHand, 0);
		expect(low.diffuser!.lowWasteSavingM2).toBeCloseTo((fullHand - lowHand) / 1e6, 6);
		expect(lowHand).toBeLessThan(fullHand);
		console.log(`N = 11 low-waste ${(lowHand / 1e6).toFixed(3)} m² vs full-depth ${(fullHand / 1e6).toFixed(3)} m²: saves ${(100 * (1 - lowHand / fullHand)).toFixed(1)} %`);
	});
});

describe('geometry refusals', () => {
	const design = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.018, speedOfSound: C });
	it.each([
		[{ heightMm: 30, boardMm: 18 }, /no room between/],
		[{ heightMm: 1200, boardMm: 0 }, /board thickness/],
		[{ heightMm: 1200, boardMm: 18, finMm: -2 }, /fin thickness/]
	])('refuses %o', (o, message) => {
		expect(() => diffuserGeometry(design, { construction: 'low-waste', ...o })).toThrow(message);
	});
	it('refuses an unknown construction', () => {
		expect(() => diffuserBuildSheet(design, { heightMm: 1200, construction: 'solid' as never })).toThrow(/unknown diffuser construction/);
	});
});
