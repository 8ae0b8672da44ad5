// Personal API tokens: stored by the SHA-256 of the token, never the token itself.
import type { Knex } from 'knex';
import type { SessionUser } from '../auth/access';
import type { TokenScope } from '../../roles';

export interface ApiTokenRow {
	id: number;
	name: string;
	hint: string;
	scopes: TokenScope[];
	createdAt: Date;
	expiresAt: Date;
	revokedAt: Date | null;
	lastUsedAt: Date | null;
	lastUsedAddress: string | null;
	/** The account's session version moved on since the token was made (sign out everywhere…). */
	ended: boolean;
}

/** A MariaDB SET column reads as 'read,upload'. */
const scopesOf = (v: string): TokenScope[] => (v === '' ? [] : (v.split(',') as TokenScope[]));

export async function insertToken(
	k: Knex,
	t: { userId: number; name: string; tokenHash: string; hint: string; scopes: TokenScope[]; sessionVersion: number; expiresAt: Date }
): Promise<number> {
	const [id] = await k('api_tokens').insert({
		user_id: t.userId,
		name: t.name,
		token_hash: t.tokenHash,
		hint: t.hint,
		scopes: t.scopes.join(','),
		session_version: t.sessionVersion,
		expires_at: t.expiresAt
	});
	return id;
}

/** The account's session version, locked until the transaction ends (a sign-out everywhere waits). */
export async function lockSessionVersion(trx: Knex.Transaction, userId: number): Promise<number> {
	const r = await trx('users').where({ id: userId }).forUpdate().first('session_version');
	return Number(r.session_version);
}

/** Tokens of the account still usable now (not revoked, not expired, not ended). */
export async function countLiveTokens(k: Knex, userId: number, now: Date): Promise<number> {
	const r = await k('api_tokens as t')
		.join('users as u', 'u.id', 't.user_id')
		.where('t.user_id', userId)
		.whereNull('t.revoked_at')
		.where('t.expires_at', '>', now)
		.whereRaw('t.session_version = u.session_version')
		.count({ n: '*' })
		.first();
	return Number(r?.n ?? 0);
}

/** The account's tokens, newest first (a bounded list). */
export async function listTokens(k: Knex, userId: number, max = 100): Promise<ApiTokenRow[]> {
	const rows = await k('api_tokens as t')
		.join('users as u', 'u.id', 't.user_id')
		.where('t.user_id', userId)
		.orderBy([{ column: 't.created_at', order: 'desc' }, { column: 't.id', order: 'desc' }])
		.limit(max)
		.select({
			id: 't.id',
			name: 't.name',
			hint: 't.hint',
			scopes: 't.scopes',
			createdAt: 't.created_at',
			expiresAt: 't.expires_at',
			revokedAt: 't.revoked_at',
			lastUsedAt: 't.last_used_at',
			lastUsedAddress: 't.last_used_address',
			tokenVersion: 't.session_version',
			userVersion: 'u.session_version'
		});
	return rows.map(({ tokenVersion, userVersion, scopes, ...r }) => ({ ...r, scopes: scopesOf(scopes), ended: Number(tokenVersion) !== Number(userVersion) }));
}

/** Revoke one of the account's tokens; false when it is not theirs or was already revoked. */
export async function revokeToken(k: Knex, userId: number, tokenId: number, now: Date): Promise<boolean> {
	const n = await k('api_tokens').where({ id: tokenId, user_id: userId }).whereNull('revoked_at').update({ revoked_at: now });
	return n > 0;
}

export interface TokenAccount {
	tokenId: number;
	scopes: TokenScope[];
	expiresAt: Date;
	revokedAt: Date | null;
	ended: boolean;
	lastUsedAt: Date | null;
	lastUsedAddress: string | null;
	user: SessionUser;
}

/** The token of a hash and its account: one lookup by unique key, joined to the user. */
export async function findTokenAccount(k: Knex, tokenHash: string): Promise<TokenAccount | undefined> {
	const r = await k('api_tokens as t')
		.join('users as u', 'u.id', 't.user_id')
		.where('t.token_hash', tokenHash)
		.first({
			tokenId: 't.id',
			scopes: 't.scopes',
			expiresAt: 't.expires_at',
			revokedAt: 't.revoked_at',
			lastUsedAt: 't.last_used_at',
			lastUsedAddress: 't.last_used_address',
			tokenVersion: 't.session_version',
			userVersion: 'u.session_version',
			id: 'u.id',
			email: 'u.email',
			name: 'u.name',
			unitSystem: 'u.unit_system'
		});
	if (!r) return undefined;
	const { tokenId, scopes, expiresAt, revokedAt, lastUsedAt, lastUsedAddress, tokenVersion, userVersion, ...user } = r;
	return { tokenId, scopes: scopesOf(scopes), expiresAt, revokedAt, lastUsedAt, lastUsedAddress, ended: Number(tokenVersion) !== Number(userVersion), user };
}

/** Note a use; only the row of a token whose mark is stale or whose address changed is written. */
export async function markUsed(k: Knex, tokenId: number, address: string, now: Date, staleBefore: Date): Promise<boolean> {
	const n = await k('api_tokens')
		.where({ id: tokenId })
		.where((q) => q.whereNull('last_used_at').orWhere('last_used_at', '<', staleBefore).orWhereNot('last_used_address', address).orWhereNull('last_used_address'))
		.update({ last_used_at: now, last_used_address: address });
	return n > 0;
}

/** A token of the account by id (to show a just-made token once, after checking it is theirs). */
export async function tokenHashOf(k: Knex, userId: number, tokenId: number): Promise<string | undefined> {
	const r = await k('api_tokens').where({ id: tokenId, user_id: userId }).first('token_hash');
	return r?.token_hash;
}
