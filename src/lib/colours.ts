// Ringdown's own palette, defined once: slate ink on warm paper, a teal "after" tone, a muted
// clay "before". Tailwind (tailwind.config.ts), the canvas charts and the PDF all read it here.

export const APP_COLOURS = {
	ink: { DEFAULT: '#1d2430', soft: '#4a5566', faint: '#8a93a3' },
	paper: { DEFAULT: '#f7f5f0', raised: '#ffffff', sunk: '#eceae3' },
	after: { DEFAULT: '#0f766e', soft: '#99d5cd' },
	before: { DEFAULT: '#a8764f', soft: '#e6cdb8' },
	target: { DEFAULT: '#6d5bd0', soft: '#dcd6f7' },
	alarm: { DEFAULT: '#b42318', soft: '#fde4e1' },
	caution: { DEFAULT: '#a15c07', soft: '#fdf0d5' }
} as const;

/** Series hues beyond the palette's tones, dark enough to read as thin lines on paper. */
export const SERIES_HUES = {
	/** A third visit beside before and after (measured after treatment, against the prediction). */
	slate: '#2f6690',
	olive: '#6b7a2a',
	plum: '#8e3b75',
	/** Lighter partners of before and after, for a second metric of the same two visits. */
	beforeLight: '#c9a98c',
	afterLight: '#5fb3a9'
} as const;
