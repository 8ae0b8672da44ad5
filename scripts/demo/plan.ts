// The demo's treatment plan for the Lindqvist attic room, its problem bands, and the decay
// times of the "after treatment" visit. All invented for the demo.
//
// The treated visit's reverberation times are made from this plan: its prediction (calibrated
// on the untreated visit's decay times) with deviations of the kind a real installation shows —
// traps falling short of their estimate in the lowest octave, fabric and diffuser wood absorbing
// a little more treble than planned. So the demo's "predicted vs measured" reads like a real one.
import { evaluatePlan } from '../../src/lib/plans/evaluate';
import { proposeMembraneTrap } from '../../src/lib/treatment/planner';
import { bs1116Target } from '../../src/lib/analysis/targets';
import { MATERIALS } from '../../src/lib/treatment/materials';
import { PLANNING_BANDS_HZ } from '../../src/lib/treatment/bands';
import type { PlanItem, StockSheetRow, StoredPlan } from '../../src/lib/plans/types';
import { DEMO_PROJECTS } from './scenario';

const { lengthM, widthM, heightM } = DEMO_PROJECTS[0].room;
const room = { lengthM, widthM, heightM };

/** Problem bands the consultant marked on the untreated visit (keys tie items to them). */
export const DEMO_PROBLEM_BANDS = [
	{ key: 'boom', fLoHz: 36, fHiHz: 72, tLoMs: null, tHiMs: null, severity: 'severe', note: 'Boom: the width and height modes ring for most of a second' },
	{ key: 'low-mid', fLoHz: 100, fHiHz: 300, tLoMs: null, tHiMs: null, severity: 'moderate', note: 'Low-mid decay too long, muddy voices' },
	{ key: 'flutter', fLoHz: 2000, fHiHz: 5000, tLoMs: 5, tHiMs: 60, severity: 'severe', note: 'Flutter echo between the bare side walls' }
] as const;
export type DemoBandKey = (typeof DEMO_PROBLEM_BANDS)[number]['key'];

const trap = proposeMembraneTrap({ fLoHz: 36, fHiHz: 72 });
if (trap.kind !== 'membrane-trap') throw new Error('the planner proposed no panel trap for the boom band');

type DemoItem = Omit<PlanItem, 'id' | 'problemBandId'> & { band: DemoBandKey | null };

export const DEMO_ITEMS: DemoItem[] = [
	{
		label: 'Front-corner panel traps',
		surface: 'front',
		quantity: 4,
		widthMm: 600,
		heightMm: 1200,
		unitPrice: 24,
		band: 'boom',
		why: trap.why,
		params: { kind: 'membrane', panelThicknessMm: trap.trap.panelThicknessMm, panelStockId: 'plywood', cavityDepthMm: Math.round(trap.trap.cavityDepthM * 1000), cavityFill: 'porous', frameThicknessMm: 18, mounting: { method: 'french-cleat' as const, notes: 'Two screws per stud, 400 mm centres.' }, fit: null }
	},
	{
		label: 'Left-wall absorbers',
		surface: 'left',
		quantity: 5,
		widthMm: 600,
		heightMm: 1200,
		unitPrice: 41,
		band: 'low-mid',
		why: 'Thick fibre with an air gap reaches down into the low mids and kills the flutter at the first-reflection points.',
		params: { kind: 'porous', thicknessMm: 100, airGapMm: 50, flowResistivity: 15_000, presetId: 'rock-wool-40', model: 'miki', frameThicknessMm: 18, fabricWrapped: true, withBack: false, mounting: { method: 'none' as const, notes: 'Z-clips, bought.' }, fit: null }
	},
	{
		label: 'Right-wall absorbers',
		surface: 'right',
		quantity: 5,
		widthMm: 600,
		heightMm: 1200,
		unitPrice: 41,
		band: 'flutter',
		why: 'Opposite the left-wall panels, so no bare pair of parallel walls is left.',
		params: { kind: 'porous', thicknessMm: 100, airGapMm: 50, flowResistivity: 15_000, presetId: 'rock-wool-40', model: 'miki', frameThicknessMm: 18, fabricWrapped: true, withBack: false, mounting: { method: 'none' as const, notes: 'Z-clips, bought.' }, fit: null }
	},
	{
		label: 'Ceiling cloud',
		surface: 'ceiling',
		quantity: 4,
		widthMm: 600,
		heightMm: 1200,
		unitPrice: 46,
		band: 'low-mid',
		why: 'Hung 200 mm below the ceiling over the listening seat: the gap carries the absorption down an octave.',
		params: { kind: 'porous', thicknessMm: 100, airGapMm: 200, flowResistivity: 15_000, presetId: 'rock-wool-40', model: 'miki', frameThicknessMm: 18, fabricWrapped: true, withBack: false, mounting: { method: 'none' as const, notes: 'Z-clips, bought.' }, fit: null }
	},
	{
		label: 'Rear diffuser',
		surface: 'back',
		quantity: 3,
		widthMm: 0,
		heightMm: 1200,
		unitPrice: 12,
		band: 'flutter',
		why: 'Keeps the back of the room lively without a slap back to the seat: quadratic-residue wells, 500 Hz up to the well-width limit.',
		params: { kind: 'diffuser', sequence: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthMm: 50, finThicknessMm: 6, maxDepthMm: null, boardThicknessMm: 18, construction: 'full-depth', mounting: { method: 'french-cleat' as const, notes: 'Two screws per stud, 400 mm centres.' }, fit: null }
	}
];

