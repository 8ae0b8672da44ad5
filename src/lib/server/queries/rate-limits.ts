// Rate-limit buckets: one row per counted thing, read and written under a row lock so that
// concurrent requests — on this server or another — count one after another.
import type { Knex } from 'knex';
import type { BucketState } from '../auth/rate-limit';

interface BucketRow {
	bucket: string;
	hits: number;
	window_ends_at: Date;
	lockouts: number;
	blocked_until: Date | null;
}

/** Make sure each bucket has a row (in key order, as they are locked). */
export async function ensureBuckets(k: Knex, keys: string[]): Promise<void> {
	await k('rate_limits')
		.insert([...keys].sort().map((bucket) => ({ bucket })))
		.onConflict('bucket')
		.ignore();
}

/** The buckets' states, locked until the transaction ends (in key order, so two requests never wait on each other in a circle). */
export async function lockBuckets(trx: Knex.Transaction, keys: string[]): Promise<Map<string, BucketState>> {
	const rows: BucketRow[] = await trx('rate_limits').whereIn('bucket', [...keys].sort()).orderBy('bucket').forUpdate().select('bucket', 'hits', 'window_ends_at', 'lockouts', 'blocked_until');
	return new Map(
		rows.map((r) => [
			r.bucket,
			{ hits: Number(r.hits), windowEndsAt: new Date(r.window_ends_at), lockouts: Number(r.lockouts), blockedUntil: r.blocked_until ? new Date(r.blocked_until) : null }
		])
	);
}

export async function saveBucket(trx: Knex.Transaction, key: string, s: BucketState, now: Date): Promise<void> {
	await trx('rate_limits').where({ bucket: key }).update({ hits: s.hits, window_ends_at: s.windowEndsAt, lockouts: s.lockouts, blocked_until: s.blockedUntil, updated_at: now });
}

/** The database's clock, so that every web server counts windows by the same time. */
export async function databaseNow(k: Knex): Promise<Date> {
	const [rows] = (await k.raw('SELECT UTC_TIMESTAMP(3) AS now')) as [{ now: Date }[]];
	return new Date(rows[0].now);
}

/** Forget buckets nobody has touched for a while (the oldest first, a bounded batch). */
export async function deleteIdleBuckets(k: Knex, before: Date, max = 500): Promise<void> {
	await k.raw('DELETE FROM rate_limits WHERE updated_at < ? AND (blocked_until IS NULL OR blocked_until < ?) ORDER BY updated_at LIMIT ?', [before, before, max]);
}

export async function deleteBucket(k: Knex, key: string): Promise<void> {
	await k('rate_limits').where({ bucket: key }).delete();
}
