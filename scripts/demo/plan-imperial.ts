// The demo's second plan: the Okafor basement cinema, built in inches from 4 × 8 ft sheets of
// nominal 1/2 in plywood that the caliper reads at 15/32 in. Low-waste diffusers on the rear
// wall, one of them fitted into an out-of-square recess between the concrete piers, hung on
// screwed blocks; side-wall absorbers framed in the same ply. All invented for the demo.
import type { PlanItem, PlanSettings, StockSheetRow } from '../../src/lib/plans/types';
import { DEFAULT_PLAN_SETTINGS } from '../../src/lib/plans/types';
import { inchesToMm } from '../../src/lib/treatment/units';

const inch = (v: number) => Math.round(inchesToMm(v) * 1000) / 1000;

export const IMPERIAL_PROBLEM_BANDS = [
	{ key: 'slap', fLoHz: 1000, fHiHz: 4000, tLoMs: 8, tHiMs: 40, severity: 'severe', note: 'Slap echo off the bare concrete rear wall behind the seats' },
	{ key: 'mid', fLoHz: 250, fHiHz: 1000, tLoMs: null, tHiMs: null, severity: 'moderate', note: 'Dialogue smeared by the bare side walls' }
] as const;
export type ImperialBandKey = (typeof IMPERIAL_PROBLEM_BANDS)[number]['key'];

type DemoItem = Omit<PlanItem, 'id' | 'problemBandId'> & { band: ImperialBandKey | null };

const HALF_INCH = inch(1 / 2); // 12.7 mm nominal

export const IMPERIAL_ITEMS: DemoItem[] = [
	{
		label: 'Rear-wall diffusers',
		surface: 'back',
		quantity: 2,
		widthMm: 0,
		heightMm: inch(48),
		unitPrice: 18,
		band: 'mid',
		why: 'Quadratic-residue wells scatter the rear wall from 500 Hz up; built low-waste so two panels come out of the fewest sheets.',
		params: {
			kind: 'diffuser',
			sequence: 'quadratic-residue',
			prime: 7,
			designFrequencyHz: 500,
			wellWidthMm: inch(2.5),
			finThicknessMm: HALF_INCH,
			maxDepthMm: null,
			boardThicknessMm: HALF_INCH,
			construction: 'low-waste',
			mounting: { method: 'screwed-blocks', notes: '#10 × 2 1/2 in screws into masonry plugs, two per block; #8 × 1 1/4 in through each back strip into its block.' },
			// The recess between the piers: 24 in wide at the bottom, 23 3/4 in at the top, 49 in high at the left, 49 3/8 in at the right.
			fit: { widthTopMm: inch(23.75), widthBottomMm: inch(24), heightLeftMm: inch(49), heightRightMm: inch(49.375), diagonalMm: null, clearanceMm: inch(1 / 8) }
		}
	},
	{
		label: 'Side-wall absorbers',
		surface: 'left',
		quantity: 4,
		widthMm: inch(24),
		// 47 in, so a frame side still fits on a half sheet (96 in less a kerf, halved).
		heightMm: inch(47),
		unitPrice: 35,
		band: 'slap',
		why: '4 in of fibre over a 2 in gap at the first-reflection points.',
		params: {
			kind: 'porous',
			thicknessMm: inch(4),
			airGapMm: inch(2),
			flowResistivity: 15_000,
			presetId: 'rock-wool-40',
			model: 'miki',
			frameThicknessMm: HALF_INCH,
			fabricWrapped: true,
			withBack: false,
			mounting: { method: 'french-cleat', notes: '#10 × 2 1/2 in screws into masonry plugs.' },
			fit: null
		}
	}
];

/** Nominal 1/2 in plywood, 4 × 8 ft, both faces sanded; the caliper reads 15/32 in (11.9 mm). */
export const IMPERIAL_STOCK: Omit<StockSheetRow, 'id'>[] = [
	{ label: 'Ply 1/2 in 4 × 8', lengthMm: inch(96), widthMm: inch(48), thicknessMm: inch(15 / 32), nominalThicknessMm: HALF_INCH, finishedFaces: 2, grain: 'along-length', price: 52 }
];

export const IMPERIAL_NOTES =
	'Wood glue and 1 1/4 in 18-gauge brads for the wells and caps; construction adhesive where a block meets masonry. Finish the sheets before cutting: water-based varnish.';

export const IMPERIAL_SETTINGS: PlanSettings = {
	...DEFAULT_PLAN_SETTINGS,
	temperatureC: 19,
	relativeHumidityPct: 55,
	kerfMm: inch(1 / 8),
	currency: 'USD',
	notes: IMPERIAL_NOTES,
	includeInReport: false,
	// Halve each sheet first: one person handles 4 × 4 ft at the table saw.
	sawMaxLengthMm: inch(50),
	sawMaxWidthMm: inch(50)
};
