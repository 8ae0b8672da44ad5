// The shapes of a room's treatment plan as stored and as the pages use them. Lengths of built
// things are millimetres; room geometry is metres (as the room itself).
import type { CavityFill } from '../treatment/membrane';
import type { DiffuserKind } from '../treatment/diffuser';
import type { Material } from '../treatment/materials';
import type { PorousModel } from '../treatment/porous';
import type { SurfaceId } from '../treatment/surfaces';

export const ITEM_KINDS = ['porous', 'membrane', 'diffuser'] as const;
export type ItemKind = (typeof ITEM_KINDS)[number];

export const ITEM_KIND_LABELS: Record<ItemKind, string> = {
	porous: 'Porous absorber',
	membrane: 'Panel bass trap',
	diffuser: 'Diffuser'
};

export const SURFACE_LABELS: Record<SurfaceId, string> = {
	floor: 'Floor',
	ceiling: 'Ceiling',
	front: 'Front wall',
	back: 'Back wall',
	left: 'Left wall',
	right: 'Right wall'
};

/** Fibre layer with an optional air gap, in a timber frame. */
export interface PorousParams {
	kind: 'porous';
	thicknessMm: number;
	airGapMm: number;
	/** Air-flow resistivity σ, Pa·s/m². */
	flowResistivity: number;
	/** The preset σ came from, if any (for the label). */
	presetId: string | null;
	/** Empirical model of the fibre: Miki (default; stays physical outside the fitted range) or Delany–Bazley. */
	model: PorousModel;
	frameThicknessMm: number;
	fabricWrapped: boolean;
	withBack: boolean;
}

/** Limp panel over a sealed cavity. */
export interface MembraneParams {
	kind: 'membrane';
	panelThicknessMm: number;
	/** Panel stock (plywood, MDF, hardboard): its density gives the surface mass. */
	panelStockId: string;
	cavityDepthMm: number;
	cavityFill: CavityFill;
	frameThicknessMm: number;
}

/** One-dimensional Schroeder diffuser; the panel width follows from the design. */
export interface DiffuserParams {
	kind: 'diffuser';
	sequence: DiffuserKind;
	prime: number;
	designFrequencyHz: number;
	wellWidthMm: number;
	finThicknessMm: number;
	maxDepthMm: number | null;
	boardThicknessMm: number;
}

export type ItemParams = PorousParams | MembraneParams | DiffuserParams;

export interface PlanItem {
	id: number;
	label: string;
	/** The surface it is mounted on (its finish stops absorbing behind it), or null when free-standing. */
	surface: SurfaceId | null;
	quantity: number;
	/** Face size of one unit, mm. For a diffuser the width is the design's panel width. */
	widthMm: number;
	heightMm: number;
	params: ItemParams;
	/** Price of one unit's bought materials (fibre, fabric, fixings), in the plan's currency. */
	unitPrice: number | null;
	problemBandId: number | null;
	/** Why it is in the plan (the planner's sentence, or the consultant's). */
	why: string | null;
}

/** A material as the plan refers to it: built-in by id, or the organization's own as "custom-<id>". */
export type MaterialKey = string;

export interface PlanOpening {
	id: number;
	label: string;
	surface: SurfaceId;
	widthM: number;
	heightM: number;
	materialKey: MaterialKey;
}

export interface StockSheetRow {
	id: number;
	label: string;
	lengthMm: number;
	widthMm: number;
	thicknessMm: number;
	finishedFaces: 0 | 1 | 2;
	grain: 'along-length' | 'none';
	/** Price of one sheet, in the plan's currency. */
	price: number | null;
}

export interface PlanSettings {
	baselineSessionId: number | null;
	afterSessionId: number | null;
	temperatureC: number;
	relativeHumidityPct: number;
	kerfMm: number;
	currency: string;
	/** Fasteners, adhesive, hanging hardware: free text, not a catalogue. */
	notes: string;
	includeInReport: boolean;
}

export const DEFAULT_PLAN_SETTINGS: PlanSettings = {
	baselineSessionId: null,
	afterSessionId: null,
	temperatureC: 20,
	relativeHumidityPct: 50,
	kerfMm: 3,
	currency: 'EUR',
	notes: '',
	includeInReport: true
};

/** Finish assumed for a surface nobody has described yet. */
export const DEFAULT_FINISH: MaterialKey = 'hard-surface';

export interface StoredPlan {
	/** Null until the first change is saved. */
	id: number | null;
	settings: PlanSettings;
	finishes: Record<SurfaceId, MaterialKey>;
	openings: PlanOpening[];
	items: PlanItem[];
	stock: StockSheetRow[];
}

/** Built-in and organization materials together, keyed as the plan refers to them. */
export type MaterialCatalogue = ReadonlyMap<MaterialKey, Material>;
