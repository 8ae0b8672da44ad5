// Rows of a room's treatment plan, its finishes and openings, and the organization's materials.
import type { Knex } from 'knex';
import { readJson } from '../json-column';
import { customMaterialKey, itemParamsSchema } from '../../schemas/treatment';
import { TABLE_BANDS_HZ, type TableBandValues } from '../../treatment/bands';
import { MATERIALS, type Material } from '../../treatment/materials';
import { SURFACE_IDS, type SurfaceId } from '../../treatment/surfaces';
import {
	DEFAULT_FINISH,
	DEFAULT_PLAN_SETTINGS,
	type MaterialCatalogue,
	type MaterialKey,
	type PlanItem,
	type PlanOpening,
	type PlanSettings,
	type StockSheetRow,
	type StoredPlan
} from '../../plans/types';

export interface CustomMaterialRow extends Material {
	dbId: number;
	/** Rooms whose surfaces or openings use it (it cannot be deleted while used). */
	usedBy: number;
}

function materialKeyOf(r: { material_id: string | null; custom_material_id: number | null }): MaterialKey {
	return r.custom_material_id !== null ? customMaterialKey(r.custom_material_id) : (r.material_id ?? DEFAULT_FINISH);
}

/** Columns a finish is stored in, from a key already checked by the caller. */
export function finishColumns(key: { builtin: string } | { customId: number }) {
	return 'builtin' in key ? { material_id: key.builtin, custom_material_id: null } : { material_id: null, custom_material_id: key.customId };
}

export async function listCustomMaterials(k: Knex, organizationId: number): Promise<CustomMaterialRow[]> {
	const rows = await k('custom_materials as m')
		.where('m.organization_id', organizationId)
		.orderBy('m.name')
		.select('m.*')
		.select(
			k.raw(
				'((SELECT COUNT(*) FROM room_surfaces s WHERE s.custom_material_id = m.id) + (SELECT COUNT(*) FROM room_openings o WHERE o.custom_material_id = m.id)) AS used_by'
			)
		);
	return rows.map((r) => ({
		dbId: r.id,
		id: customMaterialKey(r.id),
		name: r.name,
		coefficients: TABLE_BANDS_HZ.map((f) => Number(r[`a${f}`])) as unknown as TableBandValues,
		source: r.source,
		confidence: 'user entry' as const,
		usedBy: Number(r.used_by)
	}));
}

export async function getCustomMaterial(k: Knex, id: number): Promise<{ id: number; organizationId: number } | undefined> {
	const r = await k('custom_materials').where({ id }).first('id', 'organization_id');
	return r ? { id: r.id, organizationId: r.organization_id } : undefined;
}

/** Built-in materials first, then the organization's own. */
export function materialCatalogue(custom: readonly Material[]): MaterialCatalogue {
	return new Map([...MATERIALS, ...custom].map((m) => [m.id, m]));
}

export async function createCustomMaterial(
	k: Knex,
	organizationId: number,
	m: { name: string; source: string; coefficients: readonly number[] },
	userId: number
): Promise<number> {
	const [id] = await k('custom_materials').insert({
		organization_id: organizationId,
		name: m.name,
		source: m.source,
		created_by: userId,
		...Object.fromEntries(TABLE_BANDS_HZ.map((f, i) => [`a${f}`, m.coefficients[i]]))
	});
	return id;
}

const settingsOf = (r: Record<string, unknown>): PlanSettings => ({
	baselineSessionId: (r.baseline_session_id as number | null) ?? null,
	afterSessionId: (r.after_session_id as number | null) ?? null,
	temperatureC: Number(r.temperature_c),
	relativeHumidityPct: Number(r.humidity_pct),
	kerfMm: Number(r.kerf_mm),
	currency: String(r.currency),
	notes: (r.notes as string | null) ?? '',
	includeInReport: Boolean(r.include_in_report),
	sawMaxLengthMm: r.saw_max_length_mm === null || r.saw_max_length_mm === undefined ? null : Number(r.saw_max_length_mm),
	sawMaxWidthMm: r.saw_max_width_mm === null || r.saw_max_width_mm === undefined ? null : Number(r.saw_max_width_mm)
});

