// Chart colours: the app's palette (src/lib/colours.ts, which Tailwind reads too), tones for
// series, a qualitative cycle for overlays, and severity shades for problem bands.
import { APP_COLOURS as colours, SERIES_HUES } from '../colours';
import { withAlpha } from './colour';

export const CHART_COLOURS = {
	ink: colours.ink.DEFAULT,
	inkSoft: colours.ink.soft,
	inkFaint: colours.ink.faint,
	paper: colours.paper.DEFAULT,
	paperRaised: colours.paper.raised,
	paperSunk: colours.paper.sunk,
	after: colours.after.DEFAULT,
	afterSoft: colours.after.soft,
	before: colours.before.DEFAULT,
	beforeSoft: colours.before.soft,
	target: colours.target.DEFAULT,
	targetSoft: colours.target.soft,
	alarm: colours.alarm.DEFAULT,
	caution: colours.caution.DEFAULT
} as const;

/** Named tones of a series; any other string is taken as a CSS colour. */
export type SeriesTone = 'before' | 'after' | 'neutral' | (string & {});

/**
 * Distinct hues for overlays of many positions (our own set): the palette's inks and accents
 * plus a slate blue, an olive and a plum, all dark enough to read as thin lines on paper. The
 * before and after tones are not in it: an average or a visit drawn in them stays unmistakable
 * among the positions.
 */
export const OVERLAY_CYCLE = [
	colours.ink.soft,
	colours.target.DEFAULT,
	colours.caution.DEFAULT,
	SERIES_HUES.slate,
	SERIES_HUES.plum,
	SERIES_HUES.olive,
	colours.alarm.DEFAULT
] as const;

/** Stroke colour for a series tone; "neutral" series take the overlay cycle in order. */
export function toneColour(tone: SeriesTone, neutralIndex = 0): string {
	if (tone === 'before') return CHART_COLOURS.before;
	if (tone === 'after') return CHART_COLOURS.after;
	if (tone === 'neutral') return OVERLAY_CYCLE[((neutralIndex % OVERLAY_CYCLE.length) + OVERLAY_CYCLE.length) % OVERLAY_CYCLE.length];
	if (tone.trim() === '') throw new RangeError('a series tone must be before, after, neutral or a CSS colour');
	return tone;
}

/** Stroke colours for a list of tones, numbering the neutral ones so each gets its own hue. */
export function seriesColours(tones: readonly SeriesTone[]): string[] {
	let neutral = 0;
	return tones.map((tone) => toneColour(tone, tone === 'neutral' ? neutral++ : 0));
}

export type Severity = 'minor' | 'moderate' | 'severe';

/** Shading of a problem band (translucent, so curves stay visible) and its edge/label colour. */
export const SEVERITY_STYLE: Record<Severity, { fill: string; edge: string; label: string }> = {
	minor: { fill: withAlpha(colours.caution.DEFAULT, 0.07), edge: withAlpha(colours.caution.DEFAULT, 0.45), label: 'Minor' },
	moderate: { fill: withAlpha(colours.caution.DEFAULT, 0.15), edge: colours.caution.DEFAULT, label: 'Moderate' },
	severe: { fill: withAlpha(colours.alarm.DEFAULT, 0.15), edge: colours.alarm.DEFAULT, label: 'Severe' }
};
