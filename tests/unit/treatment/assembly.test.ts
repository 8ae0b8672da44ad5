import { describe, expect, it } from 'vitest';
import { assemblyStepSvg, diffuserAssembly } from '../../../src/lib/treatment/assembly';
import { diffuserBuildSheet } from '../../../src/lib/treatment/buildsheet';
import { designDiffuser } from '../../../src/lib/treatment/diffuser';
import type { DiffuserConstruction } from '../../../src/lib/treatment/diffuser-build';

// Designs: QRD N = 7 and N = 11 at f0 = 500 Hz (s_n = n² mod N, d_n = s_n·λ0/(2N); Cox & D'Antonio,
// Acoustic Absorbers and Diffusers, ch. 10), a PRD N = 11 (s_n = gⁿ mod N), and a QRD N = 13 with a
// board so thick that a well bottom becomes a shim in the full-depth box.
const DESIGNS = [
	{ name: 'QRD 7', design: designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.012, speedOfSound: 343 }), board: 12 },
	{ name: 'QRD 11', design: designDiffuser({ kind: 'quadratic-residue', prime: 11, designFrequencyHz: 500, wellWidthM: 0.04, finThicknessM: 0.012, speedOfSound: 343 }), board: 15 },
	{ name: 'PRD 11', design: designDiffuser({ kind: 'primitive-root', prime: 11, designFrequencyHz: 600, wellWidthM: 0.04, finThicknessM: 0.009, speedOfSound: 343 }), board: 12 },
	{ name: 'QRD 13 thick board', design: designDiffuser({ kind: 'quadratic-residue', prime: 13, designFrequencyHz: 500, wellWidthM: 0.04, finThicknessM: 0.018, speedOfSound: 343 }), board: 60 }
];
const CONSTRUCTIONS: DiffuserConstruction[] = ['full-depth', 'low-waste'];

describe.each(DESIGNS)('$name', ({ design, board }) => {
	it.each(CONSTRUCTIONS)('%s: every part of the parts list is used exactly once', (construction) => {
		const sheet = diffuserBuildSheet(design, { heightMm: 1200, boardThicknessMm: board, construction });
		const steps = diffuserAssembly(sheet);
		const pieces = steps.flatMap((s) => s.pieces);
		expect(new Set(pieces.map((p) => p.id)).size).toBe(pieces.length);
		for (const part of sheet.parts) expect(pieces.filter((p) => p.part === part).length, part.name).toBe(part.quantity);
		expect(pieces.length).toBe(sheet.parts.reduce((n, p) => n + p.quantity, 0));
	});

	it.each(CONSTRUCTIONS)('%s: no piece is placed before the pieces it rests on', (construction) => {
		const steps = diffuserAssembly(diffuserBuildSheet(design, { heightMm: 1200, boardThicknessMm: board, construction }));
		const placed = new Set<string>();
		for (const step of steps) {
			for (const piece of step.pieces) {
				for (const under of piece.restsOn) expect(placed.has(under), `${piece.id} rests on ${under}`).toBe(true);
				placed.add(piece.id);
			}
		}
		// Steps numbered 1, 2, 3 …; the caps go on last, resting on every fin.
		expect(steps.map((s) => s.n)).toEqual(steps.map((_, i) => i + 1));
		const last = steps[steps.length - 1];
		expect(last.title).toBe('Top and bottom caps');
		for (let i = 0; i <= design.wellCount; i++) expect(last.pieces[0].restsOn).toContain(`F${i}`);
	});
});

describe('low-waste QRD N = 7: sub-assemblies of two wells, fastened to each other, then the caps', () => {
	const sheet = diffuserBuildSheet(DESIGNS[0].design, { heightMm: 1200, boardThicknessMm: 12, construction: 'low-waste' });
	const steps = diffuserAssembly(sheet);

	it('A (wells 1–2), B (3–4), C (5–6), D (7), three joins, caps', () => {
		expect(steps.map((s) => s.title)).toEqual([
			'Sub-assembly A: wells 1–2',
			'Sub-assembly B: wells 3–4',
			'Sub-assembly C: wells 5–6',
			'Sub-assembly D: well 7',
			'Fasten B to A',
			'Fasten C to A–B',
			'Fasten D to A–C',
			'Top and bottom caps'
		]);
		expect(steps[0].pieces.map((p) => p.id)).toEqual(['F0', 'B0', 'F1', 'B1']);
		expect(steps[3].pieces.map((p) => p.id)).toEqual(['F6', 'B6', 'F7']);
		expect(steps[4]).toMatchObject({ pieces: [], joins: ['A', 'B'] });
	});

	it('says which face of the one-side-finished pieces faces out', () => {
		expect(steps[0].faceOut).toMatch(/finished face toward the front/);
		expect(steps[7].faceOut).toMatch(/finished face of each cap outward/);
	});

	it('draws every step: this step\'s pieces in the accent colour, earlier ones muted', () => {
		for (let i = 0; i < steps.length; i++) {
			const svg = assemblyStepSvg(sheet.diffuser!.geometry, steps, i, { labelOf: (p) => p.id });
			expect(svg).toContain(`Step ${i + 1}: ${steps[i].title}`);
			const accent = (svg.match(/fill="#0f766e" fill-opacity="0.85"/g) ?? []).length;
			// Caps are drawn as the outline they cover, every other piece as its rectangle.
			expect(accent).toBe(steps[i].pieces.filter((p) => !p.id.startsWith('K')).length);
		}
		// The cap step outlines the profile.
		expect(assemblyStepSvg(sheet.diffuser!.geometry, steps, 7)).toContain('stroke-dasharray="5 3"');
		expect(() => assemblyStepSvg(sheet.diffuser!.geometry, steps, 8)).toThrow(/no assembly step 9/);
	});
});

it('refuses a build sheet that is not a diffuser', () => {
	expect(() => diffuserAssembly({ title: 'frame', parts: [], overallMm: { widthMm: 1, heightMm: 1, depthMm: 1 }, notes: [] })).toThrow(/diffusers only/);
});
