// Assembly of a diffuser, step by step: which pieces each step puts in, what each rests on, the
// face that must face out, where the joints are. The order follows the builder's practice of
// sub-assemblies of a few wells, fastened to each other, then the caps (common practice, no
// source). Every piece of the parts list is used exactly once, never before what it rests on.
import type { BuildSheet } from './buildsheet';
import type { DiffuserGeometry } from './diffuser-build';
import type { Part } from './parts';
import { DRAWING_FONT, escapeXml, line, PALETTE, px, rect, text } from './svg';
import { formatLength, type LengthUnit } from './units';

export interface AssemblyPiece {
	/** Piece id within the unit: F0 … FN fins (F0 and FN the sides), B0 … well bottoms, P back, S… blocks, H… shims, K1/K2 caps. */
	id: string;
	/** The parts-list entry it is cut as (keyed to the cut list by name and size). */
	part: Part;
	/** Pieces it is glued to or stands on, all placed before it. */
	restsOn: string[];
}

export interface AssemblyStep {
	n: number;
	title: string;
	/** Pieces this step puts in, in order. */
	pieces: AssemblyPiece[];
	/** Sub-assemblies this step fastens together (a join step puts in no new piece). */
	joins: string[];
	/** Which face of the one-side-finished pieces faces out. */
	faceOut: string;
	/** Where the glue lines and fasteners go. */
	joints: string;
	/** Depths to set the well bottoms of this step at, front edge to the bottom's face, mm (shown in the page's unit). */
	depthsMm: number[];
}

const round1 = (mm: number) => Math.round(mm * 10) / 10;
const near = (a: number, b: number) => Math.abs(a - b) < 0.05 + 1e-9;

function partNamed(sheet: BuildSheet, name: string, widthMm?: number, thicknessMm?: number): Part {
	const found = sheet.parts.find((p) => p.name === name && (widthMm === undefined || near(p.widthMm, widthMm)) && (thicknessMm === undefined || near(p.thicknessMm, thicknessMm)));
	if (!found) throw new Error(`the parts list has no "${name}"${widthMm !== undefined ? ` ${round1(widthMm)} mm wide` : ''}`);
	return found;
}

const letter = (i: number) => String.fromCharCode(65 + i);

/** Wells per sub-assembly: two, so each one is still easy to hold square on the bench. */
export const WELLS_PER_SUBASSEMBLY = 2;

/** Pieces of a unit's removable mounting (treatment/mounting.ts), fitted last. */
const MOUNTING_PARTS = ['panel cleat', 'wall cleat', 'bottom spacer', 'mounting block'];

/** Steps to assemble one diffuser unit of the build sheet's construction, then its mounting. */
export function diffuserAssembly(sheet: BuildSheet): AssemblyStep[] {
	const g = sheet.diffuser?.geometry;
	if (!g) throw new Error('assembly steps are drawn for diffusers only');
	const steps = g.construction === 'low-waste' ? lowWasteSteps(sheet, g) : fullDepthSteps(sheet, g);
	const mounting = sheet.parts.filter((p) => MOUNTING_PARTS.includes(p.name));
	if (mounting.length) {
		const pieces: AssemblyPiece[] = [];
		for (const part of mounting) {
			for (let k = 0; k < part.quantity; k++) {
				// The wall cleat and the blocks go on the wall; the panel's pieces onto the finished unit.
				const onWall = part.name === 'wall cleat' || part.name === 'mounting block';
				pieces.push({ id: `M${pieces.length + 1}`, part, restsOn: onWall ? [] : ['K1', 'K2'] });
			}
		}
		steps.push({
			n: steps.length + 1,
			title: 'Mounting pieces',
			pieces,
			joins: [],
			faceOut: 'Mounting pieces are hidden behind the panel.',
			joints: 'Screw, do not glue, wherever the panel must come off the wall again.',
			depthsMm: []
		});
	}
	return steps;
}

function finPart(sheet: BuildSheet, g: DiffuserGeometry, i: number): Part {
	const fin = g.fins[i];
	if (fin.side) return partNamed(sheet, 'side', round1(fin.depthMm));
	return g.construction === 'low-waste' ? partNamed(sheet, `fin ${round1(fin.depthMm)} mm deep`) : partNamed(sheet, 'fin');
}

