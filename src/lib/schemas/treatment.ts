// zod schemas of the treatment plan: the forms (lengths typed in the user's units, "196 mm",
// "7 3/4 in", a bare number in the preferred unit) and the item parameters stored as JSON.
import { z } from 'zod';
import { TABLE_BANDS_HZ } from '../treatment/bands';
import { isPrime } from '../treatment/diffuser';
import { DIFFUSER_CONSTRUCTIONS, type DiffuserConstruction } from '../treatment/diffuser-build';
import { MOUNTING_METHODS, type MountingMethod } from '../treatment/mounting';
import { MATERIALS } from '../treatment/materials';
import { PANEL_STOCK } from '../treatment/membrane';
import { POROUS_PRESETS } from '../treatment/porous';
import { SURFACE_IDS, type SurfaceId } from '../treatment/surfaces';
import { formatLength, MM_PER_INCH, parseLength, type LengthUnit } from '../treatment/units';
import { ITEM_KINDS } from '../plans/types';

/** Empirical models of a porous layer the plan offers (src/lib/treatment/porous.ts). */
export const POROUS_MODELS = ['miki', 'delany-bazley'] as const;

/** Lengths a bare number means: millimetres or inches for built things, metres or inches for openings. */
export type BareUnit = 'mm' | 'm' | 'in';

export const unitOfSystem = (system: 'metric' | 'imperial'): LengthUnit => (system === 'imperial' ? 'in' : 'mm');

/**
 * Limits that catch typing errors (a 1200 m panel, a 0.5 mm frame), not rules of the trade
 * (common practice, no source). Millimetres.
 */
export const LIMITS = {
	unitSideMm: { min: 100, max: 3000 },
	porousThicknessMm: { min: 10, max: 500 },
	airGapMm: { min: 0, max: 1000 },
	flowResistivityKPa: { min: 1, max: 200 },
	frameThicknessMm: { min: 6, max: 50 },
	panelThicknessMm: { min: 2, max: 25 },
	cavityDepthMm: { min: 20, max: 500 },
	prime: { min: 5, max: 53 },
	designFrequencyHz: { min: 100, max: 5000 },
	wellWidthMm: { min: 20, max: 300 },
	finThicknessMm: { min: 3, max: 25 },
	maxDepthMm: { min: 20, max: 600 },
	boardThicknessMm: { min: 6, max: 40 },
	quantity: { min: 1, max: 200 },
	openingSideM: { min: 0.1, max: 40 },
	sheetSideMm: { min: 100, max: 5000 },
	sheetThicknessMm: { min: 2, max: 50 },
	kerfMm: { min: 0, max: 10 },
	openingFitMm: { min: 100, max: 5000 },
	fitClearanceMm: { min: 0, max: 50 },
	price: { max: 1_000_000 }
} as const;

const BARE_NUMBER = /^\s*(\d+(?:[.,]\d*)?|[.,]\d+)\s*$/;

/** A length field: text in any unit, parsed to millimetres and checked against its limits. */
export function lengthField(label: string, bare: BareUnit, limits: { min: number; max: number }, display: LengthUnit = bare === 'in' ? 'in' : 'mm') {
	// Inch values are shown to 1/16″ (messages) or 1/32″ (forms): a limit written that way may lie
	// up to half a sixteenth beyond the exact one, and is taken as the limit.
	const slack = display === 'in' ? MM_PER_INCH / 32 : 0;
	return z
		.string({ error: `Enter the ${label}.` })
		.trim()
		.min(1, { error: `Enter the ${label}.` })
		.transform((text, ctx) => {
			const withUnit = BARE_NUMBER.test(text) ? `${text} ${bare}` : text;
			try {
				return parseLength(withUnit, bare === 'in' ? 'in' : 'mm');
			} catch (e) {
				ctx.addIssue({ code: 'custom', message: `${label[0].toUpperCase()}${label.slice(1)}: ${(e as Error).message}` });
				return z.NEVER;
			}
		})
		.refine((mm) => mm >= limits.min - slack && mm <= limits.max + slack, {
			error: `The ${label} must lie between ${formatLength(limits.min, display)} and ${formatLength(limits.max, display)}.`
		})
		.transform((mm) => Math.min(Math.max(mm, limits.min), limits.max));
}

