import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/access';
import { clearSessionCookies } from '$lib/server/auth/authjs';
import { endEverySession } from '$lib/server/auth/session-user';
import { formAction } from '$lib/server/forms';
import * as people from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

const preferencesSchema = z.object({ unitSystem: z.enum(['metric', 'imperial'], { error: 'Pick metric or imperial.' }) });

export const load = (async ({ locals }) => {
	const user = requireUser(locals);
	return { unitSystem: user.unitSystem, email: user.email };
}) satisfies PageServerLoad;

export const actions = {
	preferences: async ({ locals, request }) => {
		const user = requireUser(locals);
		return formAction(request, preferencesSchema, async (input) => {
			await people.savePreferences(user, input);
			redirect(303, '/account?saved=1');
		});
	},

	// Every session of the account ends, on every device and server, this one included.
	signOutEverywhere: async ({ locals, cookies }) => {
		const user = requireUser(locals);
		await endEverySession(user);
		clearSessionCookies(cookies);
		redirect(303, '/signin?signedOut=everywhere');
	}
} satisfies Actions;
