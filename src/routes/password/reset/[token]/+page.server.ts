import { error, redirect } from '@sveltejs/kit';
import { parseForm } from '$lib/server/forms';
import * as people from '$lib/server/people/service';
import { setPasswordSchema } from '$lib/schemas/auth';
import type { Actions, PageServerLoad } from './$types';

const GONE = 'This reset link has been used or has expired. Ask for a new one.';

export const load = (async ({ params }) => {
	const reset = await people.usableReset(params.token);
	if (!reset) error(410, GONE);
	return { email: reset.email };
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, params }) => {
		// The token comes from the address; the schema checks it with the passwords.
		const form = await request.formData();
		form.set('token', params.token);
		const parsed = parseForm(setPasswordSchema, form);
		if (!parsed.ok) return parsed.failure;
		if (!(await people.resetPassword(params.token, parsed.data.password))) error(410, GONE);
		redirect(303, '/signin?reset=1');
	}
} satisfies Actions;
