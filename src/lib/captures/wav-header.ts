// A quick look at a WAV file's header — enough to refuse a bad upload at once, before any job
// runs. The RIFF chunk list is walked with ranged reads (from the object store, a file or bytes
// in memory), so chunks of any size before `fmt ` and `data` (a long LIST of tags, a JUNK pad)
// cost one small read each. The full decode (and every sample check) happens in the analysis job.
// Pure: the browser reads a picked file's header with it too (a File is a RangeSource).

export interface WavHeader {
	format: 'pcm' | 'float';
	channels: number;
	sampleRate: number;
	bitsPerSample: number;
	frames: number;
	durationS: number;
	/** Byte offset of the data chunk's samples, and their length. */
	dataOffset: number;
	dataBytes: number;
}

/** The reader's one refusal: a message for people, on one line. */
export class WavHeaderError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'WavHeaderError';
	}
}

/** Where the bytes come from: the file's size and a read of `length` bytes at `offset`. */
export interface RangeSource {
	size: number;
	read(offset: number, length: number): Promise<Uint8Array>;
}

/** The first read: enough for the header of almost every file in one request. */
export const HEADER_PROBE_BYTES = 65_536;
/** Chunks walked before giving up: a real recorder writes a handful. */
export const MAX_CHUNKS = 64;
/** A format chunk is 16, 18 or 40 bytes; anything near this is not a format chunk. */
const MAX_FMT_BYTES = 1024;
/** What is read of a chunk that lies beyond the first window: its header and a format chunk. */
const CHUNK_READ_BYTES = 8 + 40;

const WAVE_FORMAT_PCM = 1;
const WAVE_FORMAT_IEEE_FLOAT = 3;
const WAVE_FORMAT_EXTENSIBLE = 0xfffe;

const text = (b: Uint8Array, at: number) => String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);
/** A chunk id for a message: printable ASCII, or its bytes in hex. */
const printableId = (id: string) => (/^[\x20-\x7e]{4}$/.test(id) ? `"${id}"` : `0x${[...id].map((c) => c.charCodeAt(0).toString(16).padStart(2, '0')).join('')}`);

/** A source over bytes already in memory. */
export function bytesSource(bytes: Uint8Array, size = bytes.length): RangeSource {
	return { size, read: async (offset, length) => bytes.subarray(offset, Math.min(bytes.length, offset + length)) };
}

/** A window of the file: `bytes` start at `offset`. */
interface Window {
	offset: number;
	bytes: Uint8Array;
}

async function windowAt(source: RangeSource, cache: Window, offset: number, length: number): Promise<Window> {
	if (offset >= cache.offset && offset + length <= cache.offset + cache.bytes.length) return cache;
	const bytes = await source.read(offset, Math.min(length, source.size - offset));
	return { offset, bytes };
}

/**
 * Read the RIFF/WAVE header of a file through ranged reads. Walks the chunk list (at most
 * MAX_CHUNKS) until both the format chunk and the data chunk are found, in either order.
 * Throws WavHeaderError with a one-line message for people.
 */
