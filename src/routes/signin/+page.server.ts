import { redirect } from '@sveltejs/kit';
import { signIn } from '$lib/server/auth/sign-in';
import { formAction } from '$lib/server/forms';
import { safeRedirectPath } from '$lib/server/safe-redirect';
import { signInSchema } from '$lib/schemas/auth';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, url }) => {
	if (locals.user) redirect(303, safeRedirectPath(url.searchParams.get('redirectTo')));
	return { redirectTo: safeRedirectPath(url.searchParams.get('redirectTo')), reset: url.searchParams.has('reset'), signedOutEverywhere: url.searchParams.get('signedOut') === 'everywhere' };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) =>
		formAction(event.request, signInSchema, async (input, form) => {
			const cookies = await signIn(event.url.origin, event.getClientAddress(), input);
			for (const c of cookies) event.cookies.set(c.name, c.value, { path: '/', ...(c.options as object) });
			redirect(303, safeRedirectPath(String(form.get('redirectTo') ?? '')));
		})
} satisfies Actions;
