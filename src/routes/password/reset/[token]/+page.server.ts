import { error, redirect } from '@sveltejs/kit';
import { passwordFormAction } from '$lib/server/people/password-form';
import * as people from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

const GONE = 'This reset link has been used or has expired. Ask for a new one.';

export const load = (async ({ params }) => {
	const reset = await people.usableReset(params.token);
	if (!reset) error(410, GONE);
	return { email: reset.email };
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, params }) =>
		passwordFormAction(request, params.token, async (input) => {
			if (!(await people.resetPassword(params.token, input.password))) error(410, GONE);
			redirect(303, '/signin?reset=1');
		})
} satisfies Actions;
