// From the plan's items to what the workshop needs: a build sheet per design, the parts of all
// units together laid out on the stock sheets, the weight of each unit and the cost.
import { diffuserBuildSheet, membraneTrapBuildSheet, porousFrameBuildSheet, WELL_SHIM_PART, type BuildSheet, type ConstructionBoard } from '../treatment/buildsheet';
import type { DiffuserConstruction } from '../treatment/diffuser-build';
import { diffuserAssembly, type AssemblyStep } from '../treatment/assembly';
import { mountingPlan, type MountingPlan } from '../treatment/mounting';
import { fitOpening, type OpeningFit } from '../treatment/opening-fit';
import { mergeIdenticalParts } from '../treatment/parts';
import { sameThickness, type CutList, type StockSheet } from '../treatment/cutlist';
import { cutPlan, type CutPlan, type SawLimit } from '../treatment/cut-plan';
import { PANEL_STOCK } from '../treatment/membrane';
import type { Part } from '../treatment/parts';
import { diffuserDesignOf, panelStockOf } from './items';
import type { PlanItem, StockSheetRow } from './types';

/** Density of the timber sheet goods for weights: plywood, about 600 kg/m³ (from memory, typical). */
export const SHEET_DENSITY_KG_M3 = PANEL_STOCK.find((s) => s.id === 'plywood')!.densityKgM3;

/**
 * Above this a unit is heavy enough that a fall can injure and plasterboard alone will not hold
 * it: fix it to the structure (common practice, no source).
 */
export const HEAVY_UNIT_KG = 15;

export interface ItemBuild {
	itemId: number;
	label: string;
	quantity: number;
	/** Parts of one unit. */
	sheet: BuildSheet;
	/** Weight of the sheet-goods parts of one unit, kg (fibre, fabric and fixings not counted). */
	unitWeightKg: number;
	heavy: boolean;
	/** Nominal thicknesses the stock measures otherwise, and the parts whose fit changes by more than the kerf. */
	thickness: { nominalMm: number; measuredMm: number }[];
	fitChanges: FitChange[];
	/** How the unit is fixed so it can come down again; null when not fixed by this plan. */
	mounting: MountingPlan | null;
	/** Fitting each unit into an out-of-square opening, when the item gives one. */
	fit: OpeningFit | null;
	/** The item's own words on screws and plugs (free text). */
	mountingNotes: string;
	/** A diffuser's assembly, step by step (treatment/assembly.ts). */
	assembly: AssemblyStep[] | null;
	/** A diffuser's board in both constructions: the chosen one and the other, per unit. */
	constructions: { chosen: ConstructionFigures; other: ConstructionFigures; savingM2: number; savingPct: number } | null;
}

export interface ConstructionFigures {
	construction: DiffuserConstruction;
	boardAreaM2: number;
	weightKg: number;
	pieces: number;
}

/** Board thickness a part is cut at: the item's figure as typed (nominal), or what the caliper reads. */
export type ThicknessOf = (nominalMm: number) => number;

const asTyped: ThicknessOf = (mm) => mm;

/**
 * The measured thickness of the stock sold at a nominal one: a sheet whose nominal thickness is
 * that figure (within 0.1 mm) gives its measured thickness; otherwise the figure itself.
 */
export function measuredThicknessOf(stock: readonly StockSheetRow[]): ThicknessOf {
	return (nominalMm) => stock.find((s) => s.nominalThicknessMm !== null && s.nominalThicknessMm !== undefined && sameThickness(s.nominalThicknessMm, nominalMm))?.thicknessMm ?? nominalMm;
}

export function itemBuildSheet(item: PlanItem, thickness: ThicknessOf = asTyped): BuildSheet {
	const p = item.params;
	switch (p.kind) {
		case 'diffuser':
			return diffuserBuildSheet(diffuserDesignOf(p), {
				heightMm: item.heightMm,
				boardThicknessMm: thickness(p.boardThicknessMm),
				finThicknessMm: thickness(p.finThicknessMm),
				construction: p.construction ?? 'full-depth'
			});
		case 'porous':
			return porousFrameBuildSheet({
				widthMm: item.widthMm,
				heightMm: item.heightMm,
				absorberThicknessMm: p.thicknessMm,
				airGapMm: p.airGapMm,
				frameThicknessMm: thickness(p.frameThicknessMm),
				withBack: p.withBack,
				fabricWrapped: p.fabricWrapped
			});
		case 'membrane':
			return membraneTrapBuildSheet({
				widthMm: item.widthMm,
				heightMm: item.heightMm,
				cavityDepthMm: p.cavityDepthMm,
				panelThicknessMm: thickness(p.panelThicknessMm),
				frameThicknessMm: thickness(p.frameThicknessMm)
			});
	}
}

/** A part whose size at the measured thickness differs from the nominal drawing by more than the kerf. */
export interface FitChange {
	part: string;
	nominal: { lengthMm: number; widthMm: number };
	measured: { lengthMm: number; widthMm: number };
	/** The larger of the two changes, mm (signed: negative when the part is smaller). */
	changeMm: number;
}

