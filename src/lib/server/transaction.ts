import type { Knex } from 'knex';
import { db } from './db';

const RETRYABLE = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);

/** Run `work` in one transaction, retrying a few times when MariaDB reports a deadlock. */
export async function transaction<T>(work: (trx: Knex.Transaction) => Promise<T>, k: Knex = db(), attempts = 3): Promise<T> {
	// Inside a transaction already: a savepoint, never retried — a deadlock has rolled back the
	// whole outer transaction, which is the outer helper's to run again.
	if (k.isTransaction) return k.transaction(work);
	for (let attempt = 1; ; attempt++) {
		try {
			return await k.transaction(work);
		} catch (e) {
			const code = (e as { code?: string }).code;
			if (attempt >= attempts || !code || !RETRYABLE.has(code)) throw e;
			await new Promise((r) => setTimeout(r, 20 * attempt + Math.random() * 30));
		}
	}
}