/** A length field that may stay empty (null). */
function optionalLength(label: string, bare: BareUnit, limits: { min: number; max: number }) {
	return z
		.string()
		.optional()
		.transform((v) => (v && v.trim() ? v : null))
		.pipe(z.union([z.null(), lengthField(label, bare, limits)]));
}

/** A blank field is missing, not 0 (coercion alone would read "" as 0). */
const blankAsMissing = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

const number = (label: string, limits: { min: number; max: number }, unit = '') =>
	z.preprocess(
		blankAsMissing,
		z.coerce
			.number({ error: `Enter the ${label}.` })
			.refine(Number.isFinite, { error: `Enter the ${label} as a number.` })
			.refine((v) => v >= limits.min && v <= limits.max, { error: `The ${label} must lie between ${limits.min} and ${limits.max}${unit}.` })
	);

const optionalPrice = z
	.union([z.literal(''), z.coerce.number()])
	.optional()
	.transform((v) => (v === '' || v === undefined ? null : v))
	.refine((v) => v === null || (Number.isFinite(v) && v >= 0 && v <= LIMITS.price.max), { error: 'A price of 0 or more, or leave it empty.' });

const optionalId = z
	.union([z.literal(''), z.coerce.number().int().positive()])
	.optional()
	.transform((v) => (v === '' || v === undefined ? null : v));

const checkbox = z
	.union([z.literal('on'), z.literal('true'), z.literal('')])
	.optional()
	.transform((v) => v === 'on' || v === 'true');

const surfaceOrNone = z
	.union([z.literal(''), z.enum(SURFACE_IDS as [SurfaceId, ...SurfaceId[]])], { error: 'Pick a surface, or free-standing.' })
	.optional()
	.transform((v) => (v === '' || v === undefined ? null : v));

const label = z.string({ error: 'Give it a name.' }).trim().min(1, { error: 'Give it a name.' }).max(120, { error: 'Keep the name under 120 characters.' });

// Stored item parameters (millimetres, Pa·s/m²): checked when written and when read back.

/** How a unit is fixed so it can come down again; screws and adhesive stay free text. */
export const mountingSchema = z.object({
	method: z.enum(MOUNTING_METHODS as [MountingMethod, ...MountingMethod[]]).default('none'),
	notes: z.string().max(500).default('')
});

/**
 * An out-of-square recess the unit is fitted into: widths at top and bottom, heights at left and
 * right, optionally the diagonal from bottom left to top right (else the bottom is taken level
 * and the left side plumb), and the clearance to leave all round. Millimetres.
 */
export const openingFitSchema = z.object({
	widthTopMm: z.number().min(LIMITS.openingFitMm.min).max(LIMITS.openingFitMm.max),
	widthBottomMm: z.number().min(LIMITS.openingFitMm.min).max(LIMITS.openingFitMm.max),
	heightLeftMm: z.number().min(LIMITS.openingFitMm.min).max(LIMITS.openingFitMm.max),
	heightRightMm: z.number().min(LIMITS.openingFitMm.min).max(LIMITS.openingFitMm.max),
	diagonalMm: z.number().min(LIMITS.openingFitMm.min).max(2 * LIMITS.openingFitMm.max).nullable().default(null),
	clearanceMm: z.number().min(LIMITS.fitClearanceMm.min).max(LIMITS.fitClearanceMm.max).default(3)
});

