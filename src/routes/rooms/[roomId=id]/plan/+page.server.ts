import { authorize, type Scope } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { formFail, parseForm } from '$lib/server/forms';
import { getProject } from '$lib/server/queries/projects';
import { listSessions } from '$lib/server/queries/sessions';
import { listProblemBands } from '$lib/server/queries/reviews';
import { loadPlanView } from '$lib/server/plans/load';
import {
	addCustomMaterial,
	addItem,
	addOpening,
	changeItem,
	removeCustomMaterial,
	removeItem,
	removeOpening,
	savePlanSettings,
	setFinish
} from '$lib/server/plans/service';
import { planUnit } from '$lib/server/plans/units';
import { planChange } from '$lib/server/plans/actions';
import { proposalsForBand } from '$lib/plans/proposals';
import { coefficientsOf, customMaterialSchema, finishFormSchema, idFieldSchema, itemFormSchema, openingFormSchema, planSettingsSchema } from '$lib/schemas/treatment';
import { MATERIALS } from '$lib/treatment/materials';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params, url }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:internal', { roomId });
	const k = db();
	const [view, sessions, problemBands] = await Promise.all([loadPlanView(k, roomId, scope.organizationId), listSessions(k, roomId), listProblemBands(k, roomId)]);
	const project = (await getProject(k, view.room.projectId))!;
	const bandId = Number(url.searchParams.get('band'));
	const band = Number.isInteger(bandId) && bandId > 0 ? problemBands.find((b) => b.id === bandId) : undefined;
	return {
		project: { id: project.id, name: project.name },
		view,
		sessions: sessions.map((s) => ({ id: s.id, label: `${s.conditionLabel} — ${s.measuredOn}` })),
		problemBands,
		proposals: band ? { band, ...proposalsForBand(band) } : null,
		materials: [
			...MATERIALS.map((m) => ({ key: m.id, name: m.name, group: m.confidence === 'published' ? 'Published' : 'Handbook (from memory)', coefficients: m.coefficients, source: m.source })),
			...view.customMaterials.map((m) => ({ key: m.id, name: m.name, group: 'Practice materials', coefficients: m.coefficients, source: m.source }))
		],
		unit: planUnit(url.searchParams, scope),
		can: { edit: roleAllows(scope.role, 'review:write') }
	};
}) satisfies PageServerLoad;

async function editor(locals: App.Locals, params: { roomId: string }): Promise<{ scope: Scope; roomId: number }> {
	const roomId = Number(params.roomId);
	return { scope: await authorize(locals, 'review:write', { roomId }), roomId };
}

function idOf(form: FormData, name: string): number | null {
	const parsed = idFieldSchema(name).safeParse(Object.fromEntries(form));
	return parsed.success ? (parsed.data[name] as number) : null;
}

export const actions = {
	saveSettings: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const form = await request.formData();
		const parsed = parseForm(planSettingsSchema(planUnit(form, scope)).omit({ kerfMm: true }), form);
		if (!parsed.ok) return parsed.failure;
		return planChange(form, () => savePlanSettings(scope, roomId, parsed.data), 'settings');
	},

	setFinish: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const form = await request.formData();
		const parsed = parseForm(finishFormSchema, form);
		if (!parsed.ok) return parsed.failure;
		return planChange(form, () => setFinish(scope, roomId, parsed.data.surface, parsed.data.materialKey), 'finish');
	},

	addOpening: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const form = await request.formData();
		const parsed = parseForm(openingFormSchema(planUnit(form, scope)), form);
		if (!parsed.ok) return parsed.failure;
		return planChange(form, () => addOpening(scope, roomId, parsed.data), 'opening');
	},

	removeOpening: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const form = await request.formData();
		const id = idOf(form, 'openingId');
		if (id === null) return formFail(400, form, 'Say which opening to remove.');
		return planChange(form, () => removeOpening(scope, roomId, id), 'opening-removed');
	},

	addMaterial: async ({ locals, params, request }) => {
		const { scope } = await editor(locals, params);
		const form = await request.formData();
		const parsed = parseForm(customMaterialSchema, form);
		if (!parsed.ok) return parsed.failure;
		const m = parsed.data;
		return planChange(form, () => addCustomMaterial(scope, { name: m.name, source: m.source, coefficients: coefficientsOf(m) }), 'material');
	},

	removeMaterial: async ({ locals, params, request }) => {
		const { scope } = await editor(locals, params);
		const form = await request.formData();
		const id = idOf(form, 'materialId');
		if (id === null) return formFail(400, form, 'Say which material to remove.');
		return planChange(form, () => removeCustomMaterial(scope, id), 'material-removed');
	},

	addItem: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const form = await request.formData();
		const parsed = parseForm(itemFormSchema(planUnit(form, scope)), form);
		if (!parsed.ok) return parsed.failure;
		return planChange(form, () => addItem(scope, roomId, parsed.data), 'item');
	},

	updateItem: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const form = await request.formData();
		const id = idOf(form, 'itemId');
		if (id === null) return formFail(400, form, 'Say which item to change.');
		const parsed = parseForm(itemFormSchema(planUnit(form, scope)), form);
		if (!parsed.ok) return parsed.failure;
		return planChange(form, () => changeItem(scope, roomId, id, parsed.data), 'item');
	},

	removeItem: async ({ locals, params, request }) => {
		const { scope, roomId } = await editor(locals, params);
		const form = await request.formData();
		const id = idOf(form, 'itemId');
		if (id === null) return formFail(400, form, 'Say which item to remove.');
		return planChange(form, () => removeItem(scope, roomId, id), 'item-removed');
	}
} satisfies Actions;
