import { error } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { download, exportFormat } from '$lib/server/exports';
import { getCapture } from '$lib/server/queries/captures';
import { captureBandsCsv, captureBandsJson } from '$lib/results/exports';
import type { RequestHandler } from './$types';

/** Per-band metrics of one capture, as CSV or JSON. */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const captureId = Number(params.captureId);
	await authorize(locals, 'project:internal', { captureId });
	const format = exportFormat(url);
	const row = await db()('analyses').where({ capture_id: captureId }).first('metrics');
	if (!row) error(404, 'This capture has no analysis yet.');
	const metrics = typeof row.metrics === 'string' ? JSON.parse(row.metrics) : row.metrics;
	const capture = (await getCapture(db(), captureId))!;
	return download(format, `${capture.filename.replace(/\.wav$/i, '')}-bands`, () => captureBandsCsv(metrics), () => captureBandsJson(metrics));
};
