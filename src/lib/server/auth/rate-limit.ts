import type { Knex } from 'knex';

// Failed sign-ins are limited per account and address, with a looser cap per address alone
// so one machine cannot walk through many accounts. (Limits: common practice, no source.)
export const SIGN_IN_LIMITS = {
	windowMinutes: 15,
	perAccountAndAddress: 10,
	perAddress: 100
} as const;

export interface RateVerdict {
	blocked: boolean;
	retryAfterMinutes: number;
}

export async function signInVerdict(k: Knex, email: string, ip: string, now = new Date()): Promise<RateVerdict> {
	const since = new Date(now.getTime() - SIGN_IN_LIMITS.windowMinutes * 60_000);
	const failures = (q: Knex.QueryBuilder) =>
		q.where('succeeded', false).where('created_at', '>=', since).count({ n: '*' }).min({ first: 'created_at' }).first() as Promise<{ n: number | string; first: Date | string | null } | undefined>;
	const [pair, address] = await Promise.all([
		failures(k('login_attempts').where({ email, ip })),
		failures(k('login_attempts').where({ ip }))
	]);
	const over =
		Number(pair?.n ?? 0) >= SIGN_IN_LIMITS.perAccountAndAddress
			? pair
			: Number(address?.n ?? 0) >= SIGN_IN_LIMITS.perAddress
				? address
				: null;
	if (!over) return { blocked: false, retryAfterMinutes: 0 };
	const first = new Date(over.first as string | Date);
	const freeAt = first.getTime() + SIGN_IN_LIMITS.windowMinutes * 60_000;
	return { blocked: true, retryAfterMinutes: Math.max(1, Math.ceil((freeAt - now.getTime()) / 60_000)) };
}

export async function recordSignIn(k: Knex, email: string, ip: string, succeeded: boolean): Promise<void> {
	await k('login_attempts').insert({ email, ip, succeeded });
}
