import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import * as people from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

const preferencesSchema = z.object({ unitSystem: z.enum(['metric', 'imperial'], { error: 'Pick metric or imperial.' }) });

export const load = (async ({ locals }) => {
	const user = requireUser(locals);
	return { unitSystem: user.unitSystem, email: user.email };
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ locals, request }) => {
		const user = requireUser(locals);
		return formAction(request, preferencesSchema, async (input) => {
			await people.savePreferences(user, input);
			redirect(303, '/account?saved=1');
		});
	}
} satisfies Actions;
