import { error, redirect } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import { findUsableReset, usePasswordReset } from '$lib/server/queries/members';
import { transaction } from '$lib/server/transaction';
import { setPasswordSchema } from '$lib/schemas/auth';
import type { Actions, PageServerLoad } from './$types';

const GONE = 'This reset link has been used or has expired. Ask for a new one.';

export const load = (async ({ params }) => {
	const r = await findUsableReset(db(), params.token);
	if (!r) error(410, GONE);
	return { email: r.email };
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, params }) => {
		const form = await request.formData();
		form.set('token', params.token);
		const parsed = parseForm(setPasswordSchema, form);
		if (!parsed.ok) return parsed.failure;
		const userId = await transaction((trx) => usePasswordReset(trx, params.token, parsed.data.password));
		if (!userId) error(410, GONE);
		redirect(303, '/signin?reset=1');
	}
} satisfies Actions;
