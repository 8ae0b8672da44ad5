import { error, json, redirect, type Handle, type HandleServerError, type RequestEvent, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authenticateApiToken } from '$lib/server/api-tokens/service';
import { authHandle, clearSessionCookies, sessionTokenOf } from '$lib/server/auth/authjs';
import { prepareStandInHash } from '$lib/server/auth/password';
import { userOfSession } from '$lib/server/auth/session-user';
import { bodyLimitFor, limitBody } from '$lib/server/body-limit';
import { config } from '$lib/server/config';
import { storageOrigin, withSources } from '$lib/server/content-security';
import { closeDb, db } from '$lib/server/db';
import { isDatabaseUnreachable } from '$lib/server/db-errors';
import { Problem } from '$lib/server/problem';

// Pages anyone may open; everything else needs a signed-in user (deny by default). The API
// description names routes and shapes only, no one's data.
const PUBLIC_PATHS = [/^\/signin$/, /^\/signout$/, /^\/invitation\/[^/]+$/, /^\/password\/(forgot|reset\/[^/]+)$/, /^\/health$/, /^\/api\/openapi\.json$/, /^\/developers\/api$/];

const UNAVAILABLE = 'Ringdown is briefly unavailable. Try again in a moment.';
const RETRY_AFTER_S = '10';

export const init: ServerInit = async () => {
	// Close the pool on shutdown, or the server takes ~30 s to exit.
	process.once('sveltekit:shutdown', () => void closeDb());
	prepareStandInHash();
};

/** A dependency (the database, object storage) is down, as opposed to a fault of ours. */
function isOutage(e: unknown): boolean {
	return isDatabaseUnreachable(e) || (e instanceof Problem && e.status === 503);
}

function refusal(event: RequestEvent, status: number, message: string): Response {
	const wantsJson = event.url.pathname.startsWith('/api/') || (event.request.headers.get('accept') ?? '').includes('application/json');
	return wantsJson ? json({ message }, { status }) : new Response(message, { status, headers: { 'content-type': 'text/plain; charset=utf-8' } });
}

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'same-origin');
	response.headers.set('x-frame-options', 'DENY');
	const csp = response.headers.get('content-security-policy');
	if (csp) response.headers.set('content-security-policy', withSources(csp, 'connect-src', [storageOrigin(config())]));
	return response;
};

// Errors of loads and actions reach handleError, which cannot set the status; it marks the
// request, and an outage is answered 503 (with its page or JSON) instead of 500. The mark is on
// `locals`: handleError may get a copy of the event, but the same locals.
const outages = new WeakSet<App.Locals>();

const answerOutagesAs503: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (response.status !== 500 || !outages.has(event.locals)) return response;
	const headers = new Headers(response.headers);
	headers.set('retry-after', RETRY_AFTER_S);
	return new Response(response.body, { status: 503, headers });
};

// Bodies are capped before anything reads them (see body-limit.ts).
const limitBodies: Handle = async ({ event, resolve }) => {
	const refused = await limitBody(event, bodyLimitFor(event.route.id, config()));
	return refused ?? resolve(event);
};

// An /api request with `Authorization: Bearer …` is a script's: it is answered as the token's
// user and nobody else (its cookies are not read). Another scheme (a proxy's Basic) is not ours.
const BEARER = /^Bearer(?: +(\S*))? *$/i;

function bearerTokenOf(event: RequestEvent): string | null {
	if (!event.url.pathname.startsWith('/api/')) return null;
	const m = BEARER.exec(event.request.headers.get('authorization') ?? '');
	return m ? (m[1] ?? '') : null;
}

// RFC 6750 §3: the scheme a refused API request may use, and why a token was refused.
const AUTH_CHALLENGE = 'Bearer realm="Ringdown"';
const TOKEN_ERRORS: Record<string, string> = {
	invalid: 'The token is not valid',
	expired: 'The token has expired',
	revoked: 'The token was revoked',
	ended: 'The token ended with its account sessions'
};

// Browsers send Origin with every POST, PUT, PATCH and DELETE: one from another site is refused
// whatever its content type (SvelteKit's own check, which covers form content types only and
// refuses a script's multipart upload without Origin, is off in svelte.config.js: this replaces
// it). Without an Origin, only a request carrying no cookies passes — it cannot be riding
// someone's session. A bearer-token /api request carries no ambient credentials (its cookies are
// never read), so it is not checked.
const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

