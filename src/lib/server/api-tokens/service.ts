// Personal API tokens: a user makes them on the account page for scripts, which send them as
// `Authorization: Bearer rdt_…` to /api routes. A token acts as its user — the same memberships,
// read on every request, and the same authorize() — narrowed to its scopes. Only its SHA-256 is
// stored (the token is 256 random bits, so a fast hash is enough: nothing to guess or look up);
// the owner sees the token once. It is refused after its expiry, after it is revoked, and once the
// account's session version moves on (sign out everywhere, a new password, removal from an
// organization). Requests per token are rate-limited in the database, like sign-ins.
import { randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { Membership, SessionUser } from '../auth/access';
import { audit } from '../audit';
import { hashToken } from '../auth/tokens';
import { LIMITS, takeAttempts } from '../auth/rate-limit';
import { config } from '../config';
import { db } from '../db';
import { conflict, notFound } from '../problem';
import { transaction } from '../transaction';
import { listMemberships } from '../queries/users';
import * as tokenRows from '../queries/api-tokens';
import { TOKEN_PATTERN, type CreateTokenInput } from '../../schemas/api-tokens';
import type { TokenScope } from '../../roles';

export const TOKEN_PREFIX = 'rdt_';
/** Tokens one account may have in use at once (common practice, no source: enough for every machine). */
export const MAX_LIVE_TOKENS = 20;
/** A token's "last used" is written at most this often, unless it comes from another address. */
export const MARK_USED_EVERY_MS = 60_000;

const DAY_MS = 86_400_000;

/** A new token: the prefix and 32 random bytes, its hash, and the first characters to tell it by. */
export function newApiToken(): { token: string; tokenHash: string; hint: string } {
	const token = TOKEN_PREFIX + randomBytes(32).toString('base64url');
	return { token, tokenHash: hashToken(token), hint: token.slice(0, TOKEN_PREFIX.length + 4) };
}

/** Make a token for the signed-in user; the token itself is returned this once and never stored. */
export async function createToken(user: SessionUser, input: CreateTokenInput, now = new Date()): Promise<{ id: number; token: string }> {
	const { token, tokenHash, hint } = newApiToken();
	return transaction(async (trx) => {
		const sessionVersion = await tokenRows.lockSessionVersion(trx, user.id);
		if ((await tokenRows.countLiveTokens(trx, user.id, now)) >= MAX_LIVE_TOKENS) {
			throw conflict(`You have ${MAX_LIVE_TOKENS} tokens in use: revoke one you no longer need first.`, { field: 'name' });
		}
		const expiresAt = new Date(now.getTime() + input.expiresInDays * DAY_MS);
		const id = await tokenRows.insertToken(trx, { userId: user.id, name: input.name, tokenHash, hint, scopes: input.scopes, sessionVersion, expiresAt });
		await audit(trx, { organizationId: null, user }, 'api_token.created', 'api_token', id, { name: input.name, scopes: input.scopes, expiresAt: expiresAt.toISOString() });
		return { id, token };
	});
}

export type TokenStatus = 'active' | 'expired' | 'revoked' | 'ended';

export interface TokenView {
	id: number;
	name: string;
	hint: string;
	scopes: TokenScope[];
	createdAt: string;
	expiresAt: string;
	lastUsedAt: string | null;
	lastUsedAddress: string | null;
	status: TokenStatus;
}

function statusOf(t: { revokedAt: Date | null; ended: boolean; expiresAt: Date }, now: Date): TokenStatus {
	if (t.revokedAt) return 'revoked';
	if (t.ended) return 'ended';
	return new Date(t.expiresAt) <= now ? 'expired' : 'active';
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

/** The user's tokens for the account page, newest first. */
export async function listTokens(user: SessionUser, now = new Date()): Promise<TokenView[]> {
	const rows = await tokenRows.listTokens(db(), user.id);
	return rows.map((t) => ({
		id: t.id,
		name: t.name,
		hint: t.hint,
		scopes: t.scopes,
		createdAt: iso(t.createdAt)!,
		expiresAt: iso(t.expiresAt)!,
		lastUsedAt: iso(t.lastUsedAt),
		lastUsedAddress: t.lastUsedAddress,
		status: statusOf(t, now)
	}));
}

/** Revoke one of the user's own tokens: refused from the next request on, on every server. */
export async function revokeToken(user: SessionUser, tokenId: number, now = new Date()): Promise<void> {
	await transaction(async (trx) => {
		if (!(await tokenRows.revokeToken(trx, user.id, tokenId, now))) throw notFound('No such token, or it was revoked already.');
		await audit(trx, { organizationId: null, user }, 'api_token.revoked', 'api_token', tokenId);
	});
}

/** The token just made, to show once: only if it is the user's (checked against the stored hash). */
export async function isOwnNewToken(user: SessionUser, tokenId: number, token: string): Promise<boolean> {
	const stored = await tokenRows.tokenHashOf(db(), user.id, tokenId);
	return stored !== undefined && stored === hashToken(token);
}

export type TokenRefusal = 'invalid' | 'expired' | 'revoked' | 'ended' | 'rate_limited';

export type TokenAuthentication =
	| { ok: true; user: SessionUser; memberships: Membership[]; token: { id: number; scopes: TokenScope[] } }
	| { ok: false; status: 401 | 429; reason: TokenRefusal; message: string; retryAfterS?: number };

const dateOnly = (d: Date) => new Date(d).toISOString().slice(0, 10);
const MAKE_ANOTHER = 'Create a new one on your account page.';

function refused(reason: Exclude<TokenRefusal, 'rate_limited'>, message: string): TokenAuthentication {
	return { ok: false, status: 401, reason, message };
}

/**
 * Who a bearer token's request acts as, checked on every request in one lookup by the token's
 * hash (no cache, so a revocation holds at once on every server); then one request is taken from
 * the token's rate limit, and its use is noted (at most once a minute per address, and audited
 * when the address changes).
 */
export async function authenticateApiToken(token: string, address: string, now = new Date(), k: Knex = db()): Promise<TokenAuthentication> {
	if (!TOKEN_PATTERN.test(token)) return refused('invalid', 'This API token is not valid.');
	const found = await tokenRows.findTokenAccount(k, hashToken(token));
	if (!found) return refused('invalid', 'This API token is not valid.');
	if (found.revokedAt) return refused('revoked', `This API token was revoked. ${MAKE_ANOTHER}`);
	if (found.ended) {
		return refused('ended', `This API token ended when its account signed out everywhere, changed its password or was removed from an organization. ${MAKE_ANOTHER}`);
	}
	if (new Date(found.expiresAt) <= now) return refused('expired', `This API token expired on ${dateOnly(found.expiresAt)}. ${MAKE_ANOTHER}`);

	const limit = await takeAttempts(k, [{ name: 'apiToken', who: String(found.tokenId), policy: { ...LIMITS.apiToken, limit: config().API_TOKEN_REQUESTS_PER_MINUTE } }]);
	if (!limit.allowed) {
		const retryAfterS = Math.max(1, Math.ceil(limit.retryAfterMs / 1000));
		return { ok: false, status: 429, reason: 'rate_limited', message: `Too many requests with this token: try again in ${retryAfterS} s.`, retryAfterS };
	}

	const fresh = found.lastUsedAt !== null && now.getTime() - new Date(found.lastUsedAt).getTime() < MARK_USED_EVERY_MS && found.lastUsedAddress === address;
	if (!fresh) await noteUse(k, found, address, now);
	return { ok: true, user: found.user, memberships: await listMemberships(k, found.user.id), token: { id: found.tokenId, scopes: found.scopes } };
}

async function noteUse(k: Knex, found: tokenRows.TokenAccount, address: string, now: Date): Promise<void> {
	await transaction(async (trx) => {
		// The row is written only if it is still stale or from another address: of two requests
		// at once from a new address, one notes it (and audits it).
		const marked = await tokenRows.markUsed(trx, found.tokenId, address, now, new Date(now.getTime() - MARK_USED_EVERY_MS));
		if (marked && found.lastUsedAddress !== address) {
			await audit(trx, { organizationId: null, user: found.user }, 'api_token.new_address', 'api_token', found.tokenId, { address, previous: found.lastUsedAddress });
		}
	}, k);
}
