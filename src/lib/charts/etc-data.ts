// Data for the energy–time chart: reflection labels, their placement without overlaps, and
// the table rows.
import type { DetectedReflection } from '../analysis/reflections';
import { formatDb, formatNumber } from '../format';

const SURFACE_NAMES: Record<NonNullable<DetectedReflection['surface']>, string> = {
	floor: 'floor',
	ceiling: 'ceiling',
	front: 'front wall',
	back: 'back wall',
	left: 'left wall',
	right: 'right wall'
};

export function surfaceName(surface: DetectedReflection['surface']): string | null {
	return surface ? SURFACE_NAMES[surface] : null;
}

/** "4.2 ms · −6.1 dB · 1.44 m · floor" (surface only when it was identified). */
export function reflectionLabel(r: DetectedReflection): string {
	const parts = [`${formatNumber(r.delayMs, 1)} ms`, `${formatDb(r.levelDb)} dB`, `${formatNumber(r.extraPathM, 2)} m`];
	const surface = surfaceName(r.surface);
	if (surface) parts.push(surface);
	return parts.join(' · ');
}

export interface LabelRequest {
	/** Anchor (the marked point), in pixels, y growing downwards. */
	x: number;
	y: number;
	fullWidth: number;
	shortWidth: number;
}

export interface PlacedLabel {
	/** 'full' text, 'short' (the reflection's number) or 'none' when neither fits. */
	form: 'full' | 'short' | 'none';
	/** Box's left edge and top, in pixels. */
	left: number;
	top: number;
}

interface Box {
	left: number;
	top: number;
	right: number;
	bottom: number;
}

function overlaps(a: Box, b: Box): boolean {
	return a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
}

/**
 * Greedy placement in the order given (strongest first is best): each label sits above its
 * point, starting at the point (else ending at it, else centred on it) and kept inside the
 * bounds, lifted by whole rows until it is clear of the labels and points already placed; it
 * falls back to its short form, then to none. The table always carries every label, so a
 * dropped label loses nothing.
 */
export function placeLabels(
	requests: readonly LabelRequest[],
	bounds: { left: number; top: number; right: number; bottom: number },
	rowHeight: number,
	maxLift = 3,
	gap = 4
): PlacedLabel[] {
	const taken: Box[] = requests.map((r) => ({ left: r.x - 3, top: r.y - 3, right: r.x + 3, bottom: r.y + 3 }));
	return requests.map((r) => {
		for (const form of ['full', 'short'] as const) {
			const width = form === 'full' ? r.fullWidth : r.shortWidth;
			if (width > bounds.right - bounds.left) continue;
			const lefts = [r.x - gap, r.x - width + gap, r.x - width / 2].map((left) => Math.min(bounds.right - width, Math.max(bounds.left, left)));
			for (let lift = 0; lift <= maxLift; lift++) {
				const top = r.y - gap - rowHeight * (lift + 1);
				if (top < bounds.top) break;
				for (const left of lefts) {
					const box = { left, top, right: left + width, bottom: top + rowHeight };
					if (!taken.some((t) => overlaps(t, box))) {
						taken.push(box);
						return { form, left, top };
					}
				}
			}
		}
		return { form: 'none', left: r.x, top: r.y };
	});
}

/** Reflections sorted strongest first, with their number in delay order (1 = earliest). */
export function numberedByStrength(reflections: readonly DetectedReflection[]): { reflection: DetectedReflection; number: number }[] {
	const byDelay = [...reflections].sort((a, b) => a.delayMs - b.delayMs);
	return byDelay.map((reflection, i) => ({ reflection, number: i + 1 })).sort((a, b) => b.reflection.levelDb - a.reflection.levelDb);
}