// Added later than the kind's own fields: rows written before read as not fixed and not fitted.
const mountingField = mountingSchema.default({ method: 'none', notes: '' });
const fitField = openingFitSchema.nullable().default(null);
export const porousParamsSchema = z.object({
	kind: z.literal('porous'),
	thicknessMm: z.number().min(LIMITS.porousThicknessMm.min).max(LIMITS.porousThicknessMm.max),
	airGapMm: z.number().min(LIMITS.airGapMm.min).max(LIMITS.airGapMm.max),
	flowResistivity: z.number().min(LIMITS.flowResistivityKPa.min * 1000).max(LIMITS.flowResistivityKPa.max * 1000),
	presetId: z.string().nullable(),
	model: z.enum(POROUS_MODELS).default('miki'),
	frameThicknessMm: z.number().min(LIMITS.frameThicknessMm.min).max(LIMITS.frameThicknessMm.max),
	fabricWrapped: z.boolean(),
	withBack: z.boolean(),
	mounting: mountingField,
	fit: fitField
});
export const membraneParamsSchema = z.object({
	kind: z.literal('membrane'),
	panelThicknessMm: z.number().min(LIMITS.panelThicknessMm.min).max(LIMITS.panelThicknessMm.max),
	panelStockId: z.enum(PANEL_STOCK.map((s) => s.id) as [string, ...string[]]),
	cavityDepthMm: z.number().min(LIMITS.cavityDepthMm.min).max(LIMITS.cavityDepthMm.max),
	cavityFill: z.enum(['empty', 'porous']),
	frameThicknessMm: z.number().min(LIMITS.frameThicknessMm.min).max(LIMITS.frameThicknessMm.max),
	mounting: mountingField,
	fit: fitField
});
export const diffuserParamsSchema = z.object({
	kind: z.literal('diffuser'),
	sequence: z.enum(['quadratic-residue', 'primitive-root']),
	prime: z.number().int().refine(isPrime, { error: 'The number of wells must be a prime.' }),
	designFrequencyHz: z.number().min(LIMITS.designFrequencyHz.min).max(LIMITS.designFrequencyHz.max),
	wellWidthMm: z.number().min(LIMITS.wellWidthMm.min).max(LIMITS.wellWidthMm.max),
	finThicknessMm: z.number().min(LIMITS.finThicknessMm.min).max(LIMITS.finThicknessMm.max),
	maxDepthMm: z.number().min(LIMITS.maxDepthMm.min).max(LIMITS.maxDepthMm.max).nullable(),
	boardThicknessMm: z.number().min(LIMITS.boardThicknessMm.min).max(LIMITS.boardThicknessMm.max),
	// Added later: rows written before it are the full-depth box they were built as.
	construction: z.enum(DIFFUSER_CONSTRUCTIONS as [DiffuserConstruction, ...DiffuserConstruction[]]).default('full-depth'),
	mounting: mountingField,
	fit: fitField
});
export const itemParamsSchema = z.discriminatedUnion('kind', [porousParamsSchema, membraneParamsSchema, diffuserParamsSchema]);

/**
 * The item form, for one kind (the form carries `kind`). Lengths are typed in the user's
 * units; the result is the stored shape. Fields of other kinds are ignored.
 */