function itemOf(r: Record<string, unknown>): PlanItem {
	return {
		id: r.id as number,
		label: r.label as string,
		surface: (r.surface as SurfaceId | null) ?? null,
		quantity: Number(r.quantity),
		widthMm: Number(r.width_mm),
		heightMm: Number(r.height_mm),
		// Parsed, not trusted: a row written by an older version fails here with a clear message.
		params: itemParamsSchema.parse(readJson(r.params)),
		unitPrice: r.unit_price === null ? null : Number(r.unit_price),
		problemBandId: (r.problem_band_id as number | null) ?? null,
		why: (r.why as string | null) ?? null
	};
}

function stockOf(r: Record<string, unknown>): StockSheetRow {
	return {
		id: r.id as number,
		label: r.label as string,
		lengthMm: Number(r.length_mm),
		widthMm: Number(r.width_mm),
		thicknessMm: Number(r.thickness_mm),
		finishedFaces: Number(r.finished_faces) as 0 | 1 | 2,
		grain: r.grain as StockSheetRow['grain'],
		price: r.price === null ? null : Number(r.price),
		nominalThicknessMm: r.nominal_thickness_mm === null || r.nominal_thickness_mm === undefined ? null : Number(r.nominal_thickness_mm)
	};
}

/** The room's plan as stored; a room nobody has planned yet gets the defaults (nothing is written). */
export async function loadStoredPlan(k: Knex, roomId: number): Promise<StoredPlan> {
	const [planRow, surfaceRows, openingRows] = await Promise.all([
		k('treatment_plans').where({ room_id: roomId }).first(),
		k('room_surfaces').where({ room_id: roomId }).select('surface', 'material_id', 'custom_material_id'),
		k('room_openings').where({ room_id: roomId }).orderBy('id').select()
	]);
	const finishes = Object.fromEntries(SURFACE_IDS.map((s) => [s, DEFAULT_FINISH])) as Record<SurfaceId, MaterialKey>;
	for (const r of surfaceRows) finishes[r.surface as SurfaceId] = materialKeyOf(r);
	const openings: PlanOpening[] = openingRows.map((r) => ({
		id: r.id,
		label: r.label,
		surface: r.surface,
		widthM: Number(r.width_m),
		heightM: Number(r.height_m),
		materialKey: materialKeyOf(r)
	}));
	if (!planRow) {
		const first = await k('sessions').where({ room_id: roomId }).orderBy('measured_on').orderBy('id').first('id');
		return { id: null, settings: { ...DEFAULT_PLAN_SETTINGS, baselineSessionId: first?.id ?? null }, finishes, openings, items: [], stock: [] };
	}
	const [itemRows, stockRows] = await Promise.all([
		k('treatment_items').where({ plan_id: planRow.id }).orderBy('id').select(),
		k('stock_sheets').where({ plan_id: planRow.id }).orderBy('thickness_mm').orderBy('label').select()
	]);
	return { id: planRow.id, settings: settingsOf(planRow), finishes, openings, items: itemRows.map(itemOf), stock: stockRows.map(stockOf) };
}

/** The room's plan id, creating the plan row on the first change. */
export async function ensurePlan(trx: Knex.Transaction, roomId: number, userId: number): Promise<number> {
	// INSERT IGNORE against the unique room_id: two first edits at once make one plan. A new plan
	// starts from the room's first visit as its measured baseline, as the page showed it.
	await trx.raw(
		'INSERT IGNORE INTO treatment_plans (room_id, updated_by, baseline_session_id) SELECT ?, ?, (SELECT id FROM sessions WHERE room_id = ? ORDER BY measured_on, id LIMIT 1)',
		[roomId, userId, roomId]
	);
	const row = await trx('treatment_plans').where({ room_id: roomId }).forUpdate().first('id');
	return row.id;
}

export async function updatePlanSettings(k: Knex, planId: number, s: PlanSettings, userId: number): Promise<void> {
	await k('treatment_plans').where({ id: planId }).update({
		baseline_session_id: s.baselineSessionId,
		after_session_id: s.afterSessionId,
		temperature_c: s.temperatureC,
		humidity_pct: s.relativeHumidityPct,
		kerf_mm: s.kerfMm,
		currency: s.currency,
		notes: s.notes || null,
		include_in_report: s.includeInReport,
		saw_max_length_mm: s.sawMaxLengthMm,
		saw_max_width_mm: s.sawMaxWidthMm,
		updated_by: userId
	});
}

