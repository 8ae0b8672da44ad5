// The report's look: A4 geometry, ink and series colours, type sizes. Our own calm palette.

/** A4 in PDF points (ISO 216: 210 × 297 mm, 72 pt per inch). */
export const PAGE = {
	width: 595.28,
	height: 841.89,
	marginTop: 56,
	marginBottom: 60,
	marginLeft: 54,
	marginRight: 54,
	/** Baseline area of the footer, inside the bottom margin. */
	footerY: 841.89 - 38
} as const;

export const CONTENT_WIDTH = PAGE.width - PAGE.marginLeft - PAGE.marginRight;

export const COLOURS = {
	ink: '#1d2430',
	inkSoft: '#4b5563',
	inkFaint: '#8a93a0',
	rule: '#d5dbe2',
	grid: '#e6eaef',
	panel: '#f3f5f8',
	after: '#0f766e',
	before: '#a8764f',
	target: '#6d5bd0',
	problem: '#1d2430'
} as const;

export const TYPE = {
	title: 20,
	subtitle: 13,
	heading: 12.5,
	body: 9.5,
	small: 8,
	table: 8.5,
	axis: 7,
	footer: 7.5
} as const;

/** Line dash of the "before" series, so the two visits stay apart in greyscale print too. */
export const BEFORE_DASH: [number, number] = [3.5, 2];

/** Opacity of a problem band's shade per severity. */
export const PROBLEM_SHADE_OPACITY = { minor: 0.06, moderate: 0.1, severe: 0.16 } as const;