export const DEMO_STOCK: Omit<StockSheetRow, 'id'>[] = [
	{ label: 'Birch ply 18 B/BB', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 1, grain: 'along-length', price: 96, nominalThicknessMm: null },
	{ label: 'Poplar ply 18 utility', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 0, grain: 'along-length', price: 58, nominalThicknessMm: null },
	{ label: 'Birch ply 6 B/B', lengthMm: 2440, widthMm: 1220, thicknessMm: 6, finishedFaces: 2, grain: 'along-length', price: 44, nominalThicknessMm: null }
];

export const DEMO_FINISHES = {
	floor: 'wood-floor-on-joists',
	ceiling: 'plasterboard',
	front: 'plaster-on-masonry',
	back: 'plaster-on-masonry',
	left: 'plasterboard',
	right: 'plasterboard'
} as const;

export const DEMO_OPENINGS = [
	{ label: 'Dormer window', surface: 'right', widthM: 1.2, heightM: 1.0, materialKey: 'glass-window' },
	{ label: 'Door', surface: 'back', widthM: 0.8, heightM: 2.0, materialKey: 'wooden-door' }
] as const;

export const DEMO_PLAN_NOTES =
	'Traps and diffusers hang on French cleats screwed into the studs (400 mm centres), two screws per stud. Absorbers on Z-clips, cloud on four eye bolts into the joists with a safety wire. PVA for the diffuser wells, construction adhesive for the spacer blocks.';

/** Untreated decay times per octave 63 Hz … 8 kHz, seconds (the demo's invented room). */
export const UNTREATED_T60_S = [0.92, 0.78, 0.62, 0.55, 0.52, 0.5, 0.46, 0.4];

/** How the installed treatment departs from its prediction, per band (invented, see above). */
const INSTALLED_DEVIATION = [0.18, 0.07, -0.04, 0.03, 0, -0.04, -0.06, -0.08];

/** The demo plan as the evaluation takes it (ids and band links are placeholders). */
export function demoStoredPlan(): StoredPlan {
	return {
		id: null,
		settings: { baselineSessionId: null, afterSessionId: null, temperatureC: 20, relativeHumidityPct: 45, kerfMm: 3, currency: 'EUR', notes: DEMO_PLAN_NOTES, includeInReport: true, sawMaxLengthMm: null, sawMaxWidthMm: null },
		finishes: { ...DEMO_FINISHES },
		openings: DEMO_OPENINGS.map((o, i) => ({ id: i + 1, ...o })),
		items: DEMO_ITEMS.map(({ band, ...item }, i) => ({ ...item, id: i + 1, problemBandId: null })),
		stock: DEMO_STOCK.map((s, i) => ({ ...s, id: i + 1 }))
	};
}

/** Decay times of the treated visit: the plan's prediction with the installation's deviations. */
export function treatedT60S(): number[] {
	const evaluation = evaluatePlan({
		room,
		plan: demoStoredPlan(),
		catalogue: new Map(MATERIALS.map((m) => [m.id, m])),
		measuredBeforeS: UNTREATED_T60_S,
		measuredAfterS: null,
		target: bs1116Target(room.lengthM * room.widthM * room.heightM, PLANNING_BANDS_HZ)
	});
	if (evaluation.problems.length) throw new Error(`demo plan: ${evaluation.problems.join('; ')}`);
	return evaluation.bands.map((b, i) => Number((b.predictedS! * (1 + INSTALLED_DEVIATION[i])).toFixed(3)));
}
