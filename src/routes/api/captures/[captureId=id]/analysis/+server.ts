import { error, json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** The whole stored result of a capture: metrics, warnings and chart curves. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const captureId = Number(params.captureId);
	await authorize(locals, 'project:internal', { captureId });
	const row = await db()('analyses').where({ capture_id: captureId }).first();
	if (!row) error(404, 'This capture has no analysis yet.');
	const parse = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);
	return json({ engineVersion: row.engine_version, metrics: parse(row.metrics), warnings: parse(row.warnings), curves: parse(row.curves) });
};
