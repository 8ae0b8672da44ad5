import { describe, expect, it } from 'vitest';
import { mixLinear, parseHex, relativeLuminance, toHex } from '../../../src/lib/charts/colour';
import { bandedColour, bandEdges, cieLightness, rampColour } from '../../../src/lib/charts/heat-ramp';
import { CHART_COLOURS } from '../../../src/lib/charts/palette';

/**
 * Relative luminance written out here from WCAG 2.1, "relative luminance" (Understanding SC 1.4.3),
 * independently of the module: linearise each sRGB channel, then 0.2126 R + 0.7152 G + 0.0722 B.
 */
function wcagLuminanceOf(rgb: readonly number[]): number {
	const [r, g, b] = rgb.map((channel) => {
		const c = channel / 255;
		return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
	});
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

function wcagLuminance(hex: string): number {
	return wcagLuminanceOf([1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)));
}

/** Contrast ratio (L1 + 0.05) / (L2 + 0.05), WCAG 2.1 definition. */
function contrast(a: string, b: string): number {
	const [hi, lo] = [wcagLuminance(a), wcagLuminance(b)].sort((x, y) => y - x);
	return (hi + 0.05) / (lo + 0.05);
}

describe('colour arithmetic', () => {
	it('parses and writes hex colours', () => {
		expect(parseHex('#0f766e')).toEqual([15, 118, 110]);
		expect(parseHex('#fa0')).toEqual([255, 170, 0]);
		expect(toHex([15, 118, 110])).toBe('#0f766e');
		for (const bad of ['0f766e', '#12345', 'teal', '#ggg']) expect(() => parseHex(bad)).toThrow(RangeError);
	});

	it('gives the WCAG 2.x relative luminance', () => {
		// White 1 and black 0 by definition; #767676 on white is 4.54:1, the lightest grey passing
		// 4.5:1 (WebAIM contrast checker; from memory), i.e. L = 1.05 / 4.54 − 0.05 ≈ 0.181.
		expect(relativeLuminance([255, 255, 255])).toBeCloseTo(1, 12);
		expect(relativeLuminance([0, 0, 0])).toBe(0);
		expect(1.05 / (relativeLuminance(parseHex('#767676')) + 0.05)).toBeCloseTo(4.54, 2);
		for (const hex of Object.values(CHART_COLOURS)) expect(relativeLuminance(parseHex(hex))).toBeCloseTo(wcagLuminance(hex), 12);
	});

	it('mixes in linear light, so luminance moves linearly between two colours', () => {
		const a = parseHex(CHART_COLOURS.paper);
		const b = parseHex(CHART_COLOURS.ink);
		const [la, lb] = [relativeLuminance(a), relativeLuminance(b)];
		for (const t of [0, 0.25, 0.5, 0.75, 1]) {
			// 1e-9: the mix is not rounded to 8-bit channels here, so only floating-point error remains.
			expect(relativeLuminance(mixLinear(a, b, t))).toBeCloseTo(la + (lb - la) * t, 9);
		}
	});
});

describe('heat-map ramp', () => {
	it('computes CIE L* from luminance (CIE 15:2004: L* = 116·(Y/Yn)^(1/3) − 16)', () => {
		expect(cieLightness(1)).toBeCloseTo(100, 9);
		expect(cieLightness(((50 + 16) / 116) ** 3)).toBeCloseTo(50, 9);
		expect(cieLightness(0)).toBeCloseTo(0, 9);
	});

	it('runs from paper to ink', () => {
		expect(toHex(rampColour(0))).toBe(CHART_COLOURS.paper);
		expect(toHex(rampColour(1))).toBe(CHART_COLOURS.ink);
		expect(toHex(rampColour(-1))).toBe(CHART_COLOURS.paper); // clamped
		expect(() => rampColour(Number.NaN)).toThrow(RangeError);
	});

	it('falls strictly in WCAG relative luminance along the ramp, so louder always reads darker', () => {
		// The continuous ramp (channels before rounding to 8 bits): strictly monotonic at 1/1024 steps.
		const luminances = Array.from({ length: 1025 }, (_, i) => wcagLuminanceOf(rampColour(i / 1024)));
		for (let i = 1; i < luminances.length; i++) expect(luminances[i], `step ${i}`).toBeLessThan(luminances[i - 1]);
		expect(contrast(toHex(rampColour(0)), toHex(rampColour(1)))).toBeGreaterThan(10);
	});

	it('stays monotonic after rounding to 8-bit colours at 1/32 steps (finer steps can tie or flip by rounding)', () => {
		// Rounding each channel to an integer moves luminance by up to ~1e-3 in the dark end, so
		// only steps coarser than that are guaranteed; the drawn colours are banded far coarser.
		const rounded = Array.from({ length: 33 }, (_, i) => wcagLuminance(toHex(rampColour(i / 32))));
		for (let i = 1; i < rounded.length; i++) expect(rounded[i], `step ${i}`).toBeLessThan(rounded[i - 1]);
	});

	const banding = { floorDb: -80, ceilingDb: 0, stepDb: 6 };

	it('bands levels in whole steps from the floor', () => {
		const edges = bandEdges(banding);
		expect(edges[0]).toBe(-80);
		expect(edges.at(-1)).toBe(-2); // −80 + 13·6
		expect(edges).toHaveLength(14);
		expect(() => bandEdges({ floorDb: 0, ceilingDb: -80, stepDb: 6 })).toThrow(RangeError);
	});

	it('gives one colour per band and darker colours to louder bands', () => {
		expect(bandedColour(-79.9, banding)).toBe(bandedColour(-74.1, banding)); // same band [−80, −74)
		expect(bandedColour(-74, banding)).not.toBe(bandedColour(-74.1, banding)); // next band starts at −74
		expect(bandedColour(-200, banding)).toBe(bandedColour(-80, banding)); // below the floor
		expect(bandedColour(0, banding)).toBe(bandedColour(-1, banding)); // top band [−2, 0]
		const byBand = bandEdges(banding).map((edge) => wcagLuminance(bandedColour(edge, banding)));
		for (let i = 1; i < byBand.length; i++) expect(byBand[i]).toBeLessThan(byBand[i - 1]);
	});
});
