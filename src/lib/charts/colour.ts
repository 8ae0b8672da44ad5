// sRGB colour arithmetic: hex parsing, linear light, relative luminance, and mixing.

export type Rgb = readonly [r: number, g: number, b: number];

/** "#0f766e" or "#0f7" → [15, 118, 110] (0…255). */
export function parseHex(hex: string): Rgb {
	const match = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(hex.trim());
	if (!match) throw new RangeError(`expected a colour like #0f766e, got "${hex}"`);
	const digits = match[1].length === 3 ? [...match[1]].map((d) => d + d).join('') : match[1];
	return [0, 2, 4].map((i) => parseInt(digits.slice(i, i + 2), 16)) as unknown as Rgb;
}

export function toHex(rgb: Rgb): string {
	return '#' + rgb.map((c) => Math.round(Math.min(255, Math.max(0, c))).toString(16).padStart(2, '0')).join('');
}

/** sRGB channel 0…255 → linear light 0…1 (IEC 61966-2-1 transfer, as used by WCAG 2.x). */
export function channelToLinear(channel: number): number {
	const c = channel / 255;
	return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** Linear light 0…1 → sRGB channel 0…255 (inverse of channelToLinear). */
export function linearToChannel(linear: number): number {
	const l = Math.min(1, Math.max(0, linear));
	return 255 * (l <= 0.0031308 ? 12.92 * l : 1.055 * l ** (1 / 2.4) - 0.055);
}

/** Relative luminance, WCAG 2.x definition: 0.2126 R + 0.7152 G + 0.0722 B in linear light. */
export function relativeLuminance(rgb: Rgb): number {
	const [r, g, b] = rgb.map(channelToLinear);
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** Mix of a and b in linear light (t = 0 → a, 1 → b); luminance then moves linearly with t. */
export function mixLinear(a: Rgb, b: Rgb, t: number): Rgb {
	const la = a.map(channelToLinear);
	const lb = b.map(channelToLinear);
	return la.map((value, i) => linearToChannel(value + (lb[i] - value) * t)) as unknown as Rgb;
}

/** "rgba(r, g, b, alpha)" for canvas fills. */
export function withAlpha(hex: string, alpha: number): string {
	const [r, g, b] = parseHex(hex);
	return `rgba(${r}, ${g}, ${b}, ${alpha})`;
}
