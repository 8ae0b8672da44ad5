import { describe, expect, it } from 'vitest';
import { parseHex, relativeLuminance } from '../../../src/lib/charts/colour';
import { CHART_COLOURS, OVERLAY_CYCLE, SEVERITY_STYLE, seriesColours, toneColour } from '../../../src/lib/charts/palette';
import { APP_COLOURS } from '../../../src/lib/colours';

function contrast(hex: string, background: string): number {
	const [a, b] = [relativeLuminance(parseHex(hex)), relativeLuminance(parseHex(background))].sort((x, y) => y - x);
	return (a + 0.05) / (b + 0.05); // WCAG 2.1 contrast ratio
}
const contrastOnPaper = (hex: string) => contrast(hex, CHART_COLOURS.paper);

describe('the app palette', () => {
	it('writes text legibly: ink, soft ink, after, alarm and caution reach 4.5:1 on paper and on raised panels (WCAG 2.1 SC 1.4.3)', () => {
		const text = [APP_COLOURS.ink.DEFAULT, APP_COLOURS.ink.soft, APP_COLOURS.after.DEFAULT, APP_COLOURS.alarm.DEFAULT, APP_COLOURS.caution.DEFAULT];
		for (const hex of text) {
			expect(contrast(hex, APP_COLOURS.paper.DEFAULT), hex).toBeGreaterThanOrEqual(4.5);
			expect(contrast(hex, APP_COLOURS.paper.raised), hex).toBeGreaterThanOrEqual(4.5);
		}
	});
});

describe('series tones', () => {
	it('numbers neutral series through the overlay cycle and passes CSS colours through', () => {
		expect(seriesColours(['neutral', 'before', 'neutral', '#123456', 'neutral'])).toEqual([
			OVERLAY_CYCLE[0],
			CHART_COLOURS.before,
			OVERLAY_CYCLE[1],
			'#123456',
			OVERLAY_CYCLE[2]
		]);
		expect(toneColour('neutral', OVERLAY_CYCLE.length + 1)).toBe(OVERLAY_CYCLE[1]);
		expect(() => toneColour('  ')).toThrow(RangeError);
	});

	it('keeps overlay hues distinct and visible against paper', () => {
		expect(new Set(OVERLAY_CYCLE).size).toBe(OVERLAY_CYCLE.length);
		// WCAG 2.1 SC 1.4.11 (non-text contrast): graphical objects need at least 3:1 against adjacent colours.
		for (const hex of [...OVERLAY_CYCLE, CHART_COLOURS.target]) expect(contrastOnPaper(hex), hex).toBeGreaterThanOrEqual(3);
	});

	it('keeps every overlay hue well apart from the before and after tones that averages and visits take', () => {
		// CIE 1976 colour difference ΔE*ab in CIELAB (CIE 15:2004, clause 8.2.1), sRGB per IEC 61966-2-1, D65 white.
		const lab = (hex: string) => {
			const [r, g, b] = parseHex(hex).map((c) => (c / 255 <= 0.04045 ? c / 255 / 12.92 : ((c / 255 + 0.055) / 1.055) ** 2.4));
			const xyz = [(0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047, 0.2126 * r + 0.7152 * g + 0.0722 * b, (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883];
			const f = (t: number) => (t > (6 / 29) ** 3 ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);
			const [fx, fy, fz] = xyz.map(f);
			return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
		};
		const deltaE = (a: string, b: string) => Math.hypot(...lab(a).map((v, i) => v - lab(b)[i]));
		// Sanity of the formula: white against black is ΔE = 100 (L* from 100 to 0).
		expect(deltaE('#ffffff', '#000000')).toBeCloseTo(100, 0);
		// A ΔE of about 20 or more reads as a different colour at a glance (common practice, no source).
		for (const hex of OVERLAY_CYCLE) {
			expect(deltaE(hex, CHART_COLOURS.after), hex).toBeGreaterThanOrEqual(20);
			expect(deltaE(hex, CHART_COLOURS.before), hex).toBeGreaterThanOrEqual(20);
		}
	});

	it('shades worse problems more strongly', () => {
		const alpha = (fill: string) => Number(/,\s*([\d.]+)\)$/.exec(fill)![1]);
		expect(alpha(SEVERITY_STYLE.minor.fill)).toBeLessThan(alpha(SEVERITY_STYLE.moderate.fill));
		expect(alpha(SEVERITY_STYLE.moderate.fill)).toBeLessThanOrEqual(alpha(SEVERITY_STYLE.severe.fill));
		expect(SEVERITY_STYLE.severe.edge).toBe(CHART_COLOURS.alarm);
	});
});
