// Auth.js (@auth/sveltekit): e-mail + password credentials, JWT sessions carrying the user id.
import { SvelteKitAuth, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import { Auth, raw, skipCSRFCheck } from '@auth/core';
import { config } from '../config';
import { db } from '../db';
import { findAccount } from '../queries/users';
import { verifyPassword } from './password';
import { signInSchema } from '../../schemas/auth';

const SESSION_HOURS = 12;

/** Cookies are Secure exactly when the public address is HTTPS (not per request, behind a proxy). */
export function usesSecureCookies(): boolean {
	return new URL(config().PUBLIC_BASE_URL).protocol === 'https:';
}

export function authConfig(): SvelteKitAuthConfig {
	return {
		secret: config().AUTH_SECRET,
		trustHost: true,
		useSecureCookies: usesSecureCookies(),
		basePath: '/auth',
		session: { strategy: 'jwt', maxAge: SESSION_HOURS * 3600 },
		pages: { signIn: '/signin', error: '/signin' },
		logger: {
			// A wrong password is an expected outcome, not a server error worth a stack trace.
			error(e) {
				if ((e as { type?: string }).type !== 'CredentialsSignin') console.error('[auth]', e);
			}
		},
		providers: [
			Credentials({
				credentials: { email: {}, password: {} },
				async authorize(input) {
					const parsed = signInSchema.safeParse(input);
					if (!parsed.success) return null;
					const user = await findAccount(db(), parsed.data.email);
					if (!user || !(await verifyPassword(user.passwordHash, parsed.data.password))) return null;
					return { id: String(user.id), email: user.email, name: user.name };
				}
			})
		],
		callbacks: {
			jwt({ token, user }) {
				if (user?.id) token.sub = user.id;
				return token;
			},
			session({ session, token }) {
				if (token.sub && session.user) session.user.id = token.sub;
				return session;
			}
		}
	};
}

export const { handle: authHandle } = SvelteKitAuth(async () => authConfig());

export interface CookieToSet {
	name: string;
	value: string;
	options: Record<string, unknown>;
}

/**
 * Run the credentials sign-in inside our own form action (which rate-limits first), so the
 * page can answer with field errors and status codes instead of Auth.js redirects.
 */
export async function credentialsSignIn(
	origin: string,
	email: string,
	password: string
): Promise<{ ok: boolean; cookies: CookieToSet[] }> {
	const request = new Request(`${origin}/auth/callback/credentials`, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email, password, callbackUrl: `${origin}/` })
	});
	let res;
	try {
		res = await Auth(request, { ...authConfig(), raw, skipCSRFCheck });
	} catch (e) {
		// With `raw`, a wrong password surfaces as a thrown CredentialsSignin.
		if ((e as { type?: string }).type === 'CredentialsSignin') return { ok: false, cookies: [] };
		throw e;
	}
	const redirect: string = res.redirect ?? '';
	const ok = !/[?&]error=/.test(redirect);
	return { ok, cookies: ok ? ((res.cookies ?? []) as CookieToSet[]) : [] };
}

/** Clear the session cookies (sign-out). */
export async function signOutCookies(origin: string, cookieHeader: string): Promise<CookieToSet[]> {
	const request = new Request(`${origin}/auth/signout`, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookieHeader },
		body: new URLSearchParams({ callbackUrl: `${origin}/signin` })
	});
	const res = await Auth(request, { ...authConfig(), raw, skipCSRFCheck });
	return (res.cookies ?? []) as CookieToSet[];
}
