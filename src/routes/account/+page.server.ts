import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

const preferencesSchema = z.object({ unitSystem: z.enum(['metric', 'imperial'], { error: 'Pick metric or imperial.' }) });

export const load = (async ({ locals }) => {
	const user = requireUser(locals);
	return { unitSystem: user.unitSystem, email: user.email };
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ locals, request }) => {
		const user = requireUser(locals);
		const parsed = parseForm(preferencesSchema, await request.formData());
		if (!parsed.ok) return parsed.failure;
		await db()('users').where({ id: user.id }).update({ unit_system: parsed.data.unitSystem });
		redirect(303, '/account?saved=1');
	}
} satisfies Actions;
