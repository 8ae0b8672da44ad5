// Rate limits kept in the database, so they hold across web servers. Each bucket (an account's
// sign-ins, an address's sign-ins, an account's reset mails…) allows `limit` attempts per window;
// the attempt after that starts a lockout, and each lockout that follows another within
// `forgetAfterMs` lasts twice as long, up to `maxLockoutMs`. An attempt is taken — counted —
// *before* the work it guards (a password check, a mail), under a row lock, so 40 requests at
// once get at most `limit` passes between them; a sign-in that succeeds gives its attempt back.
// (Limits and lockouts: common practice, no source.)
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { transaction } from '../transaction';
import { databaseNow, deleteBucket, deleteIdleBuckets, ensureBuckets, lockBuckets, saveBucket } from '../queries/rate-limits';

export interface LimitPolicy {
	/** Attempts allowed per window. */
	limit: number;
	windowMs: number;
	/** The first lockout; each one that follows within `forgetAfterMs` doubles, up to `maxLockoutMs`. */
	lockoutMs: number;
	maxLockoutMs: number;
	forgetAfterMs: number;
}

export interface BucketState {
	hits: number;
	windowEndsAt: Date;
	lockouts: number;
	blockedUntil: Date | null;
}

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;

export const LIMITS = {
	/** Failed sign-ins of one account, from any address. */
	signInAccount: { limit: 10, windowMs: 15 * MINUTE, lockoutMs: 15 * MINUTE, maxLockoutMs: 24 * HOUR, forgetAfterMs: 24 * HOUR },
	/** Failed sign-ins from one address, whatever the account (one machine walking through accounts). */
	signInAddress: { limit: 100, windowMs: 15 * MINUTE, lockoutMs: 15 * MINUTE, maxLockoutMs: 24 * HOUR, forgetAfterMs: 24 * HOUR },
	/** Reset mails asked for one address (known or not, so the answer says nothing about accounts). */
	resetAccount: { limit: 3, windowMs: HOUR, lockoutMs: HOUR, maxLockoutMs: 24 * HOUR, forgetAfterMs: 24 * HOUR },
	/** Reset mails asked from one address. */
	resetAddress: { limit: 10, windowMs: HOUR, lockoutMs: HOUR, maxLockoutMs: 24 * HOUR, forgetAfterMs: 24 * HOUR },
	/** Requests with one API token (the limit per minute is the setting API_TOKEN_REQUESTS_PER_MINUTE). */
	apiToken: { limit: 600, windowMs: MINUTE, lockoutMs: MINUTE, maxLockoutMs: 15 * MINUTE, forgetAfterMs: HOUR }
} as const satisfies Record<string, LimitPolicy>;

export type LimitName = keyof typeof LIMITS;

export interface Verdict {
	allowed: boolean;
	/** When the bucket that refused opens again (null when allowed). */
	retryAt: Date | null;
}

export interface Answer extends Verdict {
	/** Milliseconds until `retryAt` by the database's clock (0 when allowed). */
	retryAfterMs: number;
}

/** How long the next lockout lasts after `lockouts` earlier ones. */
export function lockoutLength(policy: LimitPolicy, lockouts: number): number {
	return Math.min(policy.lockoutMs * 2 ** Math.min(lockouts, 30), policy.maxLockoutMs);
}

/** One attempt against a bucket: the state after it and whether it may go ahead. Pure. */
export function takeAttempt(state: BucketState, policy: LimitPolicy, now: Date): { state: BucketState; verdict: Verdict } {
	const t = now.getTime();
	if (state.blockedUntil && state.blockedUntil.getTime() > t) return { state, verdict: { allowed: false, retryAt: state.blockedUntil } };
	const s = { ...state };
	if (s.blockedUntil && t - s.blockedUntil.getTime() >= policy.forgetAfterMs) {
		s.lockouts = 0;
		s.blockedUntil = null;
	}
	if (s.windowEndsAt.getTime() <= t) {
		s.hits = 0;
		s.windowEndsAt = new Date(t + policy.windowMs);
	}
	if (s.hits >= policy.limit) {
		const until = new Date(t + lockoutLength(policy, s.lockouts));
		// The lockout replaces the window: when it ends, counting starts afresh.
		return { state: { hits: 0, windowEndsAt: until, lockouts: s.lockouts + 1, blockedUntil: until }, verdict: { allowed: false, retryAt: until } };
	}
	s.hits += 1;
	return { state: s, verdict: { allowed: true, retryAt: null } };
}

