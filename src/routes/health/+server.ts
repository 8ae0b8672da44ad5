import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

// Liveness for the start script and tests: the app answers and reaches the database.
export const GET: RequestHandler = async () => {
	await db().raw('SELECT 1');
	return json({ ok: true });
};
