import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer, parseJsonBody } from '$lib/server/api';
import { announceReference, changeReference, referenceChoices } from '$lib/server/captures/service';
import { toView } from '$lib/server/captures/views';
import { config } from '$lib/server/config';
import { changeReferenceSchema, referenceUploadSchema } from '$lib/schemas/capture-reference';
import type { RequestHandler } from './$types';

/** What the recorded sweep was played with, and the test signals it may be changed to. */
export const GET: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'project:internal', { captureId });
		return json(await referenceChoices(scope, captureId));
	});

/** Announce another reference file: a presigned PUT under a new key; nothing changes yet. */
export const POST: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		const input = await parseJsonBody(request, referenceUploadSchema(config().UPLOAD_MAX_BYTES));
		return json(await announceReference(scope, captureId, input), { status: 201 });
	});

/** Change the played sweep (a test signal, or the reference file uploaded) and analyse again. */
export const PUT: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const captureId = Number(params.captureId);
		const scope = await authorize(locals, 'capture:write', { captureId });
		const capture = await changeReference(scope, captureId, await parseJsonBody(request, changeReferenceSchema));
		return json({ capture: toView(capture) }, { status: 202 });
	});
