// The state of each dependency, for /health: up when it answers within the time allowed.
import { db } from './db';
import { storage } from './storage';

/** A dependency that takes longer than this to answer counts as down. */
const CHECK_TIMEOUT_MS = 2_000;

export type DependencyState = 'up' | 'down';

async function state(check: () => Promise<unknown>): Promise<DependencyState> {
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

export async function dependencyStates(): Promise<{ database: DependencyState; storage: DependencyState }> {
	const [database, objectStorage] = await Promise.all([state(() => db().raw('SELECT 1')), state(() => storage().ping())]);
	return { database, storage: objectStorage };
}
