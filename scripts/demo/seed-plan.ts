// Writes the demo's problem bands and treatment plan (scripts/demo/plan.ts) for the Lindqvist room.
import type { Knex } from 'knex';
import { insertItem, insertOpening, insertStock, setSurfaceFinish, updatePlanSettings } from '../../src/lib/server/queries/plans';
import { SURFACE_IDS } from '../../src/lib/treatment/surfaces';
import { unitWidthMm } from '../../src/lib/plans/items';
import { createProblemBand } from '../../src/lib/server/queries/reviews';
import { demoStoredPlan, DEMO_ITEMS, DEMO_OPENINGS, DEMO_PROBLEM_BANDS, DEMO_STOCK, DEMO_FINISHES } from './plan';

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
