// The counting rule of the database rate limits, as a pure function: attempts per window, the
// lockout that follows, its doubling and its cap. (The limits are common practice, no source;
// these tests check that the rule does what its comment says, at and around each boundary.)
import { describe, expect, it } from 'vitest';
import { bucketKey, giveBack, LIMITS, lockoutLength, takeAttempt, type BucketState, type LimitPolicy } from '../../src/lib/server/auth/rate-limit';
import { formatWait } from '../../src/lib/format';

const MIN = 60_000;
const policy: LimitPolicy = { limit: 3, windowMs: 10 * MIN, lockoutMs: 5 * MIN, maxLockoutMs: 30 * MIN, forgetAfterMs: 60 * MIN };
const t0 = new Date('2026-12-03T09:00:00Z');
const at = (ms: number) => new Date(t0.getTime() + ms);
const fresh = (): BucketState => ({ hits: 0, windowEndsAt: t0, lockouts: 0, blockedUntil: null });

/** Take `n` attempts at `when`, returning the state and how many were allowed. */
function take(state: BucketState, n: number, when: Date) {
	let allowed = 0;
	let retryAt: Date | null = null;
	for (let i = 0; i < n; i++) {
		const r = takeAttempt(state, policy, when);
		state = r.state;
		if (r.verdict.allowed) allowed++;
		else retryAt = r.verdict.retryAt;
	}
	return { state, allowed, retryAt };
}

describe('takeAttempt', () => {
	it('allows exactly `limit` attempts in a window, refuses the next and locks the bucket for the first lockout', () => {
		const below = take(fresh(), policy.limit, t0);
		expect(below.allowed).toBe(3);
		expect(below.retryAt).toBeNull();
		const over = take(below.state, 1, at(1000));
		expect(over.allowed).toBe(0);
		expect(over.retryAt).toEqual(at(1000 + 5 * MIN));
		expect(over.state.lockouts).toBe(1);
	});

	it('40 attempts at once against a limit of 10 let 10 through', () => {
		const p = { ...policy, limit: 10 };
		let s = fresh();
		let allowed = 0;
		for (let i = 0; i < 40; i++) {
			const r = takeAttempt(s, p, t0);
			s = r.state;
			allowed += r.verdict.allowed ? 1 : 0;
		}
		expect(allowed).toBe(10);
	});

	it('refuses during the lockout (one millisecond before its end) and counts afresh at its end', () => {
		const locked = take(take(fresh(), 3, t0).state, 1, t0).state;
		expect(take(locked, 1, at(5 * MIN - 1)).allowed).toBe(0);
		const after = take(locked, 4, at(5 * MIN));
		expect(after.allowed).toBe(3);
	});

	it('a new window forgets the hits of the last one', () => {
		const two = take(fresh(), 2, t0).state;
		expect(take(two, 2, at(10 * MIN - 1)).allowed).toBe(1);
		expect(take(two, 3, at(10 * MIN)).allowed).toBe(3);
	});

	it('doubles each lockout that follows another, up to the cap, and forgets them after a quiet spell', () => {
		let s = fresh();
		let now = t0;
		const lengths: number[] = [];
		for (let i = 0; i < 5; i++) {
			const r = take(s, 4, now);
			lengths.push(r.retryAt!.getTime() - now.getTime());
			s = r.state;
			now = r.state.blockedUntil!;
		}
		expect(lengths).toEqual([5, 10, 20, 30, 30].map((m) => m * MIN));
		// Quiet for forgetAfterMs after the last lockout ended: back to the first length.
		const quiet = new Date(now.getTime() + policy.forgetAfterMs);
		const r = take(s, 4, quiet);
		expect(r.retryAt!.getTime() - quiet.getTime()).toBe(5 * MIN);
		// …but not one millisecond sooner.
		const early = new Date(now.getTime() + policy.forgetAfterMs - 1);
		expect(take(s, 4, early).retryAt!.getTime() - early.getTime()).toBe(30 * MIN);
	});

	it('lockoutLength caps huge counts without overflowing', () => {
		expect(lockoutLength(policy, 0)).toBe(5 * MIN);
		expect(lockoutLength(policy, 1)).toBe(10 * MIN);
		expect(lockoutLength(policy, 1_000_000)).toBe(30 * MIN);
	});
});

describe('giveBack', () => {
	it('returns one attempt, never below zero', () => {
		const s = take(fresh(), 2, t0).state;
		expect(giveBack(s, t0, { forget: false }).hits).toBe(1);
		expect(giveBack(fresh(), t0, { forget: false }).hits).toBe(0);
	});

	it('with `forget`, drops the failures so far and earlier lockouts, but never lifts one in force', () => {
		expect(giveBack(take(fresh(), 2, t0).state, t0, { forget: true }).hits).toBe(0);
		const locked = take(take(fresh(), 3, t0).state, 1, t0).state;
		expect(giveBack(locked, at(MIN), { forget: true }).blockedUntil).toEqual(locked.blockedUntil);
		const after = giveBack(locked, at(6 * MIN), { forget: true });
		expect(after.lockouts).toBe(0);
		expect(after.blockedUntil).toBeNull();
		expect(giveBack(locked, at(6 * MIN), { forget: false }).lockouts).toBe(1);
	});
});

describe('limits and keys', () => {
	it('limits an account across addresses more tightly than an address across accounts', () => {
		expect(LIMITS.signInAccount.limit).toBeLessThan(LIMITS.signInAddress.limit);
		expect(LIMITS.resetAccount.limit).toBeLessThan(LIMITS.resetAddress.limit);
	});

	it('keys by what is limited and by whom, case-blind, without the address in clear, within the column', () => {
		expect(bucketKey('signInAccount', 'Ann@Example.test')).toBe(bucketKey('signInAccount', 'ann@example.test'));
		expect(bucketKey('signInAccount', 'ann@example.test')).not.toBe(bucketKey('resetAccount', 'ann@example.test'));
		expect(bucketKey('signInAddress', '203.0.113.7')).not.toContain('203.0.113.7');
		expect(bucketKey('signInAddress', 'x'.repeat(300)).length).toBeLessThanOrEqual(191);
	});
});

describe('formatWait', () => {
	it('rounds up to whole minutes, at least one, hours past sixty', () => {
		expect(formatWait(1)).toBe('1 minute');
		expect(formatWait(60_000)).toBe('1 minute');
		expect(formatWait(60_001)).toBe('2 minutes');
		expect(formatWait(59 * MIN)).toBe('59 minutes');
		expect(formatWait(60 * MIN)).toBe('1 hour');
		expect(formatWait(125 * MIN)).toBe('2 hours 5 minutes');
		expect(formatWait(121 * MIN)).toBe('2 hours 1 minute');
	});
});
