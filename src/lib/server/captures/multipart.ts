// The multipart form of a server-side upload (for scripts): the file in `file`, optionally the
// played sweep in `reference`, and the same metadata as the JSON route with numbers as text.
// The body is parsed as it arrives (busboy): each file part is handed on as a stream, so a
// recording is never held whole in memory. Fields are small and kept in any order; sent before
// the file, they are checked before the file is read, so a bad one is refused at once.
import busboy from 'busboy';
import { once } from 'node:events';
import type { Readable } from 'node:stream';
import { z } from 'zod';
import { parseJson } from '../api';
import { BodyTooLargeError, discardRequestBody, discardRest, uploadBodyBytes } from '../body-limit';
import { config } from '../config';
import { fieldErrors } from '../forms';
import { Problem } from '../problem';
import { createCaptureSchema, MIN_WAV_BYTES, type CreateCaptureInput } from '../../schemas/captures';

/** The parts that may hold files. */
const FILE_PARTS = ['file', 'reference'] as const;
type FilePartName = (typeof FILE_PARTS)[number];
/** The longest field the form has is a file name (255); anything far longer is not ours. */
const MAX_FIELD_BYTES = 4096;
const MAX_FIELDS = 32;

/** A file part as it starts to arrive: its stream must be read to the end (or destroyed). */
export interface FilePart {
	name: FilePartName;
	filename: string;
	stream: Readable;
	/** The channel, when its field came before the file (for an early header check). */
	channel: number | undefined;
}

/** What the one who stores a file part reports when the part has ended. */
export interface StoredPart {
	sizeBytes: number;
	sha256: string;
}

export interface CaptureUpload<T extends StoredPart> {
	input: CreateCaptureInput;
	file: T;
	reference: T | null;
}

const notMultipart = () => new Problem(400, 'Send the file as multipart/form-data (the WAV file in the "file" part).', { code: 'not_multipart' });

/** A failure of the request body itself (too long, or cut off) as a refusal. */
function bodyProblem(e: unknown): Problem {
	if (e instanceof Problem) return e;
	// Ours (a chunked body counted in the hooks), or the adapter's BODY_SIZE_LIMIT, set to the same.
	if (e instanceof BodyTooLargeError) return new Problem(413, e.message, { code: 'too_large' });
	if ((e as { status?: number })?.status === 413) return new Problem(413, new BodyTooLargeError(uploadBodyBytes(config())).message, { code: 'too_large' });
	return new Problem(400, 'The upload ended before the form was complete.', { code: 'incomplete' });
}

/**
 * Parse a multipart body as it arrives. Each file part goes to `store` at once, as a stream;
 * fields are collected. On the first refusal (of a part, of the body, or of `store`) parsing
 * stops, every part still being stored is ended with an error and waited for, `onRefusal` removes
 * what was stored, then the rest of the body is read and dropped (bounded, so the client gets
 * the answer), and the refusal is thrown.
 */
