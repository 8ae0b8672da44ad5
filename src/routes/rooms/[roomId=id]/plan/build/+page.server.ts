import { authorize } from '$lib/server/auth/access';
import { loadPlanPage } from '$lib/server/plans/load';
import * as plans from '$lib/server/plans/service';
import { planChange, planRemoval } from '$lib/server/plans/actions';
import { inFormUnit, planUnit } from '$lib/server/plans/units';
import { missingStock, separateParts } from '$lib/plans/build';
import { planSettingsSchema, sawLimitFormSchema, stockFormSchema } from '$lib/schemas/treatment';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params, url }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:internal', { roomId });
	const { project, view } = await loadPlanPage(scope, roomId);
	return {
		project,
		room: view.room,
		plan: view.plan,
		builds: view.builds,
		buildErrors: view.buildErrors,
		designs: view.evaluation.items.map((i) => ({ id: i.id, diffuser: i.diffuser })),
		separate: separateParts(view.builds),
		missing: missingStock(view.builds, view.plan.stock),
		cut: view.cut,
		cost: view.cost,
		unit: planUnit(url.searchParams, scope),
		can: { edit: roleAllows(scope.role, 'review:write') }
	};
}) satisfies PageServerLoad;

export const actions = {
	addStock: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		return planChange(request, inFormUnit(scope, stockFormSchema), 'stock', (input) => plans.addStock(scope, roomId, input));
	},

	removeStock: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		return planRemoval(request, 'stock-removed', 'stockId', 'Say which sheet to remove.', (id) => plans.removeStock(scope, roomId, id));
	},

	saveKerf: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		const schema = inFormUnit(scope, (unit) => planSettingsSchema(unit).pick({ kerfMm: true }));
		return planChange(request, schema, 'kerf', (input) => plans.savePlanSettings(scope, roomId, input));
	},

	saveSawLimit: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		return planChange(request, inFormUnit(scope, sawLimitFormSchema), 'saw', (input) => plans.savePlanSettings(scope, roomId, input));
	}
} satisfies Actions;
