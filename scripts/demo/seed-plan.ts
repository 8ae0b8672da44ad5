// Writes the demo's problem bands and treatment plan (scripts/demo/plan.ts) for the Lindqvist room.
import type { Knex } from 'knex';
import { insertItem, insertOpening, insertStock, setSurfaceFinish, updatePlanSettings } from '../../src/lib/server/queries/plans';
import { SURFACE_IDS } from '../../src/lib/treatment/surfaces';
import { unitWidthMm } from '../../src/lib/plans/items';
import { createProblemBand } from '../../src/lib/server/queries/reviews';
import { demoStoredPlan, DEMO_ITEMS, DEMO_OPENINGS, DEMO_PROBLEM_BANDS, DEMO_STOCK, DEMO_FINISHES } from './plan';
import { IMPERIAL_ITEMS, IMPERIAL_PROBLEM_BANDS, IMPERIAL_SETTINGS, IMPERIAL_STOCK } from './plan-imperial';

export async function seedDemoPlan(
	trx: Knex.Transaction,
	ids: { roomId: number; consultantId: number; baselineSessionId: number; afterSessionId: number }
): Promise<void> {
	const bandIds = new Map<string, number>();
	for (const { key, ...band } of DEMO_PROBLEM_BANDS) {
		bandIds.set(key, await createProblemBand(trx, ids.roomId, { ...band, comparisonId: null, authorId: ids.consultantId }));
	}
	for (const surface of SURFACE_IDS) await setSurfaceFinish(trx, ids.roomId, surface, { builtin: DEMO_FINISHES[surface] });
	for (const { materialKey, ...o } of DEMO_OPENINGS) await insertOpening(trx, ids.roomId, o, { builtin: materialKey });

	const [planId] = await trx('treatment_plans').insert({ room_id: ids.roomId, updated_by: ids.consultantId });
	await updatePlanSettings(trx, planId, { ...demoStoredPlan().settings, baselineSessionId: ids.baselineSessionId, afterSessionId: ids.afterSessionId }, ids.consultantId);
	for (const { band, ...item } of DEMO_ITEMS) {
		// A diffuser is as wide as its wells and fins make it (the service stores it the same way).
		await insertItem(trx, planId, { ...item, widthMm: Math.round(unitWidthMm(item) * 100) / 100, problemBandId: band ? bandIds.get(band)! : null });
	}
	for (const s of DEMO_STOCK) await insertStock(trx, planId, s);
}

/** The second client's room: problem bands and an imperial plan (scripts/demo/plan-imperial.ts). */
export async function seedDemoImperialPlan(trx: Knex.Transaction, ids: { roomId: number; consultantId: number; baselineSessionId: number }): Promise<void> {
	const bandIds = new Map<string, number>();
	for (const { key, ...band } of IMPERIAL_PROBLEM_BANDS) {
		bandIds.set(key, await createProblemBand(trx, ids.roomId, { ...band, comparisonId: null, authorId: ids.consultantId }));
	}
	for (const surface of SURFACE_IDS) await setSurfaceFinish(trx, ids.roomId, surface, { builtin: surface === 'floor' ? 'concrete-floor' : surface === 'ceiling' ? 'plasterboard' : 'concrete-smooth' });
	const [planId] = await trx('treatment_plans').insert({ room_id: ids.roomId, updated_by: ids.consultantId });
	await updatePlanSettings(trx, planId, { ...IMPERIAL_SETTINGS, baselineSessionId: ids.baselineSessionId }, ids.consultantId);
	for (const { band, ...item } of IMPERIAL_ITEMS) {
		await insertItem(trx, planId, { ...item, widthMm: Math.round(unitWidthMm(item) * 100) / 100, problemBandId: band ? bandIds.get(band)! : null });
	}
	for (const s of IMPERIAL_STOCK) await insertStock(trx, planId, s);
}
