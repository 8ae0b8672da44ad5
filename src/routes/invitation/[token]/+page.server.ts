import { error, redirect } from '@sveltejs/kit';
import { parseForm, problemToFailure } from '$lib/server/forms';
import * as people from '$lib/server/people/service';
import { setPasswordSchema } from '$lib/schemas/auth';
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
	default: async ({ request, params }) => {
		// The token comes from the address; the schema checks it with the passwords.
		const form = await request.formData();
		form.set('token', params.token);
		const parsed = parseForm(setPasswordSchema, form);
		if (!parsed.ok) return parsed.failure;
		let userId: number | null;
		try {
			userId = await people.acceptInvitation(params.token, parsed.data);
		} catch (e) {
			return problemToFailure(e, form);
		}
		if (userId === null) error(410, GONE);
		redirect(303, '/signin?reset=1');
	}
} satisfies Actions;
