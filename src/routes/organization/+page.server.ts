import { error } from '@sveltejs/kit';
import { authorize, membershipsAllowing } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import * as people from '$lib/server/people/service';
import { invitationSchema, memberRemovalSchema, roleChangeSchema } from '$lib/schemas/projects';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

/** The organization being managed: ?org=ID, else the first one the user administers. */
function organizationOf(event: RequestEvent | Parameters<PageServerLoad>[0]): number {
	const fromQuery = Number(event.url.searchParams.get('org'));
	if (Number.isInteger(fromQuery) && fromQuery > 0) return fromQuery;
	const first = membershipsAllowing(event.locals, 'members:manage')[0];
	if (!first) error(403, 'Only an admin can manage people.');
	return first.organizationId;
}

const manager = (event: RequestEvent | Parameters<PageServerLoad>[0]) => authorize(event.locals, 'members:manage', { organizationId: organizationOf(event) });

export const load = (async (event) => {
	const scope = await manager(event);
	return people.organizationOverview(scope.organizationId);
}) satisfies PageServerLoad;

export const actions = {
	invite: async (event) => {
		const scope = await manager(event);
		return formAction(event.request, invitationSchema, async (input) => {
			await people.invite(scope, input);
			return { invited: input.email };
		});
	},

	setRole: async (event) => {
		const scope = await manager(event);
		return formAction(event.request, roleChangeSchema, async (input) => {
			await people.changeRole(scope, input);
			return { roleChanged: true };
		});
	},

	removeMember: async (event) => {
		const scope = await manager(event);
		return formAction(event.request, memberRemovalSchema, async (input) => {
			await people.removeMember(scope, input.userId);
			return { removed: true };
		});
	}
} satisfies Actions;