function lowWasteSteps(sheet: BuildSheet, g: DiffuserGeometry): AssemblyStep[] {
	const N = g.wells.length;
	const D = g.overallDepthMm - g.boardMm;
	const bottomPart = (n: number) => {
		const d = round1(g.wells[n].depthMm);
		return D - g.wells[n].depthMm <= 1e-6 ? partNamed(sheet, `back strip (depth ${d} mm)`) : partNamed(sheet, `well bottom (depth ${d} mm)`);
	};
	const groups: number[][] = [];
	for (let n = 0; n < N; n += WELLS_PER_SUBASSEMBLY) groups.push(Array.from({ length: Math.min(WELLS_PER_SUBASSEMBLY, N - n) }, (_, k) => n + k));
	const steps: AssemblyStep[] = [];
	groups.forEach((wells, j) => {
		const pieces: AssemblyPiece[] = [];
		const first = wells[0];
		pieces.push({ id: `F${first}`, part: finPart(sheet, g, first), restsOn: [] });
		for (const n of wells) {
			pieces.push({ id: `B${n}`, part: bottomPart(n), restsOn: [`F${n}`] });
			// The fin on the right of the well closes it; the next sub-assembly's first fin closes its last well.
			if (n < wells[wells.length - 1] || n === N - 1) pieces.push({ id: `F${n + 1}`, part: finPart(sheet, g, n + 1), restsOn: [`B${n}`] });
		}
		const range = wells.length > 1 ? `wells ${wells[0] + 1}–${wells[wells.length - 1] + 1}` : `well ${wells[0] + 1}`;
		steps.push({
			n: steps.length + 1,
			title: `Sub-assembly ${letter(j)}: ${range}`,
			pieces,
			joins: [],
			faceOut: "Each well bottom's finished face toward the front, into its well; fins are finished on both faces.",
			joints: "Glue each well bottom's long edges to the fins on either side, its front face at its well's depth behind the front edge; check square before the glue sets.",
			depthsMm: wells.map((n) => g.wells[n].depthMm)
		});
	});
	for (let j = 1; j < groups.length; j++) {
		const closes = groups[j - 1][groups[j - 1].length - 1];
		steps.push({
			n: steps.length + 1,
			title: `Fasten ${letter(j)} to ${j === 1 ? 'A' : `A–${letter(j - 1)}`}`,
			pieces: [],
			joins: [letter(j - 1), letter(j)],
			faceOut: 'Fronts flush: all sub-assemblies face the same way.',
			joints: `Sub-assembly ${letter(j)}'s first fin closes well ${closes + 1}: glue along the edge of that well's bottom and along the fin.`,
			depthsMm: []
		});
	}
	const all = [...g.fins.map((f) => `F${f.i}`), ...g.wells.map((w) => `B${w.n}`)];
	const cap = partNamed(sheet, 'top/bottom cap');
	steps.push({
		n: steps.length + 1,
		title: 'Top and bottom caps',
		pieces: [
			{ id: 'K1', part: cap, restsOn: all },
			{ id: 'K2', part: cap, restsOn: all }
		],
		joins: [],
		faceOut: 'The finished face of each cap outward: up on the top cap, down on the bottom cap.',
		joints: 'Glue the cap to the end of every fin and well bottom; fasten through the cap into each fin.',
		depthsMm: []
	});
	return steps;
}

function fullDepthSteps(sheet: BuildSheet, g: DiffuserGeometry): AssemblyStep[] {
	const D = g.overallDepthMm - g.boardMm;
	const back = partNamed(sheet, 'back');
	const steps: AssemblyStep[] = [];
	const step = (title: string, pieces: AssemblyPiece[], faceOut: string, joints: string) => {
		if (pieces.length) steps.push({ n: steps.length + 1, title, pieces, joins: [], faceOut, joints, depthsMm: [] });
	};
	step('Back on the bench', [{ id: 'P', part: back, restsOn: [] }], 'The back is hidden: either face.', 'Mark the fin positions on it, one every well width plus fin.');
	step(
		'Sides and fins on the back',
		g.fins.map((f) => ({ id: `F${f.i}`, part: finPart(sheet, g, f.i), restsOn: ['P'] })),
		'Fins are finished on both faces.',
		'Glue and fasten each fin through the back, square to it.'
	);
	// Blocks per strip: the strip's block part shared by every well with that block length.
	const blocks: AssemblyPiece[] = [];
	const shims: AssemblyPiece[] = [];
	const bottoms: AssemblyPiece[] = [];
	const blockWells = new Map<string, number>();
	for (const w of g.wells) if (w.bottom === 'strip' && D - w.depthMm - g.boardMm > 1e-6) blockWells.set(`spacer block ${round1(D - w.depthMm - g.boardMm)} mm`, (blockWells.get(`spacer block ${round1(D - w.depthMm - g.boardMm)} mm`) ?? 0) + 1);
	for (const w of g.wells) {
		if (w.bottom === 'shim') shims.push({ id: `H${w.n}`, part: partNamed(sheet, 'well shim', undefined, round1(D - w.depthMm)), restsOn: ['P'] });
		if (w.bottom !== 'strip') continue;
		const gap = D - w.depthMm;
		const under: string[] = [];
		if (gap - g.boardMm > 1e-6) {
			const name = `spacer block ${round1(gap - g.boardMm)} mm`;
			const part = partNamed(sheet, name);
			const perWell = part.quantity / blockWells.get(name)!;
			for (let k = 0; k < perWell; k++) {
				blocks.push({ id: `S${w.n}.${k + 1}`, part, restsOn: ['P'] });
				under.push(`S${w.n}.${k + 1}`);
			}
		}
		bottoms.push({ id: `B${w.n}`, part: partNamed(sheet, `well bottom (depth ${round1(w.depthMm)} mm)`), restsOn: under.length ? under : ['P'] });
	}
	step('Spacer blocks and shims', [...blocks, ...shims], 'Blocks are hidden; a shim\'s finished face toward the front.', 'Glue each block to the back, one at each end of the well and one every 600 mm between.');
	step('Well bottoms on their blocks', bottoms, "Each well bottom's finished face toward the front, into its well.", 'Glue each bottom to its blocks and along both long edges to the fins.');
	const cap = partNamed(sheet, 'top/bottom cap');
	const all = ['P', ...g.fins.map((f) => `F${f.i}`)];
	step(
		'Top and bottom caps',
		[
			{ id: 'K1', part: cap, restsOn: all },
			{ id: 'K2', part: cap, restsOn: all }
		],
		'The finished face of each cap outward: up on the top cap, down on the bottom cap.',
		'Glue the caps to the back and the fin ends; fasten through the caps into each fin.'
	);
	return steps;
}

