import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer, parseJsonBody } from '$lib/server/api';
import { Problem } from '$lib/server/problem';
import { removeCapture } from '$lib/server/captures/service';
import { toView } from '$lib/server/captures/views';
import { analysisSummaries, getCapture } from '$lib/server/queries/captures';
import { recordAudit } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { transaction } from '$lib/server/transaction';
import { updateCaptureSchema } from '$lib/schemas/captures';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
	const captureId = Number(params.captureId);
	await authorize(locals, 'project:internal', { captureId });
	const k = db();
	const capture = (await getCapture(k, captureId))!;
	return json({ capture: toView(capture, (await analysisSummaries(k, [captureId])).get(captureId)) });
};

/** Rename the file label, or move the capture to another (or a new) position of its visit. */
export const PATCH: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		const input = await parseJsonBody(request, updateCaptureSchema);
		const k = db();
		const capture = (await getCapture(k, captureId))!;
		await transaction(async (trx) => {
			const changes: Record<string, unknown> = {};
			if (input.filename) changes.original_filename = input.filename;
			if (input.positionId !== undefined) {
				const p = await trx('positions').where({ id: input.positionId, session_id: capture.sessionId }).first('id');
				if (!p) throw new Problem(422, 'That position belongs to another visit.', { field: 'positionId' });
				changes.position_id = p.id;
			}
			if (input.newPositionLabel) {
				await trx('positions').insert({ session_id: capture.sessionId, label: input.newPositionLabel }).onConflict(['session_id', 'label']).ignore();
				changes.position_id = (await trx('positions').where({ session_id: capture.sessionId, label: input.newPositionLabel }).forUpdate().first('id')).id;
			}
			await trx('captures').where({ id: captureId }).update(changes);
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'capture.updated', entityType: 'capture', entityId: captureId, details: input });
		});
		return json({ capture: toView((await getCapture(k, captureId))!) });
	});

/** Delete the capture: its objects, its analysis, its rows; recorded in the audit log. */
export const DELETE: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		await removeCapture(scope, (await getCapture(db(), captureId))!);
		return new Response(null, { status: 204 });
	});
