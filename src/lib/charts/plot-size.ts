// Plot height from its width, so charts keep their proportions from phones to desktops.

/** width·aspect clamped to [minPx, maxPx], whole pixels. */
export function plotHeight(widthPx: number, aspect = 0.5, minPx = 220, maxPx = 380): number {
	if (!(aspect > 0) || !(minPx > 0) || !(maxPx >= minPx)) throw new RangeError('need aspect > 0 and 0 < minPx ≤ maxPx');
	if (!Number.isFinite(widthPx) || widthPx <= 0) return minPx;
	return Math.round(Math.min(maxPx, Math.max(minPx, widthPx * aspect)));
}