export interface AssemblyDrawingOptions {
	unit?: LengthUnit;
	pxPerMm?: number;
	/** Short text for a piece (its cut-list key), drawn where it fits. */
	labelOf?: (piece: AssemblyPiece) => string;
}

/** Rectangle of a piece seen from above (x across the panel, y from the front), mm; caps as their profile. */
function pieceRect(g: DiffuserGeometry, id: string): { x: number; y: number; w: number; h: number } | null {
	const D = g.overallDepthMm - g.boardMm;
	const kind = id[0];
	const num = Number(id.slice(1).split('.')[0]);
	if (kind === 'F') return { x: g.fins[num].xMm, y: 0, w: g.finMm, h: g.fins[num].depthMm };
	if (kind === 'B') return { x: g.wells[num].xMm, y: g.wells[num].depthMm, w: g.wellWidthMm, h: g.boardMm };
	if (kind === 'P') return { x: 0, y: D, w: g.panelWidthMm, h: g.boardMm };
	if (kind === 'S') return { x: g.wells[num].xMm, y: g.wells[num].depthMm + g.boardMm, w: g.wellWidthMm, h: D - g.wells[num].depthMm - g.boardMm };
	if (kind === 'H') return { x: g.wells[num].xMm, y: g.wells[num].depthMm, w: g.wellWidthMm, h: D - g.wells[num].depthMm };
	return null;
}

/**
 * One step drawn from above: the pieces placed in earlier steps muted, this step's in the accent
 * colour with their keys; caps as the outline they cover.
 */
