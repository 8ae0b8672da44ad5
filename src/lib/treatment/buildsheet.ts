// Parts lists for building the treatment from sheet goods. Dimensions in mm.
import { formatHz } from '../format';
import type { DiffuserDesign } from './diffuser';
import { checkPart, mergeIdenticalParts, type Part } from './parts';

export interface BuildSheet {
	title: string;
	parts: Part[];
	/** Overall outside size of the finished unit. */
	overallMm: { widthMm: number; heightMm: number; depthMm: number };
	/** Items that are not sheet parts (fabric, fill, glue) and assembly hints. */
	notes: string[];
}

const round1 = (mm: number) => Math.round(mm * 10) / 10;

/** Name of the thin packing under a shallow well: cut from thin stock or planed, not from the sheets. */
export const WELL_SHIM_PART = 'well shim';

function positive(v: number, what: string): void {
	if (!(Number.isFinite(v) && v > 0)) throw new Error(`${what} must be a positive number of mm, got ${v}`);
}

function finish(title: string, parts: Part[], overallMm: BuildSheet['overallMm'], notes: string[]): BuildSheet {
	const merged = mergeIdenticalParts(parts.map((p) => ({ ...p, lengthMm: round1(p.lengthMm), widthMm: round1(p.widthMm), thicknessMm: round1(p.thicknessMm) })));
	merged.forEach(checkPart);
	return { title, parts: merged, overallMm, notes };
}

export interface DiffuserBuildOptions {
	/** Outside height of the panel (the wells run along it). */
	heightMm: number;
	/** Board for the back, the caps and the well bottoms; fins use the design's fin thickness. */
	boardThicknessMm?: number;
	/** Spacing of the spacer blocks behind a well bottom, mm. */
	spacerSpacingMm?: number;
}

/**
 * A 1-D Schroeder diffuser as a shallow box, without filling the wells solid:
 *
 *  - the back carries everything; top and bottom caps stand on it, and the fins (the two outer
 *    ones are the sides) run between the caps, all as deep as the deepest well;
 *  - each well's bottom is one strip of board, set with its face at the well's depth; it rests
 *    on a few spacer blocks glued to the back (one at each end and one every `spacerSpacingMm`),
 *    so the space behind it stays hollow instead of being filled with stacked board;
 *  - the deepest wells need no strip: the back is their bottom; a well whose bottom sits closer
 *    to the back than one board thickness gets a thin shim instead of strip and spacers.
 */
export function diffuserBuildSheet(design: DiffuserDesign, options: DiffuserBuildOptions): BuildSheet {
	positive(options.heightMm, 'panel height');
	const fin = design.finThicknessM * 1000;
	const board = options.boardThicknessMm ?? fin;
	positive(board, 'board thickness');
	const spacing = options.spacerSpacingMm ?? 600;
	positive(spacing, 'spacer spacing');
	const w = design.wellWidthM * 1000;
	const depth = design.deepestWellM * 1000;
	const width = design.panelWidthM * 1000;
	const H = options.heightMm;
	const inner = H - 2 * board;
	if (inner <= 0) throw new Error(`panel height ${H} mm leaves no room between the ${board} mm caps`);
	positive(depth, 'deepest well');

	const parts: Part[] = [
		{ name: 'back', quantity: 1, lengthMm: H, widthMm: width, thicknessMm: board, finishedFaces: 0, grain: 'along-length' },
		{ name: 'top/bottom cap', quantity: 2, lengthMm: width, widthMm: depth, thicknessMm: board, finishedFaces: 1, grain: 'along-length' },
		{ name: 'side', quantity: 2, lengthMm: inner, widthMm: depth, thicknessMm: fin, finishedFaces: 2, grain: 'along-length' },
		{ name: 'fin', quantity: design.wellCount - 1, lengthMm: inner, widthMm: depth, thicknessMm: fin, finishedFaces: 2, grain: 'along-length' }
	];
	const blocksPerStrip = 2 + Math.floor(inner / spacing);
	let hollowVolume = 0;
	let solidVolume = 0;
	for (const depthM of design.wellDepthsM) {
		const gap = depth - depthM * 1000; // from the well bottom's face to the back
		if (gap <= 1e-6) continue;
		solidVolume += gap * w * inner;
		if (gap < board) {
			parts.push({ name: WELL_SHIM_PART, quantity: 1, lengthMm: inner, widthMm: w, thicknessMm: gap, finishedFaces: 1, grain: 'along-length', note: `cut from ${round1(gap)} mm stock or plane down` });
			continue;
		}
		parts.push({ name: `well bottom (depth ${round1(depthM * 1000)} mm)`, quantity: 1, lengthMm: inner, widthMm: w, thicknessMm: board, finishedFaces: 1, grain: 'along-length' });
		const blockLength = gap - board;
		if (blockLength > 1e-6) {
			parts.push({ name: `spacer block ${round1(blockLength)} mm`, quantity: blocksPerStrip, lengthMm: blockLength, widthMm: w, thicknessMm: board, finishedFaces: 0, grain: 'none' });
			hollowVolume += gap * w * inner - (inner * w * board + blocksPerStrip * blockLength * w * board);
		}
	}
	const savedPct = solidVolume > 0 ? (hollowVolume / solidVolume) * 100 : 0;
	return finish(
		`${design.kind === 'quadratic-residue' ? 'QRD' : 'PRD'} N = ${design.prime}, f0 = ${formatHz(design.designFrequencyHz)}`,
		parts,
		{ widthMm: round1(width), heightMm: H, depthMm: round1(depth + board) },
		[
			`Well bottoms rest on spacer blocks; the hollow saves ${savedPct.toFixed(0)} % of the board a solid fill behind the wells would take.`,
			'Glue and pin the fins square to the back; any gap between a well bottom and its fins leaks sound around the well.',
			'Mounting and fire rating of materials: follow local building codes.'
		]
	);
}