/**
 * Give back an attempt that turned out well (a right password). With `forget`, the bucket's
 * failures and earlier lockouts are forgotten too (the account's owner has signed in); a lockout
 * in force stays. Pure.
 */
export function giveBack(state: BucketState, now: Date, opts: { forget: boolean }): BucketState {
	const s = { ...state, hits: opts.forget ? 0 : Math.max(0, state.hits - 1) };
	if (opts.forget && !(s.blockedUntil && s.blockedUntil > now)) {
		s.lockouts = 0;
		s.blockedUntil = null;
	}
	return s;
}

/** A bucket's key: what is limited and by whom, hashed (addresses and e-mails are not kept in clear). */
export function bucketKey(name: LimitName, who: string): string {
	return `${name}:${createHash('sha256').update(who.trim().toLowerCase()).digest('base64url')}`;
}

export interface Take {
	name: LimitName;
	who: string;
	/** The policy when it is a setting rather than the one in LIMITS. */
	policy?: LimitPolicy;
}

const IDLE_MS = 2 * 24 * HOUR;

/**
 * Take one attempt from each bucket, all or none: if any bucket refuses, the others are not
 * charged (the work is not done). The verdict names the latest time a refusing bucket opens.
 */
export async function takeAttempts(k: Knex, takes: Take[]): Promise<Answer> {
	const keys = takes.map((t) => bucketKey(t.name, t.who));
	// Rows are made first, in a transaction of their own: inserting and then locking an existing
	// row in one transaction lets two requests deadlock on it.
	await transaction((trx) => ensureBuckets(trx, keys), k, 5);
	const verdict = await transaction(async (trx) => {
		let states = await lockBuckets(trx, keys);
		if (states.size < keys.length) {
			// A bucket forgotten in between (a reset, the idle sweep): made again, under this lock.
			await ensureBuckets(trx, keys.filter((key) => !states.has(key)));
			states = await lockBuckets(trx, keys);
		}
		// The clock is read once the lock is held: read before, it can be older than the lockout
		// another request wrote while this one waited, which then looks longer than it is.
		const now = await databaseNow(trx);
		const results = takes.map((t, i) => ({ key: keys[i], ...takeAttempt(states.get(keys[i])!, t.policy ?? LIMITS[t.name], now) }));
		const refused = results.filter((r) => !r.verdict.allowed);
		// Refused: only a lockout that starts now is written; allowed: every bucket is charged.
		for (const r of refused.length ? refused : results) await saveBucket(trx, r.key, r.state, now);
		if (!refused.length) return { allowed: true, retryAt: null, retryAfterMs: 0 };
		const retryAt = new Date(Math.max(...refused.map((r) => r.verdict.retryAt!.getTime())));
		return { allowed: false, retryAt, retryAfterMs: retryAt.getTime() - now.getTime() };
	}, k, 5);
	// Now and then, forget buckets idle for two days (cheap, bounded).
	if (Math.random() < 0.01) await deleteIdleBuckets(k, new Date(Date.now() - IDLE_MS));
	return verdict;
}

/** Give back the attempts of a sign-in that succeeded (see giveBack). */
export async function giveBackAttempts(k: Knex, takes: (Take & { forget: boolean })[]): Promise<void> {
	const keys = takes.map((t) => bucketKey(t.name, t.who));
	await transaction(async (trx) => {
		const states = await lockBuckets(trx, keys);
		const now = await databaseNow(trx); // after the lock, as in takeAttempts
		for (const [i, t] of takes.entries()) {
			const s = states.get(keys[i]);
			if (s) await saveBucket(trx, keys[i], giveBack(s, now, t), now);
		}
	}, k, 5);
}

/** Clear a bucket: a password reset proves the mailbox, so the account may sign in again at once. */
export async function clearBucket(k: Knex, name: LimitName, who: string): Promise<void> {
	await deleteBucket(k, bucketKey(name, who));
}
