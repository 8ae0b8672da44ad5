// How a 1-D Schroeder diffuser is built from board: where every fin and well bottom sits, in
// either of two constructions, and what each costs in board. Dimensions in mm.
//
//  - full-depth box: a full back, caps and every fin as deep as the deepest well, each well's
//    bottom a strip carried by spacer blocks on the back (buildsheet.ts);
//  - low-waste: no full back. Each fin is only as deep as the deeper of the two wells it
//    separates (plus the bottom strip it carries), each well's bottom is a strip set between its
//    two fins at its own depth, the caps are cut to the well profile, and the back plane is
//    closed only where the deepest wells reach it, by their own narrow bottom strips.
//
// Both put the front face of well n's bottom at d_n = s_n·λ0/(2N) behind the front and keep the
// clear well width w: the two quantities the design needs (D'Antonio & Konnert, JAES 32:228,
// 1984). What lies behind a rigid, sealed well bottom is not part of the well.
import type { DiffuserDesign } from './diffuser';

export type DiffuserConstruction = 'full-depth' | 'low-waste';
export const DIFFUSER_CONSTRUCTIONS: readonly DiffuserConstruction[] = ['full-depth', 'low-waste'];

export const CONSTRUCTION_LABELS: Record<DiffuserConstruction, string> = {
	'full-depth': 'full-depth box',
	'low-waste': 'low-waste (parts sized to their wells)'
};

export interface WellPlace {
	/** 0-based well number n. */
	n: number;
	/** Left edge of the clear opening, from the panel's left side. */
	xMm: number;
	/** Design depth d_n: front of the panel to the front face of the well's bottom. */
	depthMm: number;
	/** What closes the well: a strip at its depth, the full back, or a thin shim on the back. */
	bottom: 'strip' | 'back' | 'shim';
}

export interface FinPlace {
	/** 0 … N: 0 and N are the sides. */
	i: number;
	xMm: number;
	/** Front to back edge of the fin. */
	depthMm: number;
	side: boolean;
}

export interface DiffuserGeometry {
	construction: DiffuserConstruction;
	wellWidthMm: number;
	finMm: number;
	boardMm: number;
	heightMm: number;
	/** Length of fins and well bottoms: the height between the caps. */
	innerMm: number;
	panelWidthMm: number;
	/** Front to the back plane (back face of the back, or of the deepest wells' strips). */
	overallDepthMm: number;
	wells: WellPlace[];
	fins: FinPlace[];
	/** Depth of each cap at each well, front to its back edge (constant for the full-depth box). */
	capDepthAtWellMm: number[];
}

function positive(v: number, what: string): void {
	if (!(Number.isFinite(v) && v > 0)) throw new Error(`${what} must be a positive number of mm, got ${v}`);
}

export interface DiffuserGeometryOptions {
	construction: DiffuserConstruction;
	heightMm: number;
	/** Board of the caps, back and well bottoms (the measured thickness). */
	boardMm: number;
	/** Fins and sides (the measured thickness); the design's fin thickness when omitted. */
	finMm?: number;
}

/** Where every fin and well bottom of the chosen construction sits. */
export function diffuserGeometry(design: DiffuserDesign, o: DiffuserGeometryOptions): DiffuserGeometry {
	positive(o.heightMm, 'panel height');
	positive(o.boardMm, 'board thickness');
	const t = o.finMm ?? design.finThicknessM * 1000;
	positive(t, 'fin thickness');
	const b = o.boardMm;
	const w = design.wellWidthM * 1000;
	const N = design.wellCount;
	const depths = design.wellDepthsM.map((d) => d * 1000);
	const D = Math.max(...depths);
	positive(D, 'deepest well');
	const inner = o.heightMm - 2 * b;
	if (inner <= 0) throw new Error(`panel height ${o.heightMm} mm leaves no room between the ${b} mm caps`);
	const wells: WellPlace[] = depths.map((d, n) => {
		const gap = D - d;
		const bottom = o.construction === 'low-waste' ? 'strip' : gap <= 1e-6 ? 'back' : gap < b ? 'shim' : 'strip';
		return { n, xMm: t + n * (w + t), depthMm: d, bottom };
	});
	const fins: FinPlace[] = Array.from({ length: N + 1 }, (_, i) => {
		const left = i > 0 ? depths[i - 1] : 0;
		const right = i < N ? depths[i] : 0;
		// Low-waste: deep enough to carry the bottom strip of the deeper neighbour between them.
		const depthMm = o.construction === 'low-waste' ? Math.max(left, right) + b : D;
		return { i, xMm: i * (w + t), depthMm, side: i === 0 || i === N };
	});
	return {
		construction: o.construction,
		wellWidthMm: w,
		finMm: t,
		boardMm: b,
		heightMm: o.heightMm,
		innerMm: inner,
		panelWidthMm: N * w + (N + 1) * t,
		overallDepthMm: D + b,
		wells,
		fins,
		capDepthAtWellMm: depths.map((d) => (o.construction === 'low-waste' ? d + b : D))
	};
}

/**
 * Area of a low-waste cap cut to the well profile: each well's slot as deep as its bottom's back
 * face, each fin's slot as deep as the fin.
 */
export function profiledCapAreaMm2(g: DiffuserGeometry): number {
	const wells = g.wells.reduce((sum, well, n) => sum + g.wellWidthMm * g.capDepthAtWellMm[n], 0);
	const fins = g.fins.reduce((sum, fin) => sum + g.finMm * fin.depthMm, 0);
	return wells + fins;
}