/** Nominal thicknesses of an item and what the stock measures at each. */
function thicknessesOf(item: PlanItem): number[] {
	const p = item.params;
	if (p.kind === 'diffuser') return [p.finThicknessMm, p.boardThicknessMm];
	if (p.kind === 'porous') return [p.frameThicknessMm];
	return [p.panelThicknessMm, p.frameThicknessMm];
}

function fitChanges(nominal: BuildSheet, measured: BuildSheet, kerfMm: number): FitChange[] {
	const out: FitChange[] = [];
	// Parts are matched by name and, among parts of one name (two sides of different depths), by order.
	const seen = new Map<string, number>();
	for (const m of measured.parts) {
		const k = seen.get(m.name) ?? 0;
		seen.set(m.name, k + 1);
		const n = nominal.parts.filter((q) => q.name === m.name)[k];
		if (!n) continue;
		const dl = m.lengthMm - n.lengthMm;
		const dw = m.widthMm - n.widthMm;
		const change = Math.abs(dl) >= Math.abs(dw) ? dl : dw;
		if (Math.abs(change) > kerfMm + 1e-9) out.push({ part: m.name, nominal: { lengthMm: n.lengthMm, widthMm: n.widthMm }, measured: { lengthMm: m.lengthMm, widthMm: m.widthMm }, changeMm: change });
	}
	return out;
}

/** Weight of parts from their volume; a membrane panel uses its own stock's density. */
function partsWeightKg(item: PlanItem, parts: readonly Part[]): number {
	const panelDensity = item.params.kind === 'membrane' ? panelStockOf(item.params).densityKgM3 : SHEET_DENSITY_KG_M3;
	return parts.reduce((sum, part) => {
		const density = part.name === 'panel (membrane)' ? panelDensity : SHEET_DENSITY_KG_M3;
		return sum + (part.quantity * (part.areaMm2 ?? part.lengthMm * part.widthMm) * part.thicknessMm * density) / 1e9;
	}, 0);
}

/** What the build needs of the workshop: the stock (measured thicknesses) and the saw kerf. */
export interface Workshop {
	stock?: readonly StockSheetRow[];
	kerfMm?: number;
}

/** Board the mounting pieces are cut from: the item's board or frame, at the measured thickness. */
function mountingBoardMm(item: PlanItem, thickness: ThicknessOf): number {
	const p = item.params;
	return thickness(p.kind === 'diffuser' ? p.boardThicknessMm : p.frameThicknessMm);
}

/** The unit's parts with its mounting pieces, and the mounting plan. */
function withMounting(item: PlanItem, sheet: BuildSheet, thickness: ThicknessOf): { sheet: BuildSheet; mounting: MountingPlan | null } {
	const method = item.params.mounting?.method ?? 'none';
	if (method === 'none') return { sheet, mounting: null };
	const g = sheet.diffuser?.geometry;
	const deepest = g && g.construction === 'low-waste' ? g.wells.filter((w) => g.overallDepthMm - g.boardMm - w.depthMm <= 1e-6).map((w) => w.xMm) : undefined;
	const mounting = mountingPlan(method, { widthMm: sheet.overallMm.widthMm, heightMm: sheet.overallMm.heightMm, boardMm: mountingBoardMm(item, thickness), anchorXsMm: deepest });
	return { sheet: { ...sheet, parts: mergeIdenticalParts([...sheet.parts, ...mounting.parts]) }, mounting };
}

export function itemBuild(item: PlanItem, workshop: Workshop = {}): ItemBuild {
	const measured = measuredThicknessOf(workshop.stock ?? []);
	const { sheet, mounting } = withMounting(item, itemBuildSheet(item, measured), measured);
	const differing = [...new Set(thicknessesOf(item))].map((nominalMm) => ({ nominalMm, measuredMm: measured(nominalMm) })).filter((t) => t.measuredMm !== t.nominalMm);
	const changes = differing.length ? fitChanges(withMounting(item, itemBuildSheet(item), asTyped).sheet, sheet, workshop.kerfMm ?? 3) : [];
	const unitWeightKg = partsWeightKg(item, sheet.parts);
	const d = sheet.diffuser;
	const figures = (b: ConstructionBoard): ConstructionFigures => ({ construction: b.construction, boardAreaM2: b.boardAreaM2, weightKg: b.volumeM3 * SHEET_DENSITY_KG_M3, pieces: b.pieces });
	const constructions = d ? { chosen: figures(d.chosen), other: figures(d.other), savingM2: d.lowWasteSavingM2, savingPct: d.lowWasteSavingPct } : null;
	return { itemId: item.id, label: item.label, quantity: item.quantity, sheet, unitWeightKg, heavy: unitWeightKg > HEAVY_UNIT_KG, mounting, mountingNotes: item.params.mounting?.notes ?? '', fit: item.params.fit ? fitOpening(item.params.fit, { widthMm: sheet.overallMm.widthMm, heightMm: sheet.overallMm.heightMm }) : null, thickness: differing, fitChanges: changes, assembly: d ? diffuserAssembly(sheet) : null, constructions };
}

