import { redirect } from '@sveltejs/kit';
import { authorize, membershipsAllowing, requireUser } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import * as projects from '$lib/server/projects/service';
import { projectSchema } from '$lib/schemas/projects';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals }) => {
	const user = requireUser(locals);
	return {
		...(await projects.projectList(user, locals.memberships)),
		canCreateIn: membershipsAllowing(locals, 'project:create').map((m) => ({ id: m.organizationId, name: m.organizationName }))
	};
}) satisfies PageServerLoad;

export const actions = {
	// The organization is a field of the form, so the form is read before the check.
	create: async ({ locals, request }) =>
		formAction(request, projectSchema, async (input) => {
			const scope = await authorize(locals, 'project:create', { organizationId: input.organizationId });
			const id = await projects.createProject(scope, input);
			redirect(303, `/projects/${id}`);
		})
} satisfies Actions;
