import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { Problem } from '$lib/server/problem';
import { uploadThroughServer } from '$lib/server/captures/service';
import { toView } from '$lib/server/captures/views';
import { fieldErrors } from '$lib/server/forms';
import { config } from '$lib/server/config';
import { createCaptureSchema } from '$lib/schemas/captures';
import { createHash } from 'node:crypto';
import type { RequestHandler } from './$types';

/**
 * Upload through the server, for scripted clients: multipart/form-data with the file in `file`
 * (and optionally `reference`), and the same metadata fields as the JSON route (numbers as text).
 * The SHA-256 is computed here when not given.
 */
export const POST: RequestHandler = async ({ locals, params, request }) =>
	answer(async () => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'capture:write', { sessionId });
		const declared = Number(request.headers.get('content-length') ?? 0);
		if (declared > config().UPLOAD_MAX_BYTES * 2 + 1_000_000) throw new Problem(413, 'The upload is larger than the limit.');
		let form: FormData;
		try {
			form = await request.formData();
		} catch {
			throw new Problem(400, 'Send the file as multipart/form-data.');
		}
		const file = form.get('file');
		if (!(file instanceof File)) throw new Problem(422, 'Attach the WAV file in the "file" field.', { details: { errors: { file: 'Missing.' } } });
		const reference = form.get('reference');
		const num = (name: string) => (form.get(name) === null || form.get(name) === '' ? undefined : Number(form.get(name)));
		const text = (name: string) => (form.get(name) === null || form.get(name) === '' ? undefined : String(form.get(name)));
		const sha256 = text('sha256') ?? createHash('sha256').update(new Uint8Array(await file.arrayBuffer())).digest('hex');
		const parsed = createCaptureSchema(config().UPLOAD_MAX_BYTES).safeParse({
			filename: text('filename') ?? file.name,
			sizeBytes: file.size,
			sha256,
			kind: text('kind'),
			positionId: num('positionId'),
			newPositionLabel: text('newPositionLabel'),
			channel: num('channel') ?? 0,
			sweepDefinitionId: num('sweepDefinitionId'),
			reference: reference instanceof File ? { filename: reference.name, sizeBytes: reference.size } : undefined
		});
		if (!parsed.success) throw new Problem(422, 'Some fields are not valid.', { details: { errors: fieldErrors(parsed.error) } });
		const capture = await uploadThroughServer(scope, sessionId, parsed.data, file, reference instanceof File ? reference : null);
		return json({ capture: toView(capture) }, { status: 201 });
	});
