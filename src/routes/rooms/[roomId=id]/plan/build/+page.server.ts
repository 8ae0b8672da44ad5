import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { formFail, parseForm } from '$lib/server/forms';
import { getProject } from '$lib/server/queries/projects';
import { loadPlanView } from '$lib/server/plans/load';
import { addStock, removeStock, savePlanSettings } from '$lib/server/plans/service';
import { planChange } from '$lib/server/plans/actions';
import { planUnit } from '$lib/server/plans/units';
import { missingStock, separateParts } from '$lib/plans/build';
import { idFieldSchema, planSettingsSchema, stockFormSchema } from '$lib/schemas/treatment';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params, url }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:internal', { roomId });
	const k = db();
	const view = await loadPlanView(k, roomId, scope.organizationId);
	const project = (await getProject(k, view.room.projectId))!;
	return {
		project: { id: project.id, name: project.name },
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
		const form = await request.formData();
		const parsed = parseForm(stockFormSchema(planUnit(form, scope)), form);
		if (!parsed.ok) return parsed.failure;
		return planChange(form, () => addStock(scope, roomId, parsed.data), 'stock');
	},

	removeStock: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		const form = await request.formData();
		const parsed = idFieldSchema('stockId').safeParse(Object.fromEntries(form));
		if (!parsed.success) return formFail(400, form, 'Say which sheet to remove.');
		return planChange(form, () => removeStock(scope, roomId, parsed.data.stockId as number), 'stock-removed');
	},

	saveKerf: async ({ locals, params, request }) => {
		const roomId = Number(params.roomId);
		const scope = await authorize(locals, 'review:write', { roomId });
		const form = await request.formData();
		const parsed = parseForm(planSettingsSchema(planUnit(form, scope)).pick({ kerfMm: true }), form);
		if (!parsed.ok) return parsed.failure;
		return planChange(form, () => savePlanSettings(scope, roomId, parsed.data), 'kerf');
	}
} satisfies Actions;
