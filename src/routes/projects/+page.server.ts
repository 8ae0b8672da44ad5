import { redirect } from '@sveltejs/kit';
import { authorize, membershipsAllowing, requireUser } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import { createProject, listProjects } from '$lib/server/queries/projects';
import { recordAudit } from '$lib/server/audit';
import { transaction } from '$lib/server/transaction';
import { projectSchema } from '$lib/schemas/projects';
import { listReportsForClient } from '$lib/server/queries/reviews';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals }) => {
	const user = requireUser(locals);
	return {
		projects: await listProjects(db(), user.id, locals.memberships),
		reports: locals.memberships.some((m) => m.role === 'client') ? await listReportsForClient(db(), user.id) : [],
		canCreateIn: membershipsAllowing(locals, 'project:create').map((m) => ({ id: m.organizationId, name: m.organizationName }))
	};
}) satisfies PageServerLoad;

export const actions = {
	create: async ({ locals, request }) => {
		const parsed = parseForm(projectSchema, await request.formData());
		if (!parsed.ok) return parsed.failure;
		const scope = await authorize(locals, 'project:create', { organizationId: parsed.data.organizationId });
		const id = await transaction(async (trx) => {
			const id = await createProject(trx, parsed.data);
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'project.created', entityType: 'project', entityId: id });
			return id;
		});
		redirect(303, `/projects/${id}`);
	}
} satisfies Actions;
