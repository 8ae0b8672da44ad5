import type { LayoutServerLoad } from './$types';

export const load = (async ({ locals }) => {
	return {
		user: locals.user,
		memberships: locals.memberships.map((m) => ({ organizationId: m.organizationId, organizationName: m.organizationName, role: m.role }))
	};
}) satisfies LayoutServerLoad;
