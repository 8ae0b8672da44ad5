// What one planned item does acoustically: its absorption per planning band (referred to its
// face area), the range it acts on, and a one-line account of how that was worked out.
import { formatHz, formatHzRange } from '../format';
import { DEFAULT_AIR, type AirProperties } from '../treatment/air';
import { octaveEdgesHz, PLANNING_BANDS_HZ } from '../treatment/bands';
import { designDiffuser, type DiffuserDesign } from '../treatment/diffuser';
import {
	membraneActionRangeHz,
	membraneBandAbsorption,
	membraneModelWarnings,
	membraneResonanceHz,
	PANEL_STOCK,
	panelSurfaceMass
} from '../treatment/membrane';
import { DIFFUSER_ABSORPTION_ESTIMATE, POROUS_TARGET_ALPHA } from '../treatment/planner';
import { porousBandAbsorption, POROUS_PRESETS, randomIncidenceAbsorption, type PorousLayer } from '../treatment/porous';
import type { DiffuserParams, ItemParams, MembraneParams, PlanItem, PorousParams } from './types';

export interface ItemAcoustics {
	/** Random-incidence absorption per planning band, referred to the face area. */
	coefficients: number[];
	/** Normal-incidence absorption per band, where the model gives one (porous layers). */
	normalIncidence: number[] | null;
	/** Face area of all units together, m². */
	totalAreaM2: number;
	actionRangeHz: { loHz: number; hiHz: number } | null;
	/** How the numbers were obtained, in one line with the key figure. */
	method: string;
	warnings: string[];
	/** The full design of a diffuser item. */
	diffuser: DiffuserDesign | null;
}

export function porousLayerOf(p: PorousParams): Required<PorousLayer> {
	return { flowResistivity: p.flowResistivity, thicknessM: p.thicknessMm / 1000, airGapM: p.airGapMm / 1000, model: p.model ?? 'miki' };
}

const MODEL_NAMES = {
	miki: "Miki's model (JASJ(E) 11:19, 1990)",
	'delany-bazley': "Delany & Bazley's model (Appl. Acoust. 3:105, 1970)"
} as const;

/**
 * The first unbroken range where α ≥ POROUS_TARGET_ALPHA, scanned in 1/12-octave steps from
 * 20 Hz to the top planning band's upper edge (an air gap can open a dip higher up).
 */
function porousRange(layer: PorousLayer, air: AirProperties): { loHz: number; hiHz: number } | null {
	const top = octaveEdgesHz(PLANNING_BANDS_HZ[PLANNING_BANDS_HZ.length - 1]).hiHz;
	const step = 2 ** (1 / 12);
	let lo: number | null = null;
	let hi = top;
	for (let f = 20; f <= top; f *= step) {
		const absorbs = randomIncidenceAbsorption(layer, f, air) >= POROUS_TARGET_ALPHA;
		if (lo === null && absorbs) lo = f;
		else if (lo !== null && !absorbs) {
			hi = f / step;
			break;
		}
	}
	return lo === null ? null : { loHz: lo, hiHz: hi };
}

function porousAcoustics(p: PorousParams, air: AirProperties): Omit<ItemAcoustics, 'totalAreaM2'> {
	const layer = porousLayerOf(p);
	const { coefficients, warnings } = porousBandAbsorption(layer, { air });
	const normal = porousBandAbsorption(layer, { air, incidence: 'normal' }).coefficients;
	const preset = POROUS_PRESETS.find((x) => x.id === p.presetId);
	const material = preset ? preset.name : `fibre σ = ${(p.flowResistivity / 1000).toFixed(1)} kPa·s/m²`;
	const range = porousRange(layer, air);
	return {
		coefficients,
		actionRangeHz: range,
		normalIncidence: normal,
		method: `${material}, ${p.thicknessMm} mm${p.airGapMm > 0 ? ` + ${p.airGapMm} mm air gap` : ' on the wall'}: ${MODEL_NAMES[layer.model]}, layer and gap by transfer matrix (rigid backing), random incidence by Paris' formula from the normal-incidence surface impedance${range ? `; α ≥ ${POROUS_TARGET_ALPHA} from ${formatHz(range.loHz)}` : ''}.`,
		warnings,
		diffuser: null
	};
}

