// A file of a scripted upload on its way to storage: counted against the upload limit, hashed
// (SHA-256) and its first bytes kept as it streams, and its WAV header checked as soon as those
// bytes are in — so a file that is too large or is not a WAV is refused mid-stream, and the
// header check at the end reads storage only for chunks that lie beyond the first bytes.
import { createHash } from 'node:crypto';
import { pipeline, Transform } from 'node:stream';
import { Problem } from '../problem';
import type { Storage } from '../storage';
import type { FilePart } from './multipart';
import { HEADER_PROBE_BYTES, readWavHeader, WavHeaderError, type RangeSource, type WavHeader } from './wav-header';

const WAV_TYPE = 'audio/wav';

export interface StagedFile {
	key: string;
	sizeBytes: number;
	sha256: string;
	/** The first HEADER_PROBE_BYTES of the file (all of it when shorter). */
	head: Uint8Array;
}

export interface StagingLimits {
	maxBytes: number;
	maxDurationS: number;
}

const what = (part: Pick<FilePart, 'name'>) => (part.name === 'file' ? 'The file' : 'The reference file');

function channelProblem(header: WavHeader, channel: number): Problem | null {
	if (channel < header.channels) return null;
	return new Problem(422, `Channel ${channel} was chosen but the file has ${header.channels} channel${header.channels === 1 ? '' : 's'} (0–${header.channels - 1}).`, {
		field: 'channel'
	});
}

/** Thrown by the early source for a read beyond the bytes in: the check cannot decide yet. */
const UNDECIDED = Symbol('undecided');

/**
 * Check the header from the first bytes alone, before the file's length is known. The source
 * says the file is endless, so every check that compares with the length passes here and is
 * made again at the end (a file longer than the limit is refused by the count, with a 413); a
 * refusal here is one the final check would make too.
 */
async function refuseBadHead(part: FilePart, head: Uint8Array, limits: StagingLimits): Promise<void> {
	const source: RangeSource = {
		size: Number.MAX_SAFE_INTEGER,
		read: async (offset, length) => {
			if (offset + length > head.length) throw UNDECIDED;
			return head.subarray(offset, offset + length);
		}
	};
	let header: WavHeader;
	try {
		header = await readWavHeader(source, { maxDurationS: limits.maxDurationS });
	} catch (e) {
		if (e === UNDECIDED) return;
		if (e instanceof WavHeaderError) throw new Problem(422, part.name === 'file' ? e.message : `The reference file: ${e.message}`, { field: part.name });
		throw e;
	}
	const wrongChannel = part.channel === undefined ? null : channelProblem(header, part.channel);
	if (wrongChannel) throw wrongChannel;
}

/**
 * Stream a file part to `key`. Resolves when the object is stored; rejects with a 413 problem
 * as soon as the count passes `maxBytes`, with a 422 when the first bytes are no readable WAV
 * header — in either case the stream is ended and nothing is stored under `key`.
 */
export async function stageFile(s: Storage, key: string, part: FilePart, limits: StagingLimits): Promise<StagedFile> {
	const hash = createHash('sha256');
	const head = new Uint8Array(Math.min(HEADER_PROBE_BYTES, limits.maxBytes));
	let headLength = 0;
	let size = 0;
	const meter = new Transform({
		transform(chunk: Buffer, _encoding, done) {
			size += chunk.byteLength;
			if (size > limits.maxBytes) {
				return done(new Problem(413, `${what(part)} is larger than the ${Math.round(limits.maxBytes / 1024 / 1024)} MB limit.`, { code: 'too_large', field: part.name }));
			}
			hash.update(chunk);
			if (headLength < head.length) {
				const take = Math.min(chunk.byteLength, head.length - headLength);
				head.set(chunk.subarray(0, take), headLength);
				headLength += take;
				if (headLength === head.length) {
					refuseBadHead(part, head, limits).then(() => done(null, chunk), done);
					return;
				}
			}
			done(null, chunk);
		}
	});
	// Either end failing ends the other: a refusal here stops the part, a cut-off part the upload.
	pipeline(part.stream, meter, () => {});
	try {
		await s.upload(key, meter, WAV_TYPE);
	} catch (e) {
		if (e instanceof Problem || (e as { $metadata?: unknown })?.$metadata) throw e; // a refusal, or the store's own answer
		// The part itself broke off (the form was cut short or refused elsewhere).
		throw new Problem(400, 'The upload ended before the form was complete.', { code: 'incomplete' });
	}
	return { key, sizeBytes: size, sha256: hash.digest('hex'), head: head.subarray(0, headLength) };
}

/**
 * The full header check of a stored file, as the browser's confirm makes it: from the bytes
 * kept while it streamed, reading the object only for chunks that lie beyond them.
 */
export async function checkStagedHeader(s: Storage, staged: StagedFile, part: Pick<FilePart, 'name'>, channel: number | null, maxDurationS: number): Promise<WavHeader> {
	const { head, key } = staged;
	const source: RangeSource = {
		size: staged.sizeBytes,
		read: (offset, length) => (offset + length <= head.length ? Promise.resolve(head.subarray(offset, offset + length)) : s.getBytes(key, { start: offset, end: offset + length - 1 }))
	};
	let header: WavHeader;
	try {
		header = await readWavHeader(source, { maxDurationS });
	} catch (e) {
		if (e instanceof WavHeaderError) throw new Problem(422, part.name === 'file' ? e.message : `The reference file: ${e.message}`, { field: part.name });
		throw e;
	}
	const wrongChannel = channel === null ? null : channelProblem(header, channel);
	if (wrongChannel) throw wrongChannel;
	return header;
}