async function readMultipart<T>(
	request: Request,
	store: (part: { name: FilePartName; filename: string; stream: Readable; fields: ReadonlyMap<string, string>; arrived: ReadonlySet<string> }) => Promise<T>,
	onRefusal: () => Promise<void>
): Promise<{ fields: Map<string, string>; files: Map<FilePartName, T> }> {
	const contentType = request.headers.get('content-type') ?? '';
	if (!request.body || !/^multipart\/form-data\s*;/i.test(contentType)) {
		discardRequestBody(request);
		throw notMultipart();
	}
	let parser: busboy.Busboy;
	try {
		parser = busboy({
			headers: { 'content-type': contentType },
			defParamCharset: 'utf8', // file names as browsers and fetch send them
			limits: { fieldSize: MAX_FIELD_BYTES, fields: MAX_FIELDS, files: FILE_PARTS.length, parts: MAX_FIELDS + FILE_PARTS.length }
		});
	} catch {
		discardRequestBody(request);
		throw notMultipart(); // no boundary
	}

	const fields = new Map<string, string>();
	const arrived = new Set<string>();
	const stores = new Map<FilePartName, Promise<T>>();
	let failure: Problem | null = null;
	let wake: (() => void) | null = null;
	const fail = (e: unknown) => {
		if (failure) return;
		failure = e instanceof Problem ? e : new Problem(400, `The form could not be read: ${(e as Error)?.message ?? e}.`, { code: 'bad_form' });
		wake?.();
	};
	// What `work` gives, or 'stopped' as soon as there is a refusal. Only the wait in progress
	// is woken: racing every read against one long-lived promise would keep each chunk read
	// alive through that promise's reactions, so the whole body would stay in memory.
	const untilStopped = <V>(work: Promise<V>): Promise<V | 'stopped'> =>
		failure
			? Promise.resolve('stopped')
			: new Promise<V | 'stopped'>((ok, no) => {
					wake = () => ok('stopped');
					work.then(ok, no);
				}).finally(() => (wake = null));

	parser.on('field', (name, value, info) => {
		if (info.nameTruncated || info.valueTruncated) return fail(new Problem(400, `The "${name.slice(0, 40)}" field is longer than ${MAX_FIELD_BYTES} bytes.`, { field: name }));
		if ((FILE_PARTS as readonly string[]).includes(name) && value !== '') arrived.add(`${name}:text`);
		if (!fields.has(name)) fields.set(name, value); // the first of a repeated field counts
		arrived.add(name);
	});
	parser.on('file', (name, stream, info) => {
		// A part ended early (the parser destroyed on a refusal) errors; whoever reads it hears
		// that through its own pipeline, and an unheard 'error' event would end the process.
		stream.on('error', () => {});
		const part = FILE_PARTS.find((p) => p === name);
		if (!part) {
			stream.resume();
			return fail(new Problem(422, `Only "file" and "reference" take files; "${name.slice(0, 40)}" does not.`, { field: name }));
		}
		if (stores.has(part)) {
			stream.resume();
			return fail(new Problem(422, `Send one file in "${part}".`, { field: part }));
		}
		const stored = store({ name: part, filename: info.filename ?? '', stream, fields: new Map(fields), arrived: new Set(arrived) });
		stored.catch(fail);
		stores.set(part, stored);
		arrived.add(part);
	});
	parser.on('filesLimit', () => fail(new Problem(400, 'The form has more files than "file" and "reference".')));
	parser.on('fieldsLimit', () => fail(new Problem(400, `The form has more than ${MAX_FIELDS} fields.`)));
	parser.on('partsLimit', () => fail(new Problem(400, `The form has more than ${MAX_FIELDS + FILE_PARTS.length} parts.`)));
	parser.on('error', (e) => fail(new Problem(400, `The multipart form is malformed (${(e as Error).message}).`, { code: 'bad_form' })));
	// An 'error' is reported through fail(); these promises must not reject unheard.
	const parsed = once(parser, 'close').catch(() => {});
	const drained = () => once(parser, 'drain').catch(() => {});

	// Feed the parser by hand rather than piping, so that on a refusal the rest of the body can
	// be drained instead of cancelled (cancelling resets the connection before the answer).
	const reader = request.body.getReader();
	let bodyDone = false;
	try {
		while (!failure) {
			const next = await untilStopped(reader.read());
			if (next === 'stopped') break;
			if (next.done) {
				bodyDone = true;
				parser.end();
				break;
			}
			if (!parser.write(next.value)) await untilStopped(drained());
		}
		if (!failure) await untilStopped(parsed);
	} catch (e) {
		bodyDone = true; // the body itself failed: nothing left to drain
		fail(bodyProblem(e));
	}
	if (failure) parser.destroy(); // ends a file part still arriving with an error
	// Nothing is left running when this returns: a stored part is complete or dropped. The rest
	// of a refused body is drained only once what was stored is removed, just before the answer:
	// until then back-pressure holds the client to what the sockets take.
	const settled = await Promise.allSettled(stores.values());
	if (failure) {
		await onRefusal().catch(() => {});
		if (!bodyDone) discardRest(reader);
		throw failure;
	}
	const files = new Map<FilePartName, T>();
	for (const [i, name] of [...stores.keys()].entries()) {
		const r = settled[i];
		if (r.status === 'rejected') throw r.reason; // not reached: a rejection fails the parse
		files.set(name, r.value);
	}
	return { fields, files };
}

