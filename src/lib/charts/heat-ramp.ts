// The heat-map ramp for time–frequency charts: from paper (quiet) through violet and teal to
// ink (loud), built from the app's palette. Stops are mixed in linear light, so luminance falls
// steadily along the ramp and the order of levels reads from lightness alone.
import { mixLinear, parseHex, relativeLuminance, toHex, type Rgb } from './colour';
import { CHART_COLOURS } from './palette';

const STOP_HEX = [CHART_COLOURS.paper, CHART_COLOURS.targetSoft, CHART_COLOURS.afterSoft, CHART_COLOURS.after, CHART_COLOURS.ink];

/** CIE 1976 lightness L* from relative luminance Y (white Y = 1): 116·f(Y) − 16. */
export function cieLightness(luminance: number): number {
	const f = luminance > (6 / 29) ** 3 ? Math.cbrt(luminance) : luminance / (3 * (6 / 29) ** 2) + 4 / 29;
	return 116 * f - 16;
}

interface RampStop {
	at: number;
	rgb: Rgb;
}

/** Stops placed along 0…1 in proportion to their L* distance, so equal steps look about equal. */
function buildStops(hexes: readonly string[]): RampStop[] {
	const rgbs = hexes.map(parseHex);
	const lightness = rgbs.map((rgb) => cieLightness(relativeLuminance(rgb)));
	for (let i = 1; i < lightness.length; i++) {
		if (!(lightness[i] < lightness[i - 1])) throw new Error('heat-ramp stops must get darker one after another');
	}
	const total = lightness[0] - lightness[lightness.length - 1];
	return rgbs.map((rgb, i) => ({ at: (lightness[0] - lightness[i]) / total, rgb }));
}

const STOPS = buildStops(STOP_HEX);

/** Ramp colour at t in 0…1 (clamped): 0 = quietest, 1 = loudest. */
export function rampColour(t: number): Rgb {
	if (Number.isNaN(t)) throw new RangeError('ramp position is NaN');
	const x = Math.min(1, Math.max(0, t));
	let i = 1;
	while (i < STOPS.length - 1 && x > STOPS[i].at) i++;
	const a = STOPS[i - 1];
	const b = STOPS[i];
	return mixLinear(a.rgb, b.rgb, (x - a.at) / (b.at - a.at));
}

export interface LevelBanding {
	floorDb: number;
	ceilingDb: number;
	stepDb: number;
}

/** Levels of a band edge: floor, floor + step, … up to the ceiling (the colour key's entries). */
export function bandEdges({ floorDb, ceilingDb, stepDb }: LevelBanding): number[] {
	if (!(stepDb > 0) || !(ceilingDb > floorDb)) throw new RangeError(`need stepDb > 0 and ceiling above floor, got ${floorDb}…${ceilingDb} step ${stepDb}`);
	const edges: number[] = [];
	for (let level = floorDb; level < ceilingDb - 1e-9; level += stepDb) edges.push(level);
	return edges;
}

/**
 * Colour of a level drawn in steps of stepDb (the contour-like banding): every level in
 * [edge, edge + step) gets the colour of its band; below the floor is the floor's colour.
 */
export function bandedColour(levelDb: number, banding: LevelBanding): string {
	const edges = bandEdges(banding);
	const clamped = Math.min(banding.ceilingDb, Math.max(banding.floorDb, levelDb));
	const band = Math.min(edges.length - 1, Math.floor((clamped - banding.floorDb) / banding.stepDb + 1e-9));
	return toHex(rampColour(edges.length === 1 ? 0 : band / (edges.length - 1)));
}
