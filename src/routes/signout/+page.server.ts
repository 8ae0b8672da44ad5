import { redirect } from '@sveltejs/kit';
import { clearSessionCookies, signOutCookies } from '$lib/server/auth/authjs';
import { endOneSession } from '$lib/server/auth/session-user';
import type { Actions, PageServerLoad } from './$types';

export const load = (async () => redirect(303, '/signin')) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		// The session itself ends (a copy of its cookie elsewhere is refused too), then its cookie goes.
		if (event.locals.session) await endOneSession(event.locals.session);
		const cookies = await signOutCookies(event.url.origin, event.request.headers.get('cookie') ?? '');
		for (const c of cookies) event.cookies.set(c.name, c.value, { path: '/', ...(c.options as object) });
		// Belt and braces: the session cookie is gone whatever Auth.js answered.
		clearSessionCookies(event.cookies);
		redirect(303, '/signin');
	}
} satisfies Actions;
