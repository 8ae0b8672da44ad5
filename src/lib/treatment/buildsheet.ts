// Parts lists for building the treatment from sheet goods. Dimensions in mm.
import { formatHz } from '../format';
import type { DiffuserDesign } from './diffuser';
import { checkPart, mergeIdenticalParts, type Part } from './parts';
import { DIFFUSER_CONSTRUCTIONS, diffuserGeometry, profiledCapAreaMm2, type DiffuserConstruction, type DiffuserGeometry } from './diffuser-build';

export interface BuildSheet {
	title: string;
	parts: Part[];
	/** A diffuser's construction: where every piece sits, and the board of both constructions. */
	diffuser?: DiffuserBuildInfo;
	/** Overall outside size of the finished unit. */
	overallMm: { widthMm: number; heightMm: number; depthMm: number };
	/** Items that are not sheet parts (fabric, fill, glue) and assembly hints. */
	notes: string[];
}

const round1 = (mm: number) => Math.round(mm * 10) / 10;

const SAFETY_NOTE = 'Mounting and fire rating of materials: follow local building codes.';

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
	/** Fins and sides as measured, when the board is not its nominal thickness. */
	finThicknessMm?: number;
	/** Spacing of the spacer blocks behind a well bottom, mm (full-depth box). */
	spacerSpacingMm?: number;
	construction?: DiffuserConstruction;
}

/** Board of one construction: the blanks cut from sheets (shims excluded) and their volume. */
export interface ConstructionBoard {
	construction: DiffuserConstruction;
	pieces: number;
	/** Area of the blanks the sheets must give, m². */
	boardAreaM2: number;
	/** Volume of the finished parts (profiled caps as cut), m³. */
	volumeM3: number;
}

export interface DiffuserBuildInfo {
	geometry: DiffuserGeometry;
	/** Both constructions of the same design, the chosen one first. */
	chosen: ConstructionBoard;
	other: ConstructionBoard;
	/** Board the low-waste construction saves against the full-depth box, m² and % of the box's. */
	lowWasteSavingM2: number;
	lowWasteSavingPct: number;
}

/** Board of a parts list: blank area of the parts cut from sheets, volume of all. */
export function boardOf(construction: DiffuserConstruction, parts: readonly Part[]): ConstructionBoard {
	const cut = parts.filter((p) => p.name !== WELL_SHIM_PART);
	return {
		construction,
		pieces: cut.reduce((n, p) => n + p.quantity, 0),
		boardAreaM2: cut.reduce((sum, p) => sum + p.quantity * p.lengthMm * p.widthMm, 0) / 1e6,
		volumeM3: parts.reduce((sum, p) => sum + p.quantity * (p.areaMm2 ?? p.lengthMm * p.widthMm) * p.thicknessMm, 0) / 1e9
	};
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
 *
 * With `construction: 'low-waste'` the parts are sized to their wells instead (see
 * diffuser-build.ts): no back, no spacer blocks, fins as deep as their deeper well, caps cut to
 * the well profile. Either way the sheet carries the board of both constructions.
 */
export function diffuserBuildSheet(design: DiffuserDesign, options: DiffuserBuildOptions): BuildSheet {
	const construction = options.construction ?? 'full-depth';
	if (!DIFFUSER_CONSTRUCTIONS.includes(construction)) throw new Error(`unknown diffuser construction "${String(construction)}"`);
	const full = fullDepthSheet(design, options);
	const low = lowWasteSheet(design, options);
	const chosen = construction === 'low-waste' ? low : full;
	const boards = { 'full-depth': boardOf('full-depth', full.parts), 'low-waste': boardOf('low-waste', low.parts) };
	const saving = boards['full-depth'].boardAreaM2 - boards['low-waste'].boardAreaM2;
	const savingPct = (saving / boards['full-depth'].boardAreaM2) * 100;
	const other = construction === 'low-waste' ? 'full-depth' : 'low-waste';
	const b = options.boardThicknessMm ?? design.finThicknessM * 1000;
	const geometry = diffuserGeometry(design, { construction, heightMm: options.heightMm, boardMm: b, finMm: options.finThicknessMm });
	const comparison =
		construction === 'low-waste'
			? `Low-waste construction: ${savingPct.toFixed(0)} % less board than the full-depth box (both are compared below).`
			: `The low-waste construction (parts sized to their wells) would take ${savingPct.toFixed(0)} % less board (both are compared below).`;
	const acoustics =
		'Acoustics: both constructions put every well bottom at its design depth and keep the clear well width, so the diffusion is the same; what lies behind a well bottom is not part of the well as long as the bottom is rigid and sealed to its fins.';
	return {
		...chosen,
		notes: [...chosen.notes.slice(0, -1), comparison, acoustics, chosen.notes[chosen.notes.length - 1]],
		diffuser: { geometry, chosen: boards[construction], other: boards[other], lowWasteSavingM2: saving, lowWasteSavingPct: savingPct }
	};
}

function fullDepthSheet(design: DiffuserDesign, options: DiffuserBuildOptions): BuildSheet {
	positive(options.heightMm, 'panel height');
	const fin = options.finThicknessMm ?? design.finThicknessM * 1000;
	positive(fin, 'fin thickness');
	const board = options.boardThicknessMm ?? design.finThicknessM * 1000;
	positive(board, 'board thickness');
	const spacing = options.spacerSpacingMm ?? 600;
	positive(spacing, 'spacer spacing');
	const w = design.wellWidthM * 1000;
	const depth = design.deepestWellM * 1000;
	const width = design.wellCount * w + (design.wellCount + 1) * fin;
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
			SAFETY_NOTE
		]
	);
}

