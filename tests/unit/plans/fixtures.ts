// Small plans for the plan tests: rooms, a catalogue of flat-coefficient materials, items of each
// kind and stock sheets. Shared by the tests in this folder (not a test file itself).
import type { Material } from '../../../src/lib/treatment/materials';
import type { SurfaceId } from '../../../src/lib/treatment/surfaces';
import {
	DEFAULT_PLAN_SETTINGS,
	type DiffuserParams,
	type MaterialCatalogue,
	type MembraneParams,
	type PlanItem,
	type PlanOpening,
	type PlanSettings,
	type PorousParams,
	type StockSheetRow,
	type StoredPlan
} from '../../../src/lib/plans/types';

/** Speed of sound, m/s: air at about 20 °C, the common handbook value (also the c of the python-acoustics Sabine/Eyring example). */
export const C = 343;
/** 24·ln 10: the 60 dB decay constant of the reverberation formulas (Kuttruff, Room Acoustics). */
export const DECAY_60 = 24 * Math.LN10;

export const SURFACES: readonly SurfaceId[] = ['floor', 'ceiling', 'front', 'back', 'left', 'right'];

/** A material with the same coefficient in all six table bands. */
export function flatMaterial(id: string, alpha: number): Material {
	return { id, name: `flat ${alpha}`, coefficients: [alpha, alpha, alpha, alpha, alpha, alpha], source: 'test', confidence: 'user entry' };
}

/** The default finish: the "hard surface" row of Vorländer, Auralization (Springer 2008), annex (125 … 4k), as carried in pyroomacoustics' materials.json. */
export const HARD_SURFACE: Material = {
	id: 'hard-surface',
	name: 'Hard surface',
	coefficients: [0.02, 0.02, 0.03, 0.03, 0.04, 0.05],
	source: 'Vorländer, Auralization, annex',
	confidence: 'published'
};

/** Catalogue of the given materials plus the default finish (a plan falls back on it). */
export function catalogueOf(...materials: Material[]): MaterialCatalogue {
	return new Map([HARD_SURFACE, ...materials].map((m) => [m.id, m]));
}

export const finishesAll = (key: string): Record<SurfaceId, string> => Object.fromEntries(SURFACES.map((s) => [s, key])) as Record<SurfaceId, string>;

export function planOf(over: Partial<Omit<StoredPlan, 'settings'>> & { settings?: Partial<PlanSettings> } = {}): StoredPlan {
	return {
		id: null,
		finishes: over.finishes ?? finishesAll('hard-surface'),
		openings: over.openings ?? [],
		items: over.items ?? [],
		stock: over.stock ?? [],
		settings: { ...DEFAULT_PLAN_SETTINGS, ...over.settings }
	};
}

export function opening(over: Partial<PlanOpening> = {}): PlanOpening {
	return { id: 1, label: 'Door', surface: 'front', widthM: 0.9, heightM: 2.0, materialKey: 'hard-surface', ...over };
}

export const POROUS: PorousParams = {
	kind: 'porous',
	thicknessMm: 100,
	airGapMm: 50,
	flowResistivity: 15_000,
	presetId: 'rock-wool-40',
	model: 'miki',
	frameThicknessMm: 18,
	fabricWrapped: true,
	withBack: false,
	mounting: { method: 'none', notes: '' },
	fit: null
};

/** 6 mm plywood over a 276 mm fibre-filled cavity (the planner's trap for 36–72 Hz). */
export const MEMBRANE: MembraneParams = { kind: 'membrane', panelThicknessMm: 6, panelStockId: 'plywood', cavityDepthMm: 276, cavityFill: 'porous', frameThicknessMm: 18, mounting: { method: 'none', notes: '' }, fit: null };

/** A QRD worked from its design formulas (Schroeder, JASA 65:958, 1979; D'Antonio & Konnert, JAES 32:228, 1984): N = 7, f0 = 500 Hz, 50 mm wells, 6 mm fins; 18 mm board. */
export const QRD7: DiffuserParams = {
	kind: 'diffuser',
	sequence: 'quadratic-residue',
	prime: 7,
	designFrequencyHz: 500,
	wellWidthMm: 50,
	finThicknessMm: 6,
	maxDepthMm: null,
	boardThicknessMm: 18,
	construction: 'full-depth',
	mounting: { method: 'none', notes: '' },
	fit: null
};

let nextId = 1;
export function item(over: Partial<PlanItem> & Pick<PlanItem, 'params'>): PlanItem {
	return {
		id: nextId++,
		label: `${over.params.kind} item`,
		surface: null,
		quantity: 1,
		widthMm: over.params.kind === 'diffuser' ? 398 : 600,
		heightMm: 1200,
		unitPrice: null,
		problemBandId: null,
		why: null,
		...over
	};
}

export const STOCK_18_ONE_FACE: StockSheetRow = { id: 1, label: 'Birch ply 18 B/BB', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 1, grain: 'along-length', price: 96, nominalThicknessMm: null };
export const STOCK_18_UTILITY: StockSheetRow = { id: 2, label: 'Poplar ply 18 utility', lengthMm: 2440, widthMm: 1220, thicknessMm: 18, finishedFaces: 0, grain: 'along-length', price: 58, nominalThicknessMm: null };
export const STOCK_6_TWO_FACES: StockSheetRow = { id: 3, label: 'Birch ply 6 B/B', lengthMm: 2440, widthMm: 1220, thicknessMm: 6, finishedFaces: 2, grain: 'along-length', price: 44, nominalThicknessMm: null };
export const STOCK = [STOCK_18_ONE_FACE, STOCK_18_UTILITY, STOCK_6_TWO_FACES];

/**
 * A plan like the demo's attic room: four panel traps, ten side-wall absorbers, four ceiling
 * clouds with a deep gap, three N = 7 diffusers on the back wall.
 */
export function demoLikeItems(): PlanItem[] {
	return [
		item({ id: 101, label: 'Front-corner panel traps', surface: 'front', quantity: 4, params: MEMBRANE, unitPrice: 24 }),
		item({ id: 102, label: 'Side absorbers', surface: 'left', quantity: 10, params: POROUS, unitPrice: 41 }),
		item({ id: 103, label: 'Ceiling cloud', surface: 'ceiling', quantity: 4, params: { ...POROUS, airGapMm: 200 }, unitPrice: 46 }),
		item({ id: 104, label: 'Rear diffuser', surface: 'back', quantity: 3, params: QRD7, unitPrice: 12 })
	];
}
