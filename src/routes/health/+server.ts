import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { storage } from '$lib/server/storage';
import type { RequestHandler } from './$types';

/** A dependency that takes longer than this to answer counts as down. */
const CHECK_TIMEOUT_MS = 2_000;

type State = 'up' | 'down';

async function state(check: () => Promise<unknown>): Promise<State> {
	let timer: ReturnType<typeof setTimeout> | undefined;
	const timeout = new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error('timed out')), CHECK_TIMEOUT_MS)));
	try {
		await Promise.race([check(), timeout]);
		return 'up';
	} catch {
		return 'down';
	} finally {
		clearTimeout(timer);
	}
}

// For the start script, tests and monitoring: the state of each dependency, 200 only when all
// are up. No reasons: this address is public.
export const GET: RequestHandler = async () => {
	const [database, objectStorage] = await Promise.all([state(() => db().raw('SELECT 1')), state(() => storage().ping())]);
	const ok = database === 'up' && objectStorage === 'up';
	return json({ ok, database, storage: objectStorage }, { status: ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