const refuseCrossSiteChanges: Handle = async ({ event, resolve }) => {
	if (STATE_CHANGING.has(event.request.method) && bearerTokenOf(event) === null) {
		const origin = event.request.headers.get('origin');
		const crossSite = origin === null ? Boolean(event.request.headers.get('cookie')) : origin !== event.url.origin;
		if (crossSite) return refusal(event, 403, 'Changes from another site are refused.');
	}
	return resolve(event);
};

// Sign-in goes only through our /signin action (which rate-limits); Auth.js's own credential
// endpoints are closed so nobody can bypass the limit by posting to them directly.
const closeDirectAuthPosts: Handle = async ({ event, resolve }) => {
	const p = event.url.pathname;
	if (event.request.method === 'POST' && (p.startsWith('/auth/callback/') || p.startsWith('/auth/signin'))) {
		error(404, 'Not found.');
	}
	return resolve(event);
};

const loadUser: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.memberships = [];
	event.locals.session = null;
	event.locals.apiToken = null;
	// /health reports each dependency itself, for anyone, signed in or not.
	if (event.url.pathname === '/health') return resolve(event);
	const bearer = bearerTokenOf(event);
	if (bearer !== null) {
		let found;
		try {
			found = await authenticateApiToken(bearer, event.getClientAddress());
		} catch (e) {
			if (isOutage(e)) error(503, { message: UNAVAILABLE, code: 'unavailable' });
			throw e;
		}
		if (!found.ok) {
			const headers: Record<string, string> =
				found.status === 429
					? { 'retry-after': String(found.retryAfterS) }
					: { 'www-authenticate': `${AUTH_CHALLENGE}, error="invalid_token", error_description="${TOKEN_ERRORS[found.reason]}"` };
			return json({ message: found.message, code: found.reason === 'rate_limited' ? 'rate_limited' : 'invalid_token' }, { status: found.status, headers });
		}
		event.locals.user = found.user;
		event.locals.memberships = found.memberships;
		event.locals.apiToken = found.token;
		return resolve(event);
	}
	const token = sessionTokenOf(await event.locals.auth());
	if (token) {
		let loaded;
		try {
			// Checked on every request, on every server: a session that was ended is refused at once.
			loaded = await userOfSession(db(), token);
		} catch (e) {
			// Not "signed out": the person is signed in, the database is just not answering.
			if (isOutage(e)) error(503, { message: UNAVAILABLE, code: 'unavailable' });
			throw e;
		}
		if (loaded) {
			event.locals.user = loaded.user;
			event.locals.memberships = loaded.memberships;
			event.locals.session = token;
		} else {
			clearSessionCookies(event.cookies);
		}
	}
	return resolve(event);
};

const requireSignIn: Handle = async ({ event, resolve }) => {
	const p = event.url.pathname;
	const open = p.startsWith('/auth/') || p.startsWith('/_app/') || PUBLIC_PATHS.some((r) => r.test(p));
	if (!open && !event.locals.user) {
		if (p.startsWith('/api/')) {
			const res = refusal(event, 401, 'Sign in, or send an API token as "Authorization: Bearer rdt_…".');
			res.headers.set('www-authenticate', AUTH_CHALLENGE);
			return res;
		}
		redirect(303, `/signin?redirectTo=${encodeURIComponent(p + event.url.search)}`);
	}
	return resolve(event);
};

export const handle = sequence(
	securityHeaders,
	answerOutagesAs503,
	limitBodies,
	refuseCrossSiteChanges,
	closeDirectAuthPosts,
	authHandle,
	loadUser,
	requireSignIn
);

export const handleError: HandleServerError = ({ error: err, event, status, message }) => {
	const errorId = crypto.randomUUID();
	if (status >= 500 && isOutage(err)) {
		outages.add(event.locals);
		console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}: unavailable (${(err as { code?: string }).code ?? (err as Error).message})`);
		return { message: UNAVAILABLE, errorId, code: 'unavailable' };
	}
	if (status >= 500) console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, err);
	return { message: status >= 500 ? 'Something went wrong on our side.' : message, errorId };
};
