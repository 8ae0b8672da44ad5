import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { captureMetrics } from '$lib/server/captures/read';
import { download, exportFormat } from '$lib/server/exports';
import { captureBandsCsv, captureBandsJson } from '$lib/results/exports';
import type { RequestHandler } from './$types';

/** Per-band metrics of one capture, as CSV or JSON (the JSON with the capture's note; a band table has no place for it). */
export const GET: RequestHandler = async ({ locals, params, url }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		await authorize(locals, 'project:internal', { captureId });
		const format = exportFormat(url);
		const { filename, note, metrics } = await captureMetrics(captureId);
		return download(format, `${filename.replace(/\.wav$/i, '')}-bands`, () => captureBandsCsv(metrics), () => captureBandsJson(metrics, note));
	});
