import { redirect } from '@sveltejs/kit';
import { signOutCookies, usesSecureCookies } from '$lib/server/auth/authjs';
import type { Actions, PageServerLoad } from './$types';

export const load = (async () => redirect(303, '/signin')) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const cookies = await signOutCookies(event.url.origin, event.request.headers.get('cookie') ?? '');
		for (const c of cookies) event.cookies.set(c.name, c.value, { path: '/', ...(c.options as object) });
		// Belt and braces: the session cookie is gone whatever Auth.js answered.
		for (const name of ['authjs.session-token', '__Secure-authjs.session-token']) event.cookies.delete(name, { path: '/', secure: usesSecureCookies() });
		redirect(303, '/signin');
	}
} satisfies Actions;
