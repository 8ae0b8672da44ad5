// The report's look: A4 geometry, ink and series colours, type sizes. Inks and series tones are
// the app's palette (src/lib/colours.ts); rules, grid and panel greys are the page's own.
import { APP_COLOURS } from '../../colours';

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
	ink: APP_COLOURS.ink.DEFAULT,
	inkSoft: APP_COLOURS.ink.soft,
	inkFaint: APP_COLOURS.ink.faint,
	rule: '#d5dbe2',
	grid: '#e6eaef',
	panel: '#f3f5f8',
	after: APP_COLOURS.after.DEFAULT,
	before: APP_COLOURS.before.DEFAULT,
	target: APP_COLOURS.target.DEFAULT,
	problem: APP_COLOURS.ink.DEFAULT
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
