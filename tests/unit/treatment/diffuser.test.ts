import { describe, expect, it } from 'vitest';
import {
	designDiffuser,
	isPrime,
	isPrimitiveRoot,
	primitiveRootSequence,
	quadraticResidueSequence,
	smallestPrimitiveRoot
} from '../../../src/lib/treatment/diffuser';
import { diffuserProfileSvg } from '../../../src/lib/treatment/diffuser-svg';

describe('quadratic-residue example worked from the design formulas (Schroeder JASA 65:958, 1979; D’Antonio & Konnert JAES 32:228, 1984)', () => {
	const design = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.01, speedOfSound: 343 });

	it('sequence n² mod 7 = 0, 1, 4, 2, 2, 4, 1', () => {
		expect(design.sequence).toEqual([0, 1, 4, 2, 2, 4, 1]);
	});

	it('depths s_n·λ0/(2N) = 0, 49, 196, 98, 98, 196, 49 mm (±0.5 mm: the expected depths are rounded to whole mm)', () => {
		const expected = [0, 49, 196, 98, 98, 196, 49];
		design.wellDepthsM.forEach((d, i) => expect(Math.abs(d * 1000 - expected[i])).toBeLessThanOrEqual(0.5));
	});

	it('flat plate at 3.5 and 7 kHz (m·N·f0); well-width limit c/(2w) = 3430 Hz for w = 50 mm', () => {
		expect(design.flatPlateFrequenciesHz.slice(0, 2)).toEqual([3500, 7000]);
		expect(design.flatPlateFrequenciesHz.every((f) => f <= 20_000)).toBe(true);
		expect(design.wellWidthLimitHz).toBeCloseTo(3430, 9);
		expect(design.workingRangeHz).toEqual({ loHz: 500, hiHz: design.wellWidthLimitHz });
	});

	it('panel width N·w + (N + 1)·t = 7·50 + 8·10 = 430 mm (fins on both sides)', () => {
		expect(design.panelWidthM * 1000).toBeCloseTo(430, 9);
		expect(design.warnings).toEqual([]);
	});

	it('raises f0 to fit a maximum depth and says so (d_max = s_max·c/(2N·f0) solved for f0)', () => {
		const shallow = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.01, maxDepthM: 0.1, speedOfSound: 343 });
		expect(shallow.designFrequencyHz).toBeCloseTo((4 * 343) / (2 * 7 * 0.1), 9); // 980 Hz
		expect(shallow.deepestWellM).toBeCloseTo(0.1, 12);
		expect(shallow.requestedDesignFrequencyHz).toBe(500);
		expect(shallow.warnings.join(' ')).toMatch(/raised to 980 Hz/);
	});

	it('keeps f0 when the wells already fit', () => {
		const roomy = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.01, maxDepthM: 0.3 });
		expect(roomy.designFrequencyHz).toBe(500);
	});
});

describe('primitive-root sequence (Cox & D’Antonio, Acoustic Absorbers and Diffusers, from memory; 3ⁿ mod 7 worked by hand)', () => {
	it('N = 7, g = 3 → 3, 2, 6, 4, 5, 1', () => {
		expect(primitiveRootSequence(7, 3)).toEqual({ primitiveRoot: 3, sequence: [3, 2, 6, 4, 5, 1] });
	});

	it('a sequence of a primitive root visits every residue 1 … N−1 once (definition of a primitive root)', () => {
		for (const N of [5, 7, 11, 13, 17, 19, 23]) {
			const { sequence } = primitiveRootSequence(N);
			expect([...sequence].sort((a, b) => a - b)).toEqual(Array.from({ length: N - 1 }, (_, i) => i + 1));
		}
	});

	it.each([
		[7, 3],
		[11, 2],
		[13, 2],
		[17, 3],
		[23, 5],
		[41, 6]
	])('smallest primitive root of %i is %i (OEIS A001918)', (N, g) => {
		expect(smallestPrimitiveRoot(N)).toBe(g);
	});

	it.each([
		[7, 2, false], // 2³ = 8 ≡ 1 mod 7
		[7, 3, true],
		[7, 5, true],
		[11, 3, false], // 3⁵ = 243 ≡ 1 mod 11
		[13, 4, false]
	])('N = %i, g = %i: primitive root? %s', (N, g, expected) => {
		expect(isPrimitiveRoot(g, N)).toBe(expected);
	});

	it('a non-primitive root is rejected with the smallest valid one named', () => {
		expect(() => primitiveRootSequence(7, 2)).toThrow(/not a primitive root of 7; the smallest one is 3/);
	});

	it('the PRD design has N − 1 wells and uses the same depth rule', () => {
		const d = designDiffuser({ kind: 'primitive-root', prime: 7, primitiveRoot: 3, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.01, speedOfSound: 343 });
		expect(d.wellCount).toBe(6);
		expect(d.wellDepthsM[2] * 1000).toBeCloseTo((6 * 343 * 1000) / 500 / 14, 9); // s = 6 → 294 mm
	});
});

describe('primality and bad input', () => {
	it.each([
		[2, true],
		[7, true],
		[97, true],
		[1, false],
		[9, false],
		[91, false],
		[7.5, false]
	])('isPrime(%f) = %s', (n, expected) => expect(isPrime(n)).toBe(expected));

	it.each([9, 15, 1, 4])('a non-prime N = %i is rejected', (N) => {
		expect(() => quadraticResidueSequence(N)).toThrow(/not a prime/);
		expect(() => designDiffuser({ kind: 'quadratic-residue', prime: N, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.01 })).toThrow(/not a prime/);
	});

	it.each([
		[{ designFrequencyHz: 0 }, /design frequency/],
		[{ wellWidthM: -0.05 }, /well width/],
		[{ finThicknessM: 0 }, /fin thickness/],
		[{ maxDepthM: 0 }, /maximum depth/]
	])('rejects %o', (patch, message) => {
		expect(() => designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.01, ...patch })).toThrow(message);
	});

	it('warns when the wells are too wide for any working range (c/(2w) ≤ f0)', () => {
		const d = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 2000, wellWidthM: 0.1, finThicknessM: 0.01 });
		expect(d.warnings.join(' ')).toMatch(/well-width limit/);
	});
});

describe('diffuserProfileSvg', () => {
	const design = designDiffuser({ kind: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthM: 0.05, finThicknessM: 0.01, speedOfSound: 343 });

	it('draws N + 1 fins and labels every well depth in mm', () => {
		const svg = diffuserProfileSvg(design, { unit: 'mm' });
		expect(svg.startsWith('<svg')).toBe(true);
		expect(svg.trim().endsWith('</svg>')).toBe(true);
		expect(svg.match(/fill="#8b6f47"\/>/g)).toHaveLength(8);
		for (const label of ['0 mm', '49 mm', '196 mm', '98 mm']) expect(svg).toContain(`>${label}<`);
	});

	it('labels in inches to the nearest 1/16″ when asked (196 mm / 25.4 = 7.7165″: 7 11/16″ is 0.029″ away, 7 3/4″ 0.034″)', () => {
		const svg = diffuserProfileSvg(design, { unit: 'in' });
		expect(Math.round((196 / 25.4) * 16)).toBe(7 * 16 + 11);
		expect(svg).toContain('>7 11/16″<');
		expect(svg).toContain('>1 15/16″<'); // 49 mm = 1.929″ → 31/16
		expect(svg).not.toContain(' mm<');
	});

	it('escapes a title with markup characters', () => {
		expect(diffuserProfileSvg(design, { title: 'A < B & C' })).toContain('A &lt; B &amp; C');
	});
});