export interface PorousFrameOptions {
	widthMm: number;
	heightMm: number;
	absorberThicknessMm: number;
	airGapMm: number;
	frameThicknessMm: number;
	withBack?: boolean;
	/** Fabric wrapped around the frame hides its faces. */
	fabricWrapped?: boolean;
}

/** Frame for a porous absorber: sides and top/bottom as deep as fibre + air gap, an optional back, fabric front. */
export function porousFrameBuildSheet(o: PorousFrameOptions): BuildSheet {
	positive(o.widthMm, 'width');
	positive(o.heightMm, 'height');
	positive(o.absorberThicknessMm, 'absorber thickness');
	positive(o.frameThicknessMm, 'frame thickness');
	if (!(o.airGapMm >= 0)) throw new Error(`air gap must be zero or positive, got ${o.airGapMm} mm`);
	const f = o.frameThicknessMm;
	const depth = o.absorberThicknessMm + o.airGapMm;
	if (o.widthMm <= 2 * f || o.heightMm <= 2 * f) throw new Error('the frame is too small for its own frame thickness');
	const faces = o.fabricWrapped ? 0 : 1;
	const parts: Part[] = [
		{ name: 'frame side', quantity: 2, lengthMm: o.heightMm, widthMm: depth, thicknessMm: f, finishedFaces: faces, grain: 'along-length' },
		{ name: 'frame top/bottom', quantity: 2, lengthMm: o.widthMm - 2 * f, widthMm: depth, thicknessMm: f, finishedFaces: faces, grain: 'along-length' }
	];
	if (o.withBack) parts.push({ name: 'back', quantity: 1, lengthMm: o.heightMm, widthMm: o.widthMm, thicknessMm: f, finishedFaces: 0, grain: 'none' });
	const wrap = 50;
	return finish(
		`Porous absorber ${o.absorberThicknessMm} mm + ${o.airGapMm} mm gap`,
		parts,
		{ widthMm: o.widthMm, heightMm: o.heightMm, depthMm: depth + (o.withBack ? f : 0) },
		[
			`Fibre slab ${o.widthMm - 2 * f} × ${o.heightMm - 2 * f} × ${o.absorberThicknessMm} mm, held at the front of the frame${o.airGapMm > 0 ? `, ${o.airGapMm} mm of air behind it` : ''}.`,
			`Fabric (acoustically transparent) ${o.widthMm + 2 * depth + 2 * wrap} × ${o.heightMm + 2 * depth + 2 * wrap} mm, wrapped and stapled at the back.`,
			'Mounting and fire rating of materials: follow local building codes.'
		]
	);
}

export interface MembraneTrapBuildOptions {
	widthMm: number;
	heightMm: number;
	cavityDepthMm: number;
	panelThicknessMm: number;
	frameThicknessMm: number;
}

/** Sealed box for a panel trap: back, frame as deep as the cavity, the panel on the front. */
export function membraneTrapBuildSheet(o: MembraneTrapBuildOptions): BuildSheet {
	positive(o.widthMm, 'width');
	positive(o.heightMm, 'height');
	positive(o.cavityDepthMm, 'cavity depth');
	positive(o.panelThicknessMm, 'panel thickness');
	positive(o.frameThicknessMm, 'frame thickness');
	const f = o.frameThicknessMm;
	if (o.widthMm <= 2 * f || o.heightMm <= 2 * f) throw new Error('the box is too small for its own frame thickness');
	const parts: Part[] = [
		{ name: 'panel (membrane)', quantity: 1, lengthMm: o.heightMm, widthMm: o.widthMm, thicknessMm: o.panelThicknessMm, finishedFaces: 1, grain: 'along-length' },
		{ name: 'frame side', quantity: 2, lengthMm: o.heightMm, widthMm: o.cavityDepthMm, thicknessMm: f, finishedFaces: 1, grain: 'along-length' },
		{ name: 'frame top/bottom', quantity: 2, lengthMm: o.widthMm - 2 * f, widthMm: o.cavityDepthMm, thicknessMm: f, finishedFaces: 1, grain: 'along-length' },
		{ name: 'back', quantity: 1, lengthMm: o.heightMm, widthMm: o.widthMm, thicknessMm: f, finishedFaces: 0, grain: 'none' }
	];
	return finish(
		`Panel trap, ${o.panelThicknessMm} mm panel over ${o.cavityDepthMm} mm`,
		parts,
		{ widthMm: o.widthMm, heightMm: o.heightMm, depthMm: o.cavityDepthMm + f + o.panelThicknessMm },
		[
			`Loose fibre in the cavity, about ${Math.round(o.cavityDepthMm / 2)} mm thick against the back, not touching the panel.`,
			'Seal every joint airtight: a leaking cavity detunes the trap.',
			'Fix the panel only at its edges so it can move.',
			'Mounting and fire rating of materials: follow local building codes.'
		]
	);
}
