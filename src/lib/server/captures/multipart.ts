// The multipart form of a server-side upload (for scripts): the file in `file`, optionally the
// played sweep in `reference`, and the same metadata as the JSON route with numbers as text.
import { createHash } from 'node:crypto';
import { parseJson } from '../api';
import { config } from '../config';
import { Problem } from '../problem';
import { createCaptureSchema, type CreateCaptureInput } from '../../schemas/captures';

export interface CaptureUpload {
	input: CreateCaptureInput;
	file: File;
	reference: File | null;
}

/** Read and check the upload; the SHA-256 is computed here when not given. */
export async function parseCaptureUpload(request: Request): Promise<CaptureUpload> {
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
	const referenceField = form.get('reference');
	const reference = referenceField instanceof File ? referenceField : null;
	const given = (name: string) => {
		const v = form.get(name);
		return v === null || v === '' ? undefined : String(v);
	};
	const number = (name: string) => (given(name) === undefined ? undefined : Number(given(name)));
	const input = parseJson(createCaptureSchema(config().UPLOAD_MAX_BYTES), {
		filename: given('filename') ?? file.name,
		sizeBytes: file.size,
		sha256: given('sha256') ?? createHash('sha256').update(new Uint8Array(await file.arrayBuffer())).digest('hex'),
		kind: given('kind'),
		positionId: number('positionId'),
		newPositionLabel: given('newPositionLabel'),
		channel: number('channel') ?? 0,
		sweepDefinitionId: number('sweepDefinitionId'),
		reference: reference ? { filename: reference.name, sizeBytes: reference.size } : undefined
	});
	return { input, file, reference };
}