/** Build sheets of every item; an item whose sizes cannot be built is reported instead. */
export function planBuilds(items: readonly PlanItem[], workshop: Workshop = {}): { builds: ItemBuild[]; errors: { itemId: number; label: string; message: string }[] } {
	const builds: ItemBuild[] = [];
	const errors: { itemId: number; label: string; message: string }[] = [];
	for (const item of items) {
		try {
			builds.push(itemBuild(item, workshop));
		} catch (e) {
			errors.push({ itemId: item.id, label: item.label, message: (e as Error).message });
		}
	}
	return { builds, errors };
}

/** All parts of all units, each named after its item so the pieces can be told apart on the bench. */
export function planParts(builds: readonly ItemBuild[]): Part[] {
	return builds.flatMap((b) => b.sheet.parts.map((part) => ({ ...part, name: `${b.label}: ${part.name}`, quantity: part.quantity * b.quantity })));
}

/** Thin shims are cut from odd stock or planed down; they stay off the sheet layout. */
const offSheet = (part: Part) => part.name.endsWith(WELL_SHIM_PART);

/** Parts cut separately from the sheet layout (see offSheet). */
export function separateParts(builds: readonly ItemBuild[]): Part[] {
	return planParts(builds).filter(offSheet);
}

export function stockSheetsOf(rows: readonly StockSheetRow[]): StockSheet[] {
	// The cut list matches parts by the measured thickness (the parts are cut at it).
	return rows.map((r) => ({ id: r.label, lengthMm: r.lengthMm, widthMm: r.widthMm, thicknessMm: r.thicknessMm, finishedFaces: r.finishedFaces, grain: r.grain }));
}

export type PlanCutList = { ok: true; cutList: CutList; plan: CutPlan } | { ok: false; error: string };

/**
 * The cut list of every part on the plan's stock, with each sheet's finishing, breakdown and
 * numbered cuts (treatment/cut-plan.ts), or why the parts cannot be cut from it.
 */
export function planCutList(builds: readonly ItemBuild[], stock: readonly StockSheetRow[], kerfMm: number, sawLimit: SawLimit | null = null): PlanCutList {
	const parts = planParts(builds).filter((p) => !offSheet(p));
	if (parts.length === 0) return { ok: false, error: 'The plan has no item to build yet.' };
	if (stock.length === 0) return { ok: false, error: 'Add the sheets you buy (size, thickness, faces) to lay the parts out.' };
	try {
		const plan = cutPlan(parts, stockSheetsOf(stock), { kerfMm, sawLimit });
		return { ok: true, cutList: plan.cutList, plan };
	} catch (e) {
		return { ok: false, error: (e as Error).message };
	}
}

/** The saw limit of a plan's settings, or null for whole sheets. */
export function sawLimitOf(settings: { sawMaxLengthMm?: number | null; sawMaxWidthMm?: number | null }): SawLimit | null {
	return settings.sawMaxLengthMm && settings.sawMaxWidthMm ? { lengthMm: settings.sawMaxLengthMm, widthMm: settings.sawMaxWidthMm } : null;
}

/** Sheet thicknesses the parts need that the stock list lacks, with the face grade each needs. */
export function missingStock(builds: readonly ItemBuild[], stock: readonly StockSheetRow[]): { thicknessMm: number; finishedFaces: number }[] {
	const need = new Map<number, number>();
	for (const part of planParts(builds).filter((p) => !offSheet(p))) need.set(part.thicknessMm, Math.max(need.get(part.thicknessMm) ?? 0, part.finishedFaces));
	return [...need]
		.filter(([t, faces]) => !stock.some((s) => sameThickness(s.thicknessMm, t) && s.finishedFaces >= faces))
		.map(([thicknessMm, finishedFaces]) => ({ thicknessMm, finishedFaces }))
		.sort((a, b) => a.thicknessMm - b.thicknessMm);
}

export interface PlanCost {
	/** Bought materials of the items (quantity × unit price), where priced. */
	itemsTotal: number;
	/** Sheets the cut list uses × their price, where priced. */
	sheetsTotal: number;
	total: number;
	/** Items or sheets without a price, left out of the totals. */
	unpriced: string[];
	/** Whether any price was entered at all. */
	priced: boolean;
}

export function planCost(items: readonly PlanItem[], stock: readonly StockSheetRow[], cut: PlanCutList): PlanCost {
	const unpriced: string[] = [];
	let itemsTotal = 0;
	for (const item of items) {
		if (item.unitPrice === null) unpriced.push(item.label);
		else itemsTotal += item.quantity * item.unitPrice;
	}
	let sheetsTotal = 0;
	if (cut.ok) {
		for (const used of cut.cutList.perStock) {
			const row = stock.find((s) => s.label === used.stockId);
			if (!row || row.price === null) unpriced.push(`sheet ${used.stockId}`);
			else sheetsTotal += used.sheets * row.price;
		}
	}
	const priced = items.some((i) => i.unitPrice !== null) || stock.some((s) => s.price !== null);
	return { itemsTotal, sheetsTotal, total: itemsTotal + sheetsTotal, unpriced, priced };
}
