// The shapes of a room's treatment plan as stored and as the pages use them. Lengths of built
// things are millimetres; room geometry is metres (as the room itself).
import type { z } from 'zod';
import type {
	diffuserParamsSchema,
	ItemFormData,
	membraneParamsSchema,
	openingFormSchema,
	planSettingsSchema,
	porousParamsSchema,
	sawLimitFormSchema,
	stockFormSchema
} from '../schemas/treatment';
import type { Material } from '../treatment/materials';
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

// The stored shapes are what their zod schemas (src/lib/schemas/treatment.ts) give, so the
// checks on write and read and the types cannot drift apart.

/** Fibre layer with an optional air gap, in a timber frame; flow resistivity σ in Pa·s/m². */
export type PorousParams = z.output<typeof porousParamsSchema>;

/** Limp panel over a sealed cavity; its stock's density gives the surface mass. */
export type MembraneParams = z.output<typeof membraneParamsSchema>;

/** One-dimensional Schroeder diffuser; the panel width follows from the design. */
export type DiffuserParams = z.output<typeof diffuserParamsSchema>;

export type ItemParams = PorousParams | MembraneParams | DiffuserParams;

/**
 * A planned item: what the item form gives (face size of one unit in mm — for a diffuser the
 * design's panel width —, price of one unit's bought materials, the problem band it answers and
 * why it is there) with its stored parameters.
 */
export type PlanItem = { id: number } & Omit<ItemFormData, 'params'> & { params: ItemParams };

/** A material as the plan refers to it: built-in by id, or the organization's own as "custom-<id>". */
export type MaterialKey = string;

/** A door or window in a surface, metres; its finish by material key. */
export type PlanOpening = { id: number } & z.output<ReturnType<typeof openingFormSchema>>;

/** A sheet size the cut list may use, mm; its price per sheet in the plan's currency. */
export type StockSheetRow = { id: number } & z.output<ReturnType<typeof stockFormSchema>>;

/**
 * Which visits the prediction rests on, the air, the saw kerf, currency and notes; and the
 * largest piece the saw takes (null: whole sheets), saved by its own form on the build page.
 */
export type PlanSettings = z.output<ReturnType<typeof planSettingsSchema>> & z.output<ReturnType<typeof sawLimitFormSchema>>;

export const DEFAULT_PLAN_SETTINGS: PlanSettings = {
	baselineSessionId: null,
	afterSessionId: null,
	temperatureC: 20,
	relativeHumidityPct: 50,
	kerfMm: 3,
	currency: 'EUR',
	notes: '',
	includeInReport: true,
	sawMaxLengthMm: null,
	sawMaxWidthMm: null
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
