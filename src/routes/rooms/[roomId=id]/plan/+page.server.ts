import { authorize, type Scope } from '$lib/server/auth/access';
import { loadPlanningChoices, loadPlanPage } from '$lib/server/plans/load';
import * as plans from '$lib/server/plans/service';
import { inFormUnit, planUnit } from '$lib/server/plans/units';
import { idIn, planChange, planRemoval } from '$lib/server/plans/actions';
import { proposalsForBand } from '$lib/plans/proposals';
import { coefficientsOf, customMaterialSchema, finishFormSchema, itemFormSchema, openingFormSchema, planSettingsSchema } from '$lib/schemas/treatment';
import { MATERIALS } from '$lib/treatment/materials';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params, url }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:internal', { roomId });
	const [{ project, view }, { sessions, problemBands }] = await Promise.all([loadPlanPage(scope, roomId), loadPlanningChoices(roomId)]);
	const bandId = Number(url.searchParams.get('band'));
	const band = Number.isInteger(bandId) && bandId > 0 ? problemBands.find((b) => b.id === bandId) : undefined;
	return {
		project,
		view,
		sessions: sessions.map((s) => ({ id: s.id, label: `${s.conditionLabel} — ${s.measuredOn}` })),
		problemBands,
		proposals: band ? { band, ...proposalsForBand(band) } : null,
		materials: [
			...MATERIALS.map((m) => ({ key: m.id, name: m.name, group: m.confidence === 'published' ? 'Published tables' : 'Typical handbook values (verify)', coefficients: m.coefficients, source: m.source })),
			...view.customMaterials.map((m) => ({ key: m.id, name: m.name, group: 'Practice materials (datasheets)', coefficients: m.coefficients, source: m.source }))
		],
		unit: planUnit(url.searchParams, scope),
		can: { edit: roleAllows(scope.role, 'review:write') }
	};
}) satisfies PageServerLoad;

async function editor(locals: App.Locals, params: { roomId: string }): Promise<{ scope: Scope; roomId: number }> {
	const roomId = Number(params.roomId);
	return { scope: await authorize(locals, 'review:write', { roomId }), roomId };
}

export const actions = {
	saveSettings: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const schema = inFormUnit(scope, (unit) => planSettingsSchema(unit).omit({ kerfMm: true }));
		return planChange(request, schema, 'settings', (input) => plans.savePlanSettings(scope, roomId, input));
	},

	setFinish: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		return planChange(request, finishFormSchema, 'finish', (input) => plans.setFinish(scope, roomId, input.surface, input.materialKey));
	},

	addOpening: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		return planChange(request, inFormUnit(scope, openingFormSchema), 'opening', (input) => plans.addOpening(scope, roomId, input));
	},

	removeOpening: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		return planRemoval(request, 'opening-removed', 'openingId', 'Say which opening to remove.', (id) => plans.removeOpening(scope, roomId, id));
	},

	addMaterial: async ({ locals, params, request }) => {
		const { scope } = await editor(locals, params);
		return planChange(request, customMaterialSchema, 'material', (m) => plans.addCustomMaterial(scope, { name: m.name, source: m.source, coefficients: coefficientsOf(m) }));
	},

	removeMaterial: async ({ locals, params, request }) => {
		const { scope } = await editor(locals, params);
		return planRemoval(request, 'material-removed', 'materialId', 'Say which material to remove.', (id) => plans.removeCustomMaterial(scope, id));
	},

	addItem: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		return planChange(request, inFormUnit(scope, itemFormSchema), 'item', (input) => plans.addItem(scope, roomId, input));
	},

	updateItem: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		return planChange(request, inFormUnit(scope, itemFormSchema), 'item', (input, form) => plans.changeItem(scope, roomId, idIn(form, 'itemId', 'Say which item to change.'), input));
	},

	removeItem: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		return planRemoval(request, 'item-removed', 'itemId', 'Say which item to remove.', (id) => plans.removeItem(scope, roomId, id));
	}
} satisfies Actions;
