import { error, redirect } from '@sveltejs/kit';
import { passwordFormAction } from '$lib/server/people/password-form';
import * as people from '$lib/server/people/service';
import { ROLE_LABELS } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

const GONE = 'This invitation link has been used or has expired. Ask for a new one.';

export const load = (async ({ params }) => {
	const inv = await people.usableInvitation(params.token);
	if (!inv) error(410, GONE);
	return {
		email: inv.email,
		organizationName: inv.organizationName,
		roleLabel: ROLE_LABELS[inv.role],
		existingUser: inv.existingUser
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, params }) =>
		passwordFormAction(request, params.token, async (input) => {
			if ((await people.acceptInvitation(params.token, input)) === null) error(410, GONE);
			redirect(303, '/signin?reset=1');
		})
} satisfies Actions;
