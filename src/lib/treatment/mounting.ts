// Removable mounting of a panel: a pair of bevelled cleats, or blocks screwed to the wall that
// the panel is screwed to, so any panel can come down later to be changed or refinished.
// Sizes and spacings are common workshop practice (no source); the fixings into the wall are the
// builder's to choose for the wall and the load, and stay free text.
import type { Part } from './parts';

export type MountingMethod = 'none' | 'french-cleat' | 'screwed-blocks';
export const MOUNTING_METHODS: readonly MountingMethod[] = ['none', 'french-cleat', 'screwed-blocks'];

export const MOUNTING_LABELS: Record<MountingMethod, string> = {
	none: 'not fixed (free-standing or fixed by others)',
	'french-cleat': 'bevelled cleat pair, lifts off',
	'screwed-blocks': 'screwed blocks, panel unscrews'
};

/** Cleat board width, the inset of a cleat from each side of the panel, block size (common practice, no source). */
export const CLEAT_WIDTH_MM = 75;
export const CLEAT_INSET_MM = 40;
export const BLOCK_LENGTH_MM = 100;
export const BLOCK_WIDTH_MM = 60;
/** Screws along a wall cleat at most this far apart (a stud spacing is 400 or 600 mm). */
export const SCREW_SPACING_MM = 400;
/** Panels taller than this get a second pair of blocks each side. */
export const TALL_PANEL_MM = 1200;

export interface MountingUnit {
	widthMm: number;
	heightMm: number;
	/** Board the mounting pieces are cut from. */
	boardMm: number;
	/** Where blocks should sit across the panel (a diffuser's deepest wells), mm from its left side. */
	anchorXsMm?: number[];
}

export interface MountingPlan {
	method: MountingMethod;
	/** Pieces of one unit's mounting (cut with the unit's parts). */
	parts: Part[];
	/** Screws: how many and where. */
	fixings: { count: number; where: string; /** No two screws further apart than this, mm. */ spacingMm?: number }[];
	notes: string[];
	/** Screwed blocks: their positions across the panel (left edge, mm) and how many at each. */
	blockXsMm: number[];
	blocksPerAnchor: number;
}

const round1 = (mm: number) => Math.round(mm * 10) / 10;

export function mountingPlan(method: MountingMethod, u: MountingUnit): MountingPlan {
	if (!MOUNTING_METHODS.includes(method)) throw new Error(`unknown mounting "${String(method)}"`);
	for (const [v, what] of [[u.widthMm, 'width'], [u.heightMm, 'height'], [u.boardMm, 'board']] as const) {
		if (!(Number.isFinite(v) && v > 0)) throw new Error(`mounting: ${what} must be a positive number of mm, got ${v}`);
	}
	if (method === 'none') return { method, parts: [], fixings: [], notes: [], blockXsMm: [], blocksPerAnchor: 0 };
	if (method === 'french-cleat') {
		const length = u.widthMm - 2 * CLEAT_INSET_MM;
		if (length < 2 * CLEAT_WIDTH_MM) throw new Error(`a ${round1(u.widthMm)} mm wide panel is too narrow for a cleat; use screwed blocks`);
		// Screws at both ends and no two further apart than the spacing.
		const wallScrews = Math.max(2, Math.ceil(length / SCREW_SPACING_MM) + 1);
		const cleat = (name: string): Part => ({ name, quantity: 1, lengthMm: round1(length), widthMm: CLEAT_WIDTH_MM, thicknessMm: u.boardMm, finishedFaces: 0, grain: 'along-length', note: 'rip one board at 45° into the pair' });
		return {
			method,
			parts: [cleat('wall cleat'), cleat('panel cleat'), { name: 'bottom spacer', quantity: 1, lengthMm: round1(length), widthMm: 40, thicknessMm: u.boardMm, finishedFaces: 0, grain: 'along-length', note: 'keeps the panel plumb: as thick as the cleat pair' }],
			fixings: [
				{ count: wallScrews, where: 'through the wall cleat into the structure, at every stud', spacingMm: SCREW_SPACING_MM },
				{ count: wallScrews, where: 'through the panel cleat into the panel, bevel down and facing the wall' }
			],
			notes: ['The panel lifts off its cleat; nothing to unscrew. Fit the wall cleat level, bevel up and facing the wall.'],
			blockXsMm: [],
			blocksPerAnchor: 0
		};
	}
	const perSide = u.heightMm > TALL_PANEL_MM ? 2 : 1;
	const xs = u.anchorXsMm?.length ? [...u.anchorXsMm] : [0, u.widthMm - BLOCK_WIDTH_MM];
	const blocks = xs.length * 2 * perSide;
	return {
		method,
		parts: [{ name: 'mounting block', quantity: blocks, lengthMm: BLOCK_LENGTH_MM, widthMm: BLOCK_WIDTH_MM, thicknessMm: u.boardMm, finishedFaces: 0, grain: 'none' }],
		fixings: [
			{ count: blocks * 2, where: 'two through each block into the structure' },
			{ count: blocks, where: u.anchorXsMm?.length ? 'one through each back strip of a deepest well into its block: unscrew these to take the panel down' : "one through the panel's frame into each block: unscrew these to take the panel down" }
		],
		notes: [`${blocks} blocks, ${perSide === 2 ? 'two' : 'one'} near the top and ${perSide === 2 ? 'two' : 'one'} near the bottom ${u.anchorXsMm?.length ? 'behind each deepest well' : 'at each side'}.`],
		blockXsMm: xs.map(round1),
		blocksPerAnchor: 2 * perSide
	};
}

/** The caution a heavy unit carries wherever its mounting is shown. */
export function heavyCaution(weightText: string): string {
	return `At about ${weightText} each these units are heavy: a falling panel can injure. Fix into the structure (studs, joists, masonry) with fixings rated for the load — plasterboard alone will not hold it — and lift with two people. Follow local building codes.`;
}