/** Name of the narrow strip that closes a deepest well at the back plane. */
export const BACK_STRIP_PART = 'back strip';

/** The low-waste construction's parts: fins sized to their wells, a strip per well, profiled caps, no back. */
function lowWasteSheet(design: DiffuserDesign, options: DiffuserBuildOptions): BuildSheet {
	const board = options.boardThicknessMm ?? design.finThicknessM * 1000;
	const g = diffuserGeometry(design, { construction: 'low-waste', heightMm: options.heightMm, boardMm: board, finMm: options.finThicknessMm });
	const D = g.overallDepthMm - g.boardMm;
	const parts: Part[] = [];
	for (const f of g.fins) {
		parts.push({ name: f.side ? 'side' : `fin ${round1(f.depthMm)} mm deep`, quantity: 1, lengthMm: g.innerMm, widthMm: f.depthMm, thicknessMm: g.finMm, finishedFaces: 2, grain: 'along-length' });
	}
	for (const well of g.wells) {
		const deepest = D - well.depthMm <= 1e-6;
		parts.push({
			name: deepest ? `${BACK_STRIP_PART} (depth ${round1(well.depthMm)} mm)` : `well bottom (depth ${round1(well.depthMm)} mm)`,
			quantity: 1,
			lengthMm: g.innerMm,
			widthMm: g.wellWidthMm,
			thicknessMm: g.boardMm,
			finishedFaces: 1,
			grain: 'along-length'
		});
	}
	const capArea = profiledCapAreaMm2(g);
	parts.push({
		name: 'top/bottom cap',
		quantity: 2,
		lengthMm: g.panelWidthMm,
		widthMm: g.overallDepthMm,
		thicknessMm: g.boardMm,
		finishedFaces: 1,
		grain: 'along-length',
		areaMm2: round1(capArea),
		note: `cut to the well profile: ${g.capDepthAtWellMm.map((d) => round1(d)).join(', ')} mm deep at the wells`
	});
	const sides = g.fins.filter((f) => f.side).map((f) => round1(f.depthMm));
	return finish(
		`${design.kind === 'quadratic-residue' ? 'QRD' : 'PRD'} N = ${design.prime}, f0 = ${formatHz(design.designFrequencyHz)}, low-waste`,
		parts,
		{ widthMm: round1(g.panelWidthMm), heightMm: g.heightMm, depthMm: round1(g.overallDepthMm) },
		[
			`No full back: each well's bottom is a strip glued between its two fins with its face at the well's depth; the ${g.wells.filter((w) => D - w.depthMm <= 1e-6).length} deepest wells close the back plane with their own strips. Sides ${sides.join(' and ')} mm deep.`,
			'Seal every well bottom to its fins: a gap leaks sound into the space behind the shallow wells, which is open at the back.',
			SAFETY_NOTE
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
			SAFETY_NOTE
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
			SAFETY_NOTE
		]
	);
}
