import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseHex, relativeLuminance } from '../../../src/lib/charts/colour';
import { CHART_COLOURS, OVERLAY_CYCLE, SEVERITY_STYLE, seriesColours, toneColour } from '../../../src/lib/charts/palette';

const CONFIG = readFileSync(fileURLToPath(new URL('../../../tailwind.config.ts', import.meta.url)), 'utf8');

function contrastOnPaper(hex: string): number {
	const [a, b] = [relativeLuminance(parseHex(hex)), relativeLuminance(parseHex(CHART_COLOURS.paper))].sort((x, y) => y - x);
	return (a + 0.05) / (b + 0.05); // WCAG 2.1 contrast ratio
}

describe('series tones', () => {
	it('use the app palette for before and after', () => {
		// The canvas cannot read Tailwind classes; the colours must still be the ones in tailwind.config.ts.
		expect(CONFIG).toContain(`before: { DEFAULT: '${toneColour('before')}'`);
		expect(CONFIG).toContain(`after: { DEFAULT: '${toneColour('after')}'`);
	});

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

	it('shades worse problems more strongly', () => {
		const alpha = (fill: string) => Number(/,\s*([\d.]+)\)$/.exec(fill)![1]);
		expect(alpha(SEVERITY_STYLE.minor.fill)).toBeLessThan(alpha(SEVERITY_STYLE.moderate.fill));
		expect(alpha(SEVERITY_STYLE.moderate.fill)).toBeLessThanOrEqual(alpha(SEVERITY_STYLE.severe.fill));
		expect(SEVERITY_STYLE.severe.edge).toBe(CHART_COLOURS.alarm);
	});
});
