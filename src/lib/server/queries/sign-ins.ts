// Sign-in attempts, kept to limit repeated failures.
import type { Knex } from 'knex';

export interface FailedSignIns {
	count: number;
	/** The earliest failure counted, or null without any. */
	first: Date | null;
}

/** Failed sign-ins from an address since a moment, for one account when `email` is given. */
export async function countFailedSignIns(k: Knex, by: { ip: string; email?: string }, since: Date): Promise<FailedSignIns> {
	const q = k('login_attempts').where({ ip: by.ip, succeeded: false }).where('created_at', '>=', since);
	if (by.email !== undefined) q.where({ email: by.email });
	const r = (await q.count({ n: '*' }).min({ first: 'created_at' }).first()) as { n: number | string; first: Date | string | null } | undefined;
	return { count: Number(r?.n ?? 0), first: r?.first ? new Date(r.first) : null };
}

export async function insertSignIn(k: Knex, email: string, ip: string, succeeded: boolean): Promise<void> {
	await k('login_attempts').insert({ email, ip, succeeded });
}
