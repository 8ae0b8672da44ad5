// Auth.js (@auth/sveltekit): e-mail + password credentials, JWT sessions carrying the user id,
// the account's session version at sign-in and an id of the session, so that a session can be
// ended before its token expires (see session-user.ts).
import { randomUUID } from 'node:crypto';
import type { Cookies } from '@sveltejs/kit';
import { SvelteKitAuth, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import { Auth, raw, skipCSRFCheck } from '@auth/core';
import { config } from '../config';
import { db } from '../db';
import { findAccount } from '../queries/users';
import { verifyPassword } from './password';
import type { SessionToken } from './session-user';
import { signInSchema } from '../../schemas/auth';

export const SESSION_HOURS = 12;

/** What a session token says beyond the user id. */
export interface SessionClaims {
	sessionId: string;
	sessionVersion: number;
	/** Sign-in time, ms since the epoch: a session lasts SESSION_HOURS from it, however often its token is refreshed. */
	signedInAt: number;
}

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
					// An unknown account is checked against a stand-in hash: both answers take as long.
					if (!(await verifyPassword(user?.passwordHash, parsed.data.password)) || !user) return null;
					return { id: String(user.id), email: user.email, name: user.name, sessionVersion: user.sessionVersion };
				}
			})
		],
		callbacks: {
			jwt({ token, user }) {
				if (user?.id) {
					token.sub = user.id;
					token.sid = randomUUID();
					token.sv = (user as { sessionVersion?: number }).sessionVersion ?? 0;
					token.sat = Date.now();
				}
				return token;
			},
			session({ session, token }) {
				if (token.sub && session.user) session.user.id = token.sub;
				const claims = session as typeof session & Partial<SessionClaims>;
				if (typeof token.sid === 'string') claims.sessionId = token.sid;
				if (typeof token.sv === 'number') claims.sessionVersion = token.sv;
				if (typeof token.sat === 'number') claims.signedInAt = token.sat;
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

/** Remove the session cookie from the browser (after a sign-out, or when its session was ended). */
export function clearSessionCookies(cookies: Cookies): void {
	for (const name of ['authjs.session-token', '__Secure-authjs.session-token']) cookies.delete(name, { path: '/', secure: usesSecureCookies() });
}

/** The session claims of `locals.auth()`'s answer, or null without a signed-in user. */
export function sessionTokenOf(session: unknown): SessionToken | null {
	const s = session as ({ user?: { id?: string } } & Partial<SessionClaims>) | null;
	const userId = Number(s?.user?.id);
	if (!s || !Number.isInteger(userId) || userId <= 0) return null;
	return { userId, sessionId: s.sessionId, sessionVersion: s.sessionVersion, signedInAt: s.signedInAt };
}
