import { json } from '@sveltejs/kit';
import { dependencyStates } from '$lib/server/health';
import type { RequestHandler } from './$types';

// For the start script, tests and monitoring: the state of each dependency, 200 only when all
// are up. No reasons: this address is public.
export const GET: RequestHandler = async () => {
	const { database, storage } = await dependencyStates();
	const ok = database === 'up' && storage === 'up';
	return json({ ok, database, storage }, { status: ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
