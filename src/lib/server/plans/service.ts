// Changes to a room's treatment plan. Each runs in one transaction with its audit record; the
// plan row is locked first, so two edits of one plan apply one after the other. A change that
// would leave the plan impossible (items larger than their wall, a frame too small to build,
// an opening that does not fit) is refused with the reason, and nothing is written.
import type { Knex } from 'knex';
import { audit } from '../audit';
import { mapDbErrors } from '../db-errors';
import { transaction } from '../transaction';
import { invalid, notFound } from '../problem';
import type { Scope } from '../auth/access';
import { areVisitsOfRoom, getRoom } from '../queries/rooms';
import { isProblemBandOfRoom } from '../queries/reviews';
import {
	createCustomMaterial,
	deleteCustomMaterial,
	deleteItem,
	deleteOpening,
	deleteStock,
	ensurePlan,
	getCustomMaterial,
	insertItem,
	insertOpening,
	insertStock,
	listCustomMaterials,
	loadStoredPlan,
	materialCatalogue,
	planOfItem,
	setSurfaceFinish,
	updateItem,
	updatePlanSettings
} from '../queries/plans';
import { parseMaterialKey } from '../../schemas/treatment';
import { evaluatePlan } from '../../plans/evaluate';
import { itemBuild } from '../../plans/build';
import { unitWidthMm } from '../../plans/items';
import type { PlanItem, PlanOpening, PlanSettings, StockSheetRow, StoredPlan } from '../../plans/types';
import type { SurfaceId } from '../../treatment/surfaces';
import { TABLE_BANDS_HZ } from '../../treatment/bands';

type ItemInput = Omit<PlanItem, 'id'>;

/** A finish the user picked: a built-in material, or one of this organization's own. */
async function resolveMaterialKey(k: Knex, organizationId: number, key: string, field = 'materialKey') {
	const parsed = parseMaterialKey(key);
	if (parsed && 'customId' in parsed) {
		const m = await getCustomMaterial(k, parsed.customId);
		if (m && m.organizationId === organizationId) return parsed;
	} else if (parsed) return parsed;
	throw invalid('Pick a material from the list.', field);
}

