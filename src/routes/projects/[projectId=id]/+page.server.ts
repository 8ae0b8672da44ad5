import { redirect } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import * as projects from '$lib/server/projects/service';
import { formUnitSystem, projectMemberSchema, roomSchemaFor } from '$lib/schemas/projects';
import { roleAllows } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, params }) => {
	const projectId = Number(params.projectId);
	const scope = await authorize(locals, 'project:read', { projectId });
	return {
		...(await projects.projectOverview(scope, projectId)),
		can: {
			editRooms: roleAllows(scope.role, 'project:edit'),
			manageMembers: roleAllows(scope.role, 'members:manage')
		}
	};
}) satisfies PageServerLoad;

export const actions = {
	createRoom: async ({ locals, params, request }) => {
		const projectId = Number(params.projectId);
		const scope = await authorize(locals, 'project:edit', { projectId });
		return formAction(request, (form) => roomSchemaFor(formUnitSystem(form, scope.user.unitSystem)), async (input) => {
			const id = await projects.createRoom(scope, projectId, input);
			redirect(303, `/rooms/${id}`);
		});
	},

	addClient: async ({ locals, params, request }) => {
		const projectId = Number(params.projectId);
		const scope = await authorize(locals, 'members:manage', { projectId });
		return formAction(request, projectMemberSchema, async (input) => {
			await projects.addClient(scope, projectId, input.email);
			return { clientAdded: true };
		});
	}
} satisfies Actions;