export async function setSurfaceFinish(k: Knex, roomId: number, surface: SurfaceId, key: { builtin: string } | { customId: number }): Promise<void> {
	const columns = finishColumns(key);
	await k('room_surfaces').insert({ room_id: roomId, surface, ...columns }).onConflict(['room_id', 'surface']).merge(columns);
}

export async function insertOpening(k: Knex, roomId: number, o: Omit<PlanOpening, 'id' | 'materialKey'>, key: { builtin: string } | { customId: number }): Promise<number> {
	const [id] = await k('room_openings').insert({ room_id: roomId, label: o.label, surface: o.surface, width_m: o.widthM, height_m: o.heightM, ...finishColumns(key) });
	return id;
}

type ItemValues = Omit<PlanItem, 'id'>;

const itemColumns = (item: ItemValues) => ({
	kind: item.params.kind,
	label: item.label,
	surface: item.surface,
	quantity: item.quantity,
	width_mm: item.widthMm,
	height_mm: item.heightMm,
	params: JSON.stringify(item.params),
	unit_price: item.unitPrice,
	problem_band_id: item.problemBandId,
	why: item.why
});

export async function insertItem(k: Knex, planId: number, item: ItemValues): Promise<number> {
	const [id] = await k('treatment_items').insert({ plan_id: planId, ...itemColumns(item) });
	return id;
}

export async function updateItem(k: Knex, itemId: number, item: ItemValues): Promise<void> {
	await k('treatment_items').where({ id: itemId }).update(itemColumns(item));
}

export async function insertStock(k: Knex, planId: number, s: Omit<StockSheetRow, 'id'>): Promise<number> {
	const [id] = await k('stock_sheets').insert({
		plan_id: planId,
		label: s.label,
		length_mm: s.lengthMm,
		width_mm: s.widthMm,
		thickness_mm: s.thicknessMm,
		finished_faces: s.finishedFaces,
		grain: s.grain,
		price: s.price,
		nominal_thickness_mm: s.nominalThicknessMm
	});
	return id;
}

/**
 * The same as hasSharedPlan, as a column of another query of the room (`roomIdColumn` names its
 * id there), so a page reading the room learns it without a query of its own.
 */
export function sharedPlanColumn(k: Knex, roomIdColumn: string, alias: string): Knex.Raw {
	return k.raw(
		`EXISTS (SELECT 1 FROM treatment_plans sp WHERE sp.room_id = ${roomIdColumn} AND sp.include_in_report = TRUE AND EXISTS (SELECT 1 FROM treatment_items si WHERE si.plan_id = sp.id)) AS ??`,
		[alias]
	);
}

/** Whether the room's plan is to be shown in its report and has something in it. */
export async function hasSharedPlan(k: Knex, roomId: number): Promise<boolean> {
	const shared = await k('treatment_plans as p')
		.where({ 'p.room_id': roomId, 'p.include_in_report': true })
		.whereExists((q) => q.select(k.raw('1')).from('treatment_items as i').whereRaw('i.plan_id = p.id'))
		.first('p.id');
	return Boolean(shared);
}

/** Remove an opening of the room; how many rows went (0 when it is not of this room). */
export async function deleteOpening(k: Knex, roomId: number, openingId: number): Promise<number> {
	return k('room_openings').where({ id: openingId, room_id: roomId }).del();
}

/** The plan an item belongs to, if that plan is the room's. */
export async function planOfItem(k: Knex, roomId: number, itemId: number): Promise<number | undefined> {
	const row = await k('treatment_items as i').join('treatment_plans as p', 'p.id', 'i.plan_id').where({ 'i.id': itemId, 'p.room_id': roomId }).first('p.id as planId');
	return row?.planId;
}

export async function deleteItem(k: Knex, itemId: number): Promise<void> {
	await k('treatment_items').where({ id: itemId }).del();
}

/** Remove a sheet from the plan's stock; how many rows went (0 when it is not on this plan). */
export async function deleteStock(k: Knex, planId: number, stockId: number): Promise<number> {
	return k('stock_sheets').where({ id: stockId, plan_id: planId }).del();
}

export async function deleteCustomMaterial(k: Knex, id: number): Promise<void> {
	await k('custom_materials').where({ id }).del();
}