/** The metadata of the form as the JSON route takes it; sizes and checksum from the stored parts. */
function announcement(fields: ReadonlyMap<string, string>, file: { filename: string; sizeBytes: number; sha256: string }, reference: { filename: string; sizeBytes: number } | null) {
	const given = (name: string) => {
		const v = fields.get(name);
		return v === undefined || v === '' ? undefined : v;
	};
	const number = (name: string) => (given(name) === undefined ? undefined : Number(given(name)));
	return {
		filename: given('filename') ?? file.filename,
		sizeBytes: file.sizeBytes,
		sha256: given('sha256') ?? file.sha256,
		kind: given('kind'),
		positionId: number('positionId'),
		newPositionLabel: given('newPositionLabel'),
		channel: number('channel') ?? 0,
		sweepDefinitionId: number('sweepDefinitionId'),
		reference: reference ? { filename: reference.filename, sizeBytes: reference.sizeBytes } : undefined
	};
}

const STAND_IN_SHA256 = '0'.repeat(64);

/**
 * Refuse, as a file part starts, what the fields sent so far already get wrong. Only refusals
 * about what has arrived count (a field sent, a part begun), so nothing still to come could
 * have made the form right; everything else is checked once the body has ended.
 */
function refuseEarly(fields: ReadonlyMap<string, string>, arrived: ReadonlySet<string>, references: number): void {
	if (arrived.has('file:text')) throw new Problem(422, 'Attach the WAV file in the "file" field.', { details: { errors: { file: 'Missing.' } } });
	const raw = announcement(
		fields,
		{ filename: 'stand-in.wav', sizeBytes: MIN_WAV_BYTES, sha256: STAND_IN_SHA256 },
		references > 0 ? { filename: 'stand-in.wav', sizeBytes: MIN_WAV_BYTES } : null
	);
	const parsed = createCaptureSchema(config().UPLOAD_MAX_BYTES).safeParse(raw);
	if (parsed.success) return;
	const known = parsed.error.issues.filter((i) => {
		const name = String(i.path[0] ?? '');
		return name === 'reference' ? references > 0 : arrived.has(name) && fields.get(name) !== '';
	});
	if (known.length) throw new Problem(422, 'Some fields are not valid.', { code: 'invalid', details: { errors: fieldErrors(new z.ZodError(known)) } });
}

/**
 * Read a scripted upload: each file part is handed to `store` as it starts (which streams it
 * to storage and reports its size and SHA-256), the fields are checked, and the announcement is
 * built from both. Throws a Problem: 400 for a body that is not a readable form, 413 when a
 * file or the body passes its limit, 422 for missing or wrong fields.
 */
export async function readCaptureUpload<T extends StoredPart>(
	request: Request,
	store: (part: FilePart) => Promise<T>,
	onRefusal: () => Promise<void>
): Promise<CaptureUpload<T>> {
	const names = new Map<FilePartName, string>();
	const { fields, files } = await readMultipart(request, async ({ name, filename, stream, fields, arrived }) => {
		try {
			refuseEarly(fields, arrived, name === 'reference' || arrived.has('reference') ? 1 : 0);
		} catch (e) {
			stream.resume();
			throw e;
		}
		names.set(name, filename);
		const channel = arrived.has('channel') && fields.get('channel') !== '' ? Number(fields.get('channel')) : undefined;
		return store({ name, filename, stream, channel: Number.isInteger(channel) ? channel : undefined });
	}, onRefusal);
	const file = files.get('file');
	if (!file) throw new Problem(422, 'Attach the WAV file in the "file" field.', { details: { errors: { file: 'Missing.' } } });
	const reference = files.get('reference') ?? null;
	const raw = announcement(
		fields,
		{ filename: names.get('file')!, sizeBytes: file.sizeBytes, sha256: file.sha256 },
		reference ? { filename: names.get('reference')!, sizeBytes: reference.sizeBytes } : null
	);
	const input = parseJson(createCaptureSchema(config().UPLOAD_MAX_BYTES), raw);
	if (input.sha256 !== file.sha256) {
		throw new Problem(422, `The file's SHA-256 is ${file.sha256}, not the ${input.sha256} that was sent: it changed on the way, or the checksum is of another file.`, {
			field: 'sha256'
		});
	}
	return { input, file, reference };
}