export function itemFormSchema(unit: LengthUnit) {
	const bare: BareUnit = unit;
	const common = {
		label,
		surface: surfaceOrNone,
		quantity: number('quantity', LIMITS.quantity).refine(Number.isInteger, { error: 'The quantity is a whole number.' }),
		heightMm: lengthField('height', bare, LIMITS.unitSideMm),
		unitPrice: optionalPrice,
		problemBandId: optionalId,
		why: z
			.string()
			.trim()
			.max(2000, { error: 'Keep the reason under 2000 characters.' })
			.optional()
			.transform((v) => (v ? v : null)),
		mountingMethod: z.enum(MOUNTING_METHODS as [MountingMethod, ...MountingMethod[]], { error: 'Pick how the unit is fixed.' }).optional().default('none'),
		mountingNotes: z.string().trim().max(500, { error: 'Keep the fixing notes under 500 characters.' }).optional().default(''),
		fitWidthTopMm: optionalLength('width of the opening at the top', bare, LIMITS.openingFitMm),
		fitWidthBottomMm: optionalLength('width of the opening at the bottom', bare, LIMITS.openingFitMm),
		fitHeightLeftMm: optionalLength('height of the opening at the left', bare, LIMITS.openingFitMm),
		fitHeightRightMm: optionalLength('height of the opening at the right', bare, LIMITS.openingFitMm),
		fitDiagonalMm: optionalLength('diagonal of the opening', bare, { min: LIMITS.openingFitMm.min, max: 2 * LIMITS.openingFitMm.max }),
		fitClearanceMm: optionalLength('clearance', bare, LIMITS.fitClearanceMm)
	};
	const porous = z.object({
		...common,
		kind: z.literal('porous'),
		widthMm: lengthField('width', bare, LIMITS.unitSideMm),
		thicknessMm: lengthField('fibre thickness', bare, LIMITS.porousThicknessMm),
		airGapMm: z
			.string()
			.optional()
			.transform((v) => (v && v.trim() ? v : '0'))
			.pipe(lengthField('air gap', bare, LIMITS.airGapMm)),
		preset: z
			.string()
			.optional()
			.transform((v) => (v ? v : null))
			.refine((v) => v === null || POROUS_PRESETS.some((p) => p.id === v), { error: 'Pick a fibre from the list, or give its flow resistivity.' }),
		flowResistivityKPa: z
			.union([z.literal(''), z.coerce.number()])
			.optional()
			.transform((v) => (v === '' || v === undefined ? null : v))
			.refine((v) => v === null || (Number.isFinite(v) && v >= LIMITS.flowResistivityKPa.min && v <= LIMITS.flowResistivityKPa.max), {
				error: `Flow resistivity between ${LIMITS.flowResistivityKPa.min} and ${LIMITS.flowResistivityKPa.max} kPa·s/m².`
			}),
		model: z.enum(POROUS_MODELS, { error: "Pick Miki's or Delany and Bazley's model." }).optional().default('miki'),
		frameThicknessMm: lengthField('frame thickness', bare, LIMITS.frameThicknessMm),
		fabricWrapped: checkbox,
		withBack: checkbox
	}).refine((v) => v.preset !== null || v.flowResistivityKPa !== null, { path: ['flowResistivityKPa'], error: 'Pick a fibre from the list, or give its flow resistivity.' });
	const membrane = z.object({
		...common,
		kind: z.literal('membrane'),
		widthMm: lengthField('width', bare, LIMITS.unitSideMm),
		panelThicknessMm: lengthField('panel thickness', bare, LIMITS.panelThicknessMm),
		panelStockId: z.enum(PANEL_STOCK.map((s) => s.id) as [string, ...string[]], { error: 'Pick the panel stock.' }),
		cavityDepthMm: lengthField('cavity depth', bare, LIMITS.cavityDepthMm),
		cavityFill: z.enum(['empty', 'porous'], { error: 'Say whether the cavity holds fibre.' }),
		frameThicknessMm: lengthField('frame thickness', bare, LIMITS.frameThicknessMm)
	});
	const diffuser = z.object({
		...common,
		kind: z.literal('diffuser'),
		sequence: z.enum(['quadratic-residue', 'primitive-root'], { error: 'Pick the sequence.' }),
		prime: number('number of wells', LIMITS.prime).refine(isPrime, { error: 'The number of wells must be a prime (5, 7, 11, 13, …).' }),
		designFrequencyHz: number('design frequency', LIMITS.designFrequencyHz, ' Hz'),
		wellWidthMm: lengthField('well width', bare, LIMITS.wellWidthMm),
		finThicknessMm: lengthField('fin thickness', bare, LIMITS.finThicknessMm),
		maxDepthMm: z
			.string()
			.optional()
			.transform((v) => (v && v.trim() ? v : null))
			.pipe(z.union([z.null(), lengthField('maximum depth', bare, LIMITS.maxDepthMm)])),
		boardThicknessMm: lengthField('board thickness', bare, LIMITS.boardThicknessMm),
		construction: z.enum(DIFFUSER_CONSTRUCTIONS as [DiffuserConstruction, ...DiffuserConstruction[]], { error: 'Pick how the diffuser is built.' }).optional().default('full-depth')
	});
	return z.discriminatedUnion('kind', [porous, membrane, diffuser], { error: 'Pick what kind of treatment this is.' }).transform((v, ctx) => {
		const { label: name, surface, quantity, heightMm, unitPrice, problemBandId, why } = v;
		const base = { label: name, surface, quantity, heightMm, unitPrice, problemBandId, why };
		const mounting = { method: v.mountingMethod, notes: v.mountingNotes };
		const sides = [v.fitWidthTopMm, v.fitWidthBottomMm, v.fitHeightLeftMm, v.fitHeightRightMm];
		if (sides.some((x) => x !== null) && sides.some((x) => x === null)) {
			ctx.addIssue({ code: 'custom', path: ['fitWidthTopMm'], message: 'Give all four sides of the opening (widths at top and bottom, heights at left and right), or none.' });
			return z.NEVER;
		}
		const fit =
			v.fitWidthTopMm !== null && v.fitWidthBottomMm !== null && v.fitHeightLeftMm !== null && v.fitHeightRightMm !== null
				? { widthTopMm: v.fitWidthTopMm, widthBottomMm: v.fitWidthBottomMm, heightLeftMm: v.fitHeightLeftMm, heightRightMm: v.fitHeightRightMm, diagonalMm: v.fitDiagonalMm, clearanceMm: v.fitClearanceMm ?? 3 }
				: null;
		const fitting = { mounting, fit };
		if (v.kind === 'porous') {
			const preset = POROUS_PRESETS.find((p) => p.id === v.preset);
			return {
				...base,
				widthMm: v.widthMm,
				params: {
					kind: 'porous' as const,
					thicknessMm: v.thicknessMm,
					airGapMm: v.airGapMm,
					// A typed σ wins over the preset it may have started from.
					flowResistivity: v.flowResistivityKPa !== null ? v.flowResistivityKPa * 1000 : preset!.flowResistivity,
					presetId: v.flowResistivityKPa !== null && preset && preset.flowResistivity !== v.flowResistivityKPa * 1000 ? null : (preset?.id ?? null),
					model: v.model,
					frameThicknessMm: v.frameThicknessMm,
					fabricWrapped: v.fabricWrapped,
					withBack: v.withBack,
					...fitting
				}
			};
		}
		if (v.kind === 'membrane') {
			return {
				...base,
				widthMm: v.widthMm,
				params: {
					kind: 'membrane' as const,
					panelThicknessMm: v.panelThicknessMm,
					panelStockId: v.panelStockId,
					cavityDepthMm: v.cavityDepthMm,
					cavityFill: v.cavityFill,
					frameThicknessMm: v.frameThicknessMm,
					...fitting
				}
			};
		}
		return {
			...base,
			// The stored width of a diffuser is replaced by its design's panel width.
			widthMm: 0,
			params: {
				kind: 'diffuser' as const,
				sequence: v.sequence,
				prime: v.prime,
				designFrequencyHz: v.designFrequencyHz,
				wellWidthMm: v.wellWidthMm,
				finThicknessMm: v.finThicknessMm,
				maxDepthMm: v.maxDepthMm,
				boardThicknessMm: v.boardThicknessMm,
				construction: v.construction,
				...fitting
			}
		};
	});
}
export type ItemFormData = z.output<ReturnType<typeof itemFormSchema>>;

