import { describe, expect, it } from 'vitest';
import type { DetectedReflection } from '../../../src/lib/analysis/reflections';
import { numberedByStrength, placeLabels, reflectionLabel, surfaceName } from '../../../src/lib/charts/etc-data';

function reflection(delayMs: number, levelDb: number, surface: DetectedReflection['surface'] = null): DetectedReflection {
	// Extra path = c·delay with c = 343 m/s (air at about 20 °C, common handbook value).
	return { delayMs, levelDb, extraPathM: (343 * delayMs) / 1000, surface, predictedDelayMs: null };
}

describe('reflectionLabel', () => {
	it('shows delay, level, extra path and the surface when known', () => {
		expect(reflectionLabel(reflection(4.2, -6.14, 'floor'))).toBe('4.2 ms · \u22126.1 dB · 1.44 m · floor');
		expect(reflectionLabel(reflection(11.66, -12.0))).toBe('11.7 ms · \u221212.0 dB · 4.00 m');
		expect(surfaceName('left')).toBe('left wall');
		expect(surfaceName(null)).toBeNull();
	});
});

describe('placeLabels', () => {
	const bounds = { left: 0, top: 0, right: 400, bottom: 200 };
	const row = 14;

	it('puts labels above their points, starting at the point, when they do not collide', () => {
		const placed = placeLabels(
			[
				{ x: 100, y: 100, fullWidth: 80, shortWidth: 10 },
				{ x: 300, y: 100, fullWidth: 80, shortWidth: 10 }
			],
			bounds,
			row
		);
		expect(placed).toEqual([
			{ form: 'full', left: 96, top: 100 - 4 - row },
			{ form: 'full', left: 296, top: 100 - 4 - row }
		]);
	});

	it('lifts a colliding label by a row, then shortens it, then drops it', () => {
		const crowd = Array.from({ length: 6 }, () => ({ x: 200, y: 100, fullWidth: 120, shortWidth: 10 }));
		const placed = placeLabels(crowd, bounds, row, 1);
		// Two full rows (lift 0 and 1); a short label at the same point would sit inside those, so the rest are dropped.
		expect(placed.map((p) => p.form)).toEqual(['full', 'full', 'none', 'none', 'none', 'none']);
		expect(placed[1].top).toBe(placed[0].top - row);
		// No two placed boxes overlap.
		const boxes = placed
			.filter((p) => p.form !== 'none')
			.map((p) => ({ ...p, right: p.left + (p.form === 'full' ? 120 : 10), bottom: p.top + row }));
		for (let i = 0; i < boxes.length; i++) {
			for (let j = i + 1; j < boxes.length; j++) {
				const a = boxes[i];
				const b = boxes[j];
				expect(a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom).toBe(false);
			}
		}
	});

	it('ends a label at its point when starting there collides', () => {
		// The first label covers 196…316. The second point at x = 190 would start its 50 px label at
		// 186 (overlap); ending at the point puts it at 144…194, clear, on the same row.
		const placed = placeLabels(
			[
				{ x: 200, y: 100, fullWidth: 120, shortWidth: 10 },
				{ x: 190, y: 100, fullWidth: 50, shortWidth: 10 }
			],
			bounds,
			row,
			0
		);
		expect(placed).toEqual([
			{ form: 'full', left: 196, top: 82 },
			{ form: 'full', left: 144, top: 82 }
		]);
	});

	it('falls back to the short form where only that fits beside a neighbour', () => {
		// Plot 300 px wide. The first full label covers 96…216; the second point at x = 220 cannot
		// fit its 120 px label anywhere clear (clamped start 180…300, end 104…224, centre 160…280),
		// but its short label from 216 to 226 is clear.
		const narrow = { left: 0, top: 0, right: 300, bottom: 200 };
		const placed = placeLabels(
			[
				{ x: 100, y: 100, fullWidth: 120, shortWidth: 10 },
				{ x: 220, y: 100, fullWidth: 120, shortWidth: 10 }
			],
			narrow,
			row,
			0
		);
		expect(placed.map((p) => p.form)).toEqual(['full', 'short']);
		expect(placed[1].left).toBe(216);
	});

	it('keeps labels inside the plot and drops them when there is no room above', () => {
		const [nearEdge] = placeLabels([{ x: 390, y: 100, fullWidth: 80, shortWidth: 10 }], bounds, row);
		expect(nearEdge).toEqual({ form: 'full', left: 320, top: 82 });
		const [atTop] = placeLabels([{ x: 200, y: 10, fullWidth: 80, shortWidth: 10 }], bounds, row);
		expect(atTop.form).toBe('none');
		const [tooWide] = placeLabels([{ x: 200, y: 100, fullWidth: 500, shortWidth: 10 }], bounds, row);
		expect(tooWide.form).toBe('short');
	});

	it('does not cover another reflection’s point', () => {
		// The second point sits right where the first label would go.
		const placed = placeLabels(
			[
				{ x: 100, y: 100, fullWidth: 60, shortWidth: 10 },
				{ x: 100, y: 88, fullWidth: 60, shortWidth: 10 }
			],
			bounds,
			row
		);
		expect(placed[0].top).toBeLessThan(88 - 3 - row + 1);
	});
});

describe('numberedByStrength', () => {
	it('numbers in delay order and lists strongest first', () => {
		const list = numberedByStrength([reflection(9, -10), reflection(3, -4), reflection(6, -15)]);
		expect(list.map((r) => [r.number, r.reflection.delayMs])).toEqual([
			[1, 3],
			[3, 9],
			[2, 6]
		]);
	});
});
