import { redirect, type Cookies } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/auth/access';
import { clearSessionCookies, usesSecureCookies } from '$lib/server/auth/authjs';
import { endEverySession } from '$lib/server/auth/session-user';
import { formAction } from '$lib/server/forms';
import * as people from '$lib/server/people/service';
import * as apiTokens from '$lib/server/api-tokens/service';
import { createTokenSchema, revokeTokenSchema, TOKEN_PATTERN } from '$lib/schemas/api-tokens';
import type { Actions, PageServerLoad } from './$types';

const preferencesSchema = z.object({ unitSystem: z.enum(['metric', 'imperial'], { error: 'Pick metric or imperial.' }) });

// A new token is shown once: the creating action puts it in a short-lived cookie for this page
// only and redirects (so the one-time form key records a redirect, never the token), and the next
// load of the page shows it and deletes the cookie. Reloading shows it no more.
const NEW_TOKEN_COOKIE = 'ringdown-new-token';
const NEW_TOKEN_SECONDS = 120;
const cookieOptions = () => ({ path: '/account', httpOnly: true, sameSite: 'strict' as const, secure: usesSecureCookies() });

function takeNewToken(cookies: Cookies): { id: number; token: string } | null {
	const raw = cookies.get(NEW_TOKEN_COOKIE);
	if (raw === undefined) return null;
	cookies.delete(NEW_TOKEN_COOKIE, cookieOptions());
	const [id, token] = raw.split('.', 2);
	return /^\d+$/.test(id) && TOKEN_PATTERN.test(token ?? '') ? { id: Number(id), token } : null;
}

export const load = (async ({ locals, cookies, setHeaders }) => {
	const user = requireUser(locals);
	const fresh = takeNewToken(cookies);
	const newToken = fresh && (await apiTokens.isOwnNewToken(user, fresh.id, fresh.token)) ? fresh : null;
	// The page that shows a token is kept by no cache.
	if (newToken) setHeaders({ 'cache-control': 'no-store' });
	return { unitSystem: user.unitSystem, email: user.email, tokens: await apiTokens.listTokens(user), newToken };
}) satisfies PageServerLoad;

export const actions = {
	preferences: async ({ locals, request }) => {
		const user = requireUser(locals);
		return formAction(request, preferencesSchema, async (input) => {
			await people.savePreferences(user, input);
			redirect(303, '/account?saved=1');
		});
	},

	createToken: async ({ locals, request, cookies }) => {
		const user = requireUser(locals);
		return formAction(request, createTokenSchema, async (input) => {
			const created = await apiTokens.createToken(user, input);
			cookies.set(NEW_TOKEN_COOKIE, `${created.id}.${created.token}`, { ...cookieOptions(), maxAge: NEW_TOKEN_SECONDS });
			redirect(303, '/account?token=created#tokens');
		});
	},

	revokeToken: async ({ locals, request }) => {
		const user = requireUser(locals);
		return formAction(request, revokeTokenSchema, async (input) => {
			await apiTokens.revokeToken(user, input.tokenId);
			redirect(303, '/account?token=revoked#tokens');
		});
	},

	// Every session of the account ends, on every device and server, this one included, and with
	// them every API token it made.
	signOutEverywhere: async ({ locals, cookies }) => {
		const user = requireUser(locals);
		await endEverySession(user);
		clearSessionCookies(cookies);
		redirect(303, '/signin?signedOut=everywhere');
	}
} satisfies Actions;