export const itemKindSchema = z.enum(ITEM_KINDS);

export function openingFormSchema(unit: LengthUnit) {
	const bare: BareUnit = unit === 'in' ? 'in' : 'm';
	const mmLimits = { min: LIMITS.openingSideM.min * 1000, max: LIMITS.openingSideM.max * 1000 };
	return z.object({
		label: z.string({ error: 'Name the opening (door, window…).' }).trim().min(1, { error: 'Name the opening (door, window…).' }).max(80),
		surface: z.enum(SURFACE_IDS as [SurfaceId, ...SurfaceId[]], { error: 'Pick the surface it is in.' }),
		widthM: lengthField('width', bare, mmLimits, unit).transform((mm) => mm / 1000),
		heightM: lengthField('height', bare, mmLimits, unit).transform((mm) => mm / 1000),
		materialKey: z.string({ error: 'Pick its finish.' }).min(1, { error: 'Pick its finish.' }).max(80)
	});
}

export const finishFormSchema = z.object({
	surface: z.enum(SURFACE_IDS as [SurfaceId, ...SurfaceId[]], { error: 'Pick a surface.' }),
	materialKey: z.string({ error: 'Pick a finish.' }).min(1, { error: 'Pick a finish.' }).max(80)
});

const coefficient = (bandHz: number) =>
	z.preprocess(
		blankAsMissing,
		z.coerce
			.number({ error: `Enter the coefficient at ${bandHz} Hz.` })
			.refine(Number.isFinite, { error: `Enter the coefficient at ${bandHz} Hz.` })
			.refine((v) => v >= 0 && v <= 1, { error: `The coefficient at ${bandHz} Hz must lie between 0 and 1 (values above 1 are a measurement artefact).` })
	);

/** A material typed in by the user: six coefficients 125 Hz … 4 kHz and where they come from. */
export const customMaterialSchema = z.object({
	name: z.string({ error: 'Name the material.' }).trim().min(1, { error: 'Name the material.' }).max(120),
	source: z.string({ error: 'Say where the coefficients come from (datasheet, handbook, measurement).' }).trim().min(3, { error: 'Say where the coefficients come from (datasheet, handbook, measurement).' }).max(500),
	a125: coefficient(125),
	a250: coefficient(250),
	a500: coefficient(500),
	a1000: coefficient(1000),
	a2000: coefficient(2000),
	a4000: coefficient(4000)
});