export function panelStockOf(p: MembraneParams) {
	const stock = PANEL_STOCK.find((s) => s.id === p.panelStockId);
	if (!stock) throw new Error(`unknown panel stock "${p.panelStockId}"; known: ${PANEL_STOCK.map((s) => s.id).join(', ')}`);
	return stock;
}

function membraneAcoustics(p: MembraneParams, air: AirProperties): Omit<ItemAcoustics, 'totalAreaM2'> {
	const stock = panelStockOf(p);
	const mass = panelSurfaceMass(p.panelThicknessMm / 1000, stock.densityKgM3);
	const trap = { surfaceMassKgM2: mass, cavityDepthM: p.cavityDepthMm / 1000, cavityFill: p.cavityFill };
	const f0 = membraneResonanceHz(trap, air);
	const formula = p.cavityFill === 'porous' ? '(1/2π)·√(ρ0c0²/(γ·m′·d))' : '(1/2π)·√(ρ0c0²/(m′·d))';
	return {
		coefficients: membraneBandAbsorption(trap, air),
		actionRangeHz: membraneActionRangeHz(f0),
		normalIncidence: null,
		method: `${p.panelThicknessMm} mm ${stock.name.toLowerCase()} (m′ = ${mass.toFixed(1)} kg/m²) over ${p.cavityDepthMm} mm ${p.cavityFill === 'porous' ? 'fibre-filled' : 'empty'} cavity: f0 = ${formula} ≈ ${formatHz(f0)}, the panel's mass on the cavity's air spring (Everest & Pohlmann, Master Handbook of Acoustics); planning absorption curve peaking at 0.4 (common practice, no source).`,
		warnings: membraneModelWarnings(trap, air),
		diffuser: null
	};
}

export function diffuserDesignOf(p: DiffuserParams, air: AirProperties = DEFAULT_AIR): DiffuserDesign {
	return designDiffuser({
		kind: p.sequence,
		prime: p.prime,
		designFrequencyHz: p.designFrequencyHz,
		wellWidthM: p.wellWidthMm / 1000,
		finThicknessM: p.finThicknessMm / 1000,
		maxDepthM: p.maxDepthMm === null ? undefined : p.maxDepthMm / 1000,
		speedOfSound: air.speedOfSound
	});
}

function diffuserAcoustics(p: DiffuserParams, air: AirProperties): Omit<ItemAcoustics, 'totalAreaM2'> {
	const design = diffuserDesignOf(p, air);
	const name = p.sequence === 'quadratic-residue' ? 'Quadratic-residue' : 'Primitive-root';
	return {
		coefficients: PLANNING_BANDS_HZ.map(() => DIFFUSER_ABSORPTION_ESTIMATE),
		normalIncidence: null,
		actionRangeHz: design.workingRangeHz,
		method: `${name} sequence N = ${p.prime}, f0 = ${formatHz(design.designFrequencyHz)}, ${p.wellWidthMm} mm wells: scatters ${formatHzRange(design.workingRangeHz.loHz, design.workingRangeHz.hiHz)}; absorbs about ${DIFFUSER_ABSORPTION_ESTIMATE} (planning value).`,
		warnings: design.warnings,
		diffuser: design
	};
}

export function paramsAcoustics(params: ItemParams, air: AirProperties = DEFAULT_AIR): Omit<ItemAcoustics, 'totalAreaM2'> {
	switch (params.kind) {
		case 'porous':
			return porousAcoustics(params, air);
		case 'membrane':
			return membraneAcoustics(params, air);
		case 'diffuser':
			return diffuserAcoustics(params, air);
	}
}

/** Face width of one unit, mm: a diffuser's is fixed by its wells and fins. */
export function unitWidthMm(item: Pick<PlanItem, 'widthMm' | 'params'>, air: AirProperties = DEFAULT_AIR): number {
	return item.params.kind === 'diffuser' ? diffuserDesignOf(item.params, air).panelWidthM * 1000 : item.widthMm;
}

export function itemAcoustics(item: PlanItem, air: AirProperties = DEFAULT_AIR): ItemAcoustics {
	const acoustics = paramsAcoustics(item.params, air);
	const totalAreaM2 = (item.quantity * unitWidthMm(item, air) * item.heightMm) / 1e6;
	return { ...acoustics, totalAreaM2 };
}