export async function readWavHeader(source: RangeSource, limits: { maxDurationS: number }): Promise<WavHeader> {
	const fileSize = source.size;
	if (fileSize < 12) throw new WavHeaderError('This is not a WAV file (no RIFF/WAVE header).');
	let window: Window = { offset: 0, bytes: await source.read(0, Math.min(fileSize, HEADER_PROBE_BYTES)) };
	const first = window.bytes;
	if (first.length < 12 || text(first, 0) !== 'RIFF' || text(first, 8) !== 'WAVE') {
		throw new WavHeaderError('This is not a WAV file (no RIFF/WAVE header).');
	}
	let fmt: Omit<WavHeader, 'frames' | 'durationS' | 'dataOffset' | 'dataBytes'> | null = null;
	let blockAlign = 0;
	let data: { offset: number; size: number } | null = null;
	let at = 12;
	for (let walked = 0; !(fmt && data); walked++) {
		if (at + 8 > fileSize) {
			throw new WavHeaderError(fmt ? 'The WAV header is truncated (no data chunk found).' : 'The WAV header is truncated (no format chunk found).');
		}
		if (walked >= MAX_CHUNKS) throw new WavHeaderError(`The WAV file has more than ${MAX_CHUNKS} chunks before its format and data: it is not a recording this portal reads.`);
		window = await windowAt(source, window, at, CHUNK_READ_BYTES);
		const b = window.bytes;
		const local = at - window.offset;
		if (local + 8 > b.length) throw new WavHeaderError('The WAV file could not be read (short read from storage).');
		const view = new DataView(b.buffer, b.byteOffset, b.byteLength);
		const id = text(b, local);
		const size = view.getUint32(local + 4, true);
		const body = at + 8;
		if (id === 'fmt ') {
			if (fmt) throw new WavHeaderError('The WAV file has two format chunks.');
			if (size < 16) throw new WavHeaderError(`The WAV format chunk is invalid (${size} bytes; at least 16 are needed).`);
			if (size > MAX_FMT_BYTES) throw new WavHeaderError(`The WAV format chunk is invalid (${size} bytes).`);
			if (body + size > fileSize) throw new WavHeaderError('The WAV header is truncated (format chunk cut short).');
			window = await windowAt(source, window, body, Math.min(size, 40));
			const f = new DataView(window.bytes.buffer, window.bytes.byteOffset, window.bytes.byteLength);
			const o = body - window.offset;
			if (o + 16 > window.bytes.length) throw new WavHeaderError('The WAV file could not be read (short read from storage).');
			let tag = f.getUint16(o, true);
			const channels = f.getUint16(o + 2, true);
			const sampleRate = f.getUint32(o + 4, true);
			blockAlign = f.getUint16(o + 12, true);
			const bitsPerSample = f.getUint16(o + 14, true);
			if (tag === WAVE_FORMAT_EXTENSIBLE) {
				if (size < 40) throw new WavHeaderError('The WAV header is truncated (extensible format chunk cut short).');
				if (o + 26 > window.bytes.length) throw new WavHeaderError('The WAV file could not be read (short read from storage).');
				tag = f.getUint16(o + 24, true); // first two bytes of the sub-format GUID
			}
			if (tag !== WAVE_FORMAT_PCM && tag !== WAVE_FORMAT_IEEE_FLOAT) {
				throw new WavHeaderError(`Unsupported WAV encoding (format tag ${tag}): use PCM or IEEE float.`);
			}
			if (channels === 0 || bitsPerSample === 0 || blockAlign === 0 || sampleRate === 0) {
				throw new WavHeaderError('The WAV format chunk is invalid (zero channels, sample size, block size or sample rate).');
			}
			if (blockAlign !== channels * Math.ceil(bitsPerSample / 8)) {
				throw new WavHeaderError(`The WAV format chunk is invalid (block size ${blockAlign} for ${channels} channel${channels === 1 ? '' : 's'} of ${bitsPerSample} bits).`);
			}
			fmt = { format: tag === WAVE_FORMAT_PCM ? 'pcm' : 'float', channels, sampleRate, bitsPerSample };
		} else if (id === 'data') {
			if (data) throw new WavHeaderError('The WAV file has two data chunks.');
			if (body + size > fileSize) throw new WavHeaderError('The WAV file is truncated: its data chunk is longer than the file.');
			data = { offset: body, size };
		} else if (body + size > fileSize) {
			throw new WavHeaderError(`The WAV file is truncated: its ${printableId(id)} chunk is longer than the file.`);
		}
		at = body + size + (size % 2); // chunks are padded to an even length
	}
	const frames = Math.floor(data.size / blockAlign);
	if (frames === 0) throw new WavHeaderError('The WAV file holds no samples.');
	const durationS = frames / fmt.sampleRate;
	if (durationS > limits.maxDurationS) {
		throw new WavHeaderError(`The recording is ${durationS.toFixed(1)} s long; the limit is ${limits.maxDurationS} s.`);
	}
	return { ...fmt, frames, durationS, dataOffset: data.offset, dataBytes: data.size };
}