/** The six coefficients of a parsed material form, in TABLE_BANDS_HZ order. */
export const coefficientsOf = (m: z.infer<typeof customMaterialSchema>): number[] => TABLE_BANDS_HZ.map((f) => m[`a${f}`]);

export function stockFormSchema(unit: LengthUnit) {
	const bare: BareUnit = unit;
	return z.object({
		label: z.string({ error: 'Name the sheet (e.g. "birch ply 18").' }).trim().min(1, { error: 'Name the sheet (e.g. "birch ply 18").' }).max(60),
		lengthMm: lengthField('sheet length', bare, LIMITS.sheetSideMm),
		widthMm: lengthField('sheet width', bare, LIMITS.sheetSideMm),
		thicknessMm: lengthField('sheet thickness', bare, LIMITS.sheetThicknessMm),
		finishedFaces: z.enum(['0', '1', '2'], { error: 'Say how many faces are good: 0, 1 or 2.' }).transform((v) => Number(v) as 0 | 1 | 2),
		grain: z.enum(['along-length', 'none'], { error: 'Say whether the sheet has a grain.' }),
		price: optionalPrice,
		// The size it is sold by, when the caliper reads otherwise ("1/2 in" ply that measures 12 mm).
		nominalThicknessMm: z
			.string()
			.optional()
			.transform((v) => (v && v.trim() ? v : null))
			.pipe(z.union([z.null(), lengthField('nominal thickness', bare, LIMITS.sheetThicknessMm)]))
	});
}

export function planSettingsSchema(unit: LengthUnit) {
	const bare: BareUnit = unit;
	return z.object({
		baselineSessionId: optionalId,
		afterSessionId: optionalId,
		temperatureC: number('temperature', { min: -20, max: 50 }, ' °C'),
		relativeHumidityPct: number('relative humidity', { min: 10, max: 100 }, ' %'),
		kerfMm: z
			.string()
			.optional()
			.transform((v) => (v && v.trim() ? v : '0'))
			.pipe(lengthField('saw kerf', bare, LIMITS.kerfMm)),
		currency: z
			.string()
			.trim()
			.toUpperCase()
			.regex(/^[A-Z]{3}$/, { error: 'A three-letter currency code, e.g. EUR or USD.' }),
		notes: z.string().trim().max(5000, { error: 'Keep the notes under 5000 characters.' }).optional().transform((v) => v ?? ''),
		includeInReport: checkbox
	});
}

/**
 * The largest piece the saw (and the person at it) can handle, length × width; both empty for
 * whole sheets. Sheets larger than that are halved or quartered first.
 */
export function sawLimitFormSchema(unit: LengthUnit) {
	const bare: BareUnit = unit;
	const optionalLength = (label: string) =>
		z
			.string()
			.optional()
			.transform((v) => (v && v.trim() ? v : null))
			.pipe(z.union([z.null(), lengthField(label, bare, LIMITS.sheetSideMm)]));
	return z
		.object({ sawMaxLengthMm: optionalLength('longest piece the saw takes'), sawMaxWidthMm: optionalLength('widest piece the saw takes') })
		.refine((v) => (v.sawMaxLengthMm === null) === (v.sawMaxWidthMm === null), { path: ['sawMaxWidthMm'], error: 'Give both the length and the width, or leave both empty for whole sheets.' });
}

export const idFieldSchema = (name: string) => z.object({ [name]: z.coerce.number().int().positive() });

/** Keys of the built-in materials (the organization's own are "custom-<id>"). */
export const BUILTIN_MATERIAL_KEYS: ReadonlySet<string> = new Set(MATERIALS.map((m) => m.id));
export const customMaterialKey = (id: number) => `custom-${id}`;
export function parseMaterialKey(key: string): { builtin: string } | { customId: number } | null {
	if (BUILTIN_MATERIAL_KEYS.has(key)) return { builtin: key };
	const m = /^custom-(\d{1,10})$/.exec(key);
	return m ? { customId: Number(m[1]) } : null;
}