/** Refuses the change when the plan it leads to cannot be worked out; the reason goes to the user. */
async function assertWorkable(trx: Knex, scope: Scope, roomId: number, plan: StoredPlan, field?: string): Promise<void> {
	const room = (await getRoom(trx, roomId))!;
	const catalogue = materialCatalogue(await listCustomMaterials(trx, scope.organizationId));
	const evaluation = evaluatePlan({
		room: { lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM },
		plan,
		catalogue,
		measuredBeforeS: null,
		measuredAfterS: null,
		target: []
	});
	if (evaluation.problems.length > 0) throw invalid(capitalise(evaluation.problems[0]), field);
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

async function checkSessionsOfRoom(trx: Knex, roomId: number, ids: (number | null)[]): Promise<void> {
	const wanted = ids.filter((id): id is number => id !== null);
	if (!(await areVisitsOfRoom(trx, roomId, wanted))) throw invalid('Pick visits of this room.', 'baselineSessionId');
}

/** Saves the settings a form carries; the others keep their stored values. */
export async function savePlanSettings(scope: Scope, roomId: number, changes: Partial<PlanSettings>): Promise<void> {
	await transaction(async (trx) => {
		const planId = await ensurePlan(trx, roomId, scope.user.id);
		const settings = { ...(await loadStoredPlan(trx, roomId)).settings, ...changes };
		if (settings.baselineSessionId !== null && settings.baselineSessionId === settings.afterSessionId) {
			throw invalid('The visit after treatment must be another visit than the one before.', 'afterSessionId');
		}
		await checkSessionsOfRoom(trx, roomId, [settings.baselineSessionId, settings.afterSessionId]);
		await updatePlanSettings(trx, planId, settings, scope.user.id);
		await audit(trx, scope, 'plan.settings_saved', 'treatment_plan', planId, { changed: Object.keys(changes) });
	});
}

export async function setFinish(scope: Scope, roomId: number, surface: SurfaceId, materialKey: string): Promise<void> {
	await transaction(async (trx) => {
		const key = await resolveMaterialKey(trx, scope.organizationId, materialKey);
		const planId = await ensurePlan(trx, roomId, scope.user.id);
		await setSurfaceFinish(trx, roomId, surface, key);
		await audit(trx, scope, 'plan.finish_set', 'treatment_plan', planId, { surface, materialKey });
	});
}

export async function addOpening(scope: Scope, roomId: number, opening: Omit<PlanOpening, 'id'>): Promise<number> {
	return transaction(async (trx) => {
		const key = await resolveMaterialKey(trx, scope.organizationId, opening.materialKey);
		const planId = await ensurePlan(trx, roomId, scope.user.id);
		const plan = await loadStoredPlan(trx, roomId);
		await assertWorkable(trx, scope, roomId, { ...plan, openings: [...plan.openings, { ...opening, id: 0 }] }, 'widthM');
		const id = await insertOpening(trx, roomId, opening, key);
		await audit(trx, scope, 'plan.opening_added', 'treatment_plan', planId, { openingId: id, label: opening.label });
		return id;
	});
}

export async function removeOpening(scope: Scope, roomId: number, openingId: number): Promise<void> {
	await transaction(async (trx) => {
		const planId = await ensurePlan(trx, roomId, scope.user.id);
		if ((await deleteOpening(trx, roomId, openingId)) === 0) throw notFound('No such opening in this room.');
		await audit(trx, scope, 'plan.opening_removed', 'treatment_plan', planId, { openingId });
	});
}

/** The stored shape of an item: a diffuser's width is its design's panel width. */
function normalisedItem(item: ItemInput): ItemInput {
	return item.params.kind === 'diffuser' ? { ...item, widthMm: Math.round(unitWidthMm(item) * 100) / 100 } : item;
}

async function checkProblemBand(trx: Knex, roomId: number, bandId: number | null): Promise<void> {
	if (bandId !== null && !(await isProblemBandOfRoom(trx, bandId, roomId))) throw invalid('That problem band is of another room.', 'problemBandId');
}

/** The item must be buildable as sized (a frame wider than the panel is not). */
function checkBuildable(item: ItemInput): void {
	try {
		itemBuild({ ...item, id: 0 });
	} catch (e) {
		const message = (e as Error).message;
		// A fit into an opening or a mounting that cannot be worked out is refused beside its own fields.
		const field = /opening|clearance/.test(message) ? 'fitWidthTopMm' : /mounting|cleat/.test(message) ? 'mountingMethod' : 'widthMm';
		throw invalid(`This item cannot be built as sized: ${message}.`, field);
	}
}

export async function addItem(scope: Scope, roomId: number, input: ItemInput): Promise<number> {
	const item = normalisedItem(input);
	checkBuildable(item);
	return transaction(async (trx) => {
		await checkProblemBand(trx, roomId, item.problemBandId);
		const planId = await ensurePlan(trx, roomId, scope.user.id);
		const plan = await loadStoredPlan(trx, roomId);
		await assertWorkable(trx, scope, roomId, { ...plan, items: [...plan.items, { ...item, id: 0 }] }, 'quantity');
		const id = await insertItem(trx, planId, item);
		await audit(trx, scope, 'plan.item_added', 'treatment_item', id, { kind: item.params.kind, label: item.label, problemBandId: item.problemBandId });
		return id;
	});
}

async function checkItemOfRoom(trx: Knex, roomId: number, itemId: number): Promise<void> {
	if ((await planOfItem(trx, roomId, itemId)) === undefined) throw notFound('No such item in this plan.');
}

export async function changeItem(scope: Scope, roomId: number, itemId: number, input: ItemInput): Promise<void> {
	const item = normalisedItem(input);
	checkBuildable(item);
	await transaction(async (trx) => {
		await ensurePlan(trx, roomId, scope.user.id);
		await checkItemOfRoom(trx, roomId, itemId);
		await checkProblemBand(trx, roomId, item.problemBandId);
		const plan = await loadStoredPlan(trx, roomId);
		await assertWorkable(trx, scope, roomId, { ...plan, items: plan.items.map((i) => (i.id === itemId ? { ...item, id: itemId } : i)) }, 'quantity');
		await updateItem(trx, itemId, item);
		await audit(trx, scope, 'plan.item_changed', 'treatment_item', itemId, { label: item.label });
	});
}

export async function removeItem(scope: Scope, roomId: number, itemId: number): Promise<void> {
	await transaction(async (trx) => {
		await ensurePlan(trx, roomId, scope.user.id);
		await checkItemOfRoom(trx, roomId, itemId);
		await deleteItem(trx, itemId);
		await audit(trx, scope, 'plan.item_removed', 'treatment_item', itemId);
	});
}

export async function addStock(scope: Scope, roomId: number, stock: Omit<StockSheetRow, 'id'>): Promise<number> {
	return transaction(async (trx) => {
		const planId = await ensurePlan(trx, roomId, scope.user.id);
		const id = await mapDbErrors(insertStock(trx, planId, stock), { duplicate: `A sheet called "${stock.label}" is already on the list.`, field: 'label' });
		await audit(trx, scope, 'plan.stock_added', 'treatment_plan', planId, { label: stock.label });
		return id;
	});
}

export async function removeStock(scope: Scope, roomId: number, stockId: number): Promise<void> {
	await transaction(async (trx) => {
		const planId = await ensurePlan(trx, roomId, scope.user.id);
		if ((await deleteStock(trx, planId, stockId)) === 0) throw notFound('No such sheet on this plan.');
		await audit(trx, scope, 'plan.stock_removed', 'treatment_plan', planId, { stockId });
	});
}

export async function addCustomMaterial(scope: Scope, m: { name: string; source: string; coefficients: number[] }): Promise<number> {
	if (m.coefficients.length !== TABLE_BANDS_HZ.length) throw invalid(`Give ${TABLE_BANDS_HZ.length} coefficients.`);
	return transaction(async (trx) => {
		const id = await mapDbErrors(createCustomMaterial(trx, scope.organizationId, m, scope.user.id), { duplicate: `The practice already has a material called "${m.name}".`, field: 'name' });
		await audit(trx, scope, 'material.created', 'custom_material', id, { name: m.name });
		return id;
	});
}

export async function removeCustomMaterial(scope: Scope, materialId: number): Promise<void> {
	await transaction(async (trx) => {
		const m = await getCustomMaterial(trx, materialId);
		if (!m || m.organizationId !== scope.organizationId) throw notFound('No such material.');
		await mapDbErrors(deleteCustomMaterial(trx, materialId), { referenced: 'This material is the finish of a surface or opening; give those another finish first.' });
		await audit(trx, scope, 'material.deleted', 'custom_material', materialId);
	});
}