export function assemblyStepSvg(g: DiffuserGeometry, steps: readonly AssemblyStep[], index: number, options: AssemblyDrawingOptions = {}): string {
	const step = steps[index];
	if (!step) throw new Error(`no assembly step ${index + 1}`);
	const unit = options.unit ?? 'mm';
	const s = options.pxPerMm ?? Math.min(1.2, 520 / g.panelWidthMm);
	// Mounting pieces are drawn in a row behind the back plane (on the wall side).
	const mountingRow = steps.some((st) => st.pieces.some((p) => p.id.startsWith('M')));
	const behind = mountingRow ? g.boardMm + 8 : 0;
	const margin = { left: 16, right: 16, top: 30, bottom: 24 };
	const width = margin.left + g.panelWidthMm * s + margin.right;
	const height = margin.top + (g.overallDepthMm + behind) * s + margin.bottom;
	const X = (mm: number) => margin.left + mm * s;
	const Y = (mm: number) => margin.top + mm * s;
	const title = `Step ${step.n}: ${step.title}`;
	const earlier = new Set(steps.slice(0, index).flatMap((st) => st.pieces.map((p) => p.id)));
	// A sub-assembly step shows only its own pieces (it is built apart on the bench).
	const subAssembly = step.title.startsWith('Sub-assembly');
	const out: string[] = [rect(0, 0, width, height, `fill="${PALETTE.paper}"`), text(margin.left, 18, title, `${DRAWING_FONT} font-size="11" fill="${PALETTE.ink}"`)];
	const draw = (id: string, current: boolean, label: string) => {
		const r = pieceRect(g, id);
		if (!r || r.h <= 0) return;
		const fill = current ? PALETTE.accent : id[0] === 'S' ? PALETTE.fill : PALETTE.wood;
		out.push(rect(X(r.x), Y(r.y), r.w * s, r.h * s, `fill="${fill}" fill-opacity="${current ? 0.85 : 1}" stroke="${current ? PALETTE.ink : PALETTE.woodEdge}" stroke-width="0.75"`));
		if (label && r.w * s >= label.length * 6 + 2 && r.h * s >= 11) {
			out.push(text(X(r.x + r.w / 2), Y(r.y + r.h / 2) + 4, label, `${DRAWING_FONT} font-size="9" fill="${PALETTE.paper}" text-anchor="middle"`));
		}
	};
	if (!subAssembly) for (const id of earlier) draw(id, false, '');
	for (const piece of step.pieces) if (!piece.id.startsWith('M')) draw(piece.id, true, options.labelOf?.(piece) ?? '');
	// Mounting: blocks behind the wells that reach the back plane (low-waste) or at the sides;
	// cleats and the spacer across the width.
	const mounting = step.pieces.filter((p) => p.id.startsWith('M'));
	if (mounting.length) {
		const y = g.overallDepthMm + 6;
		const D = g.overallDepthMm - g.boardMm;
		const anchors = g.construction === 'low-waste' ? g.wells.filter((w) => D - w.depthMm <= 1e-6).map((w) => w.xMm) : [0, g.panelWidthMm - g.wellWidthMm];
		const shown = new Set<string>();
		for (const piece of mounting) {
			const key = piece.part.name;
			if (shown.has(key)) continue;
			shown.add(key);
			const label = options.labelOf?.(piece) ?? '';
			const rects = key === 'mounting block' ? anchors.map((x) => ({ x, w: Math.min(piece.part.widthMm, g.panelWidthMm - x) })) : [{ x: (g.panelWidthMm - piece.part.lengthMm) / 2, w: piece.part.lengthMm }];
			for (const r of rects) {
				out.push(rect(X(r.x), Y(y), r.w * s, g.boardMm * s, `fill="${PALETTE.accent}" fill-opacity="0.85" stroke="${PALETTE.ink}" stroke-width="0.75"`));
				if (label && r.w * s >= label.length * 6 + 2) out.push(text(X(r.x + r.w / 2), Y(y + g.boardMm / 2) + 3, label, `${DRAWING_FONT} font-size="8" fill="${PALETTE.paper}" text-anchor="middle"`));
			}
		}
	}
	if (step.pieces.some((p) => p.id === 'K1')) {
		// The caps cover the whole profile: drawn as its outline.
		const pts: string[] = [`M ${px(X(0))} ${px(Y(0))}`];
		g.fins.forEach((fin, i) => {
			pts.push(`L ${px(X(fin.xMm))} ${px(Y(g.construction === 'low-waste' ? fin.depthMm : g.overallDepthMm))}`, `L ${px(X(fin.xMm + g.finMm))} ${px(Y(g.construction === 'low-waste' ? fin.depthMm : g.overallDepthMm))}`);
			if (i < g.wells.length) pts.push(`L ${px(X(g.wells[i].xMm))} ${px(Y(g.construction === 'low-waste' ? g.capDepthAtWellMm[i] : g.overallDepthMm))}`, `L ${px(X(g.wells[i].xMm + g.wellWidthMm))} ${px(Y(g.construction === 'low-waste' ? g.capDepthAtWellMm[i] : g.overallDepthMm))}`);
		});
		pts.push(`L ${px(X(g.panelWidthMm))} ${px(Y(0))} Z`);
		out.push(`<path d="${pts.join(' ')}" fill="none" stroke="${PALETTE.accent}" stroke-width="2" stroke-dasharray="5 3"/>`);
	}
	if (step.joins.length) {
		// The joint between the last two sub-assemblies: the fin that closes the well between them.
		const firstOfNew = step.joins[1].charCodeAt(0) - 65;
		const fin = g.fins[firstOfNew * WELLS_PER_SUBASSEMBLY];
		if (fin) out.push(line(X(fin.xMm + g.finMm / 2), Y(0), X(fin.xMm + g.finMm / 2), Y(fin.depthMm), `stroke="${PALETTE.accent}" stroke-width="3"`));
	}
	out.push(text(margin.left, height - 8, `front ↑${mountingRow ? ' · wall ↓' : ''} · panel ${formatLength(g.panelWidthMm, unit)} wide`, `${DRAWING_FONT} font-size="9" fill="${PALETTE.muted}"`));
	return [
		`<svg xmlns="http://www.w3.org/2000/svg" width="${px(width)}" height="${px(height)}" viewBox="0 0 ${px(width)} ${px(height)}" role="img" aria-label="${escapeXml(title)}">`,
		...out,
		'</svg>'
	].join('\n');
}
