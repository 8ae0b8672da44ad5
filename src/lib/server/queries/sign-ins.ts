// Sign-in attempts, kept as a record (the limits themselves are in rate_limits).
import type { Knex } from 'knex';

export async function insertSignIn(k: Knex, email: string, ip: string, succeeded: boolean): Promise<void> {
	await k('login_attempts').insert({ email, ip, succeeded });
}
