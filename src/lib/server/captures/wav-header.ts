// A quick look at a WAV file's header — enough to refuse a bad upload at once, before any job
// runs — from the first bytes of the object and its total size. The full decode (and every
// sample check) happens in the analysis job.

export interface WavHeader {
	format: 'pcm' | 'float';
	channels: number;
	sampleRate: number;
	bitsPerSample: number;
	frames: number;
	durationS: number;
}

export class WavHeaderError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'WavHeaderError';
	}
}

export const HEADER_PROBE_BYTES = 65_536;
const WAVE_FORMAT_PCM = 1;
const WAVE_FORMAT_IEEE_FLOAT = 3;
const WAVE_FORMAT_EXTENSIBLE = 0xfffe;

const text = (b: Uint8Array, at: number) => String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);

/**
 * Read the RIFF/WAVE header from `head` (the file's first bytes) given the file's full size.
 * Throws WavHeaderError with a message for people.
 */
export function inspectWavHeader(head: Uint8Array, fileSize: number, limits: { maxDurationS: number }): WavHeader {
	if (head.length < 12 || text(head, 0) !== 'RIFF' || text(head, 8) !== 'WAVE') {
		throw new WavHeaderError('This is not a WAV file (no RIFF/WAVE header).');
	}
	const view = new DataView(head.buffer, head.byteOffset, head.byteLength);
	let fmt: Omit<WavHeader, 'frames' | 'durationS'> | null = null;
	let blockAlign = 0;
	let at = 12;
	while (at + 8 <= head.length) {
		const id = text(head, at);
		const size = view.getUint32(at + 4, true);
		const body = at + 8;
		if (id === 'fmt ') {
			if (size < 16 || body + 16 > head.length) throw new WavHeaderError('The WAV header is truncated (format chunk cut short).');
			let tag = view.getUint16(body, true);
			const channels = view.getUint16(body + 2, true);
			const sampleRate = view.getUint32(body + 4, true);
			blockAlign = view.getUint16(body + 12, true);
			const bitsPerSample = view.getUint16(body + 14, true);
			if (tag === WAVE_FORMAT_EXTENSIBLE) {
				if (size < 40 || body + 26 > head.length) throw new WavHeaderError('The WAV header is truncated (extensible format chunk cut short).');
				tag = view.getUint16(body + 24, true); // first two bytes of the sub-format GUID
			}
			if (tag !== WAVE_FORMAT_PCM && tag !== WAVE_FORMAT_IEEE_FLOAT) {
				throw new WavHeaderError(`Unsupported WAV encoding (format tag ${tag}): use PCM or IEEE float.`);
			}
			fmt = { format: tag === WAVE_FORMAT_PCM ? 'pcm' : 'float', channels, sampleRate, bitsPerSample };
		} else if (id === 'data') {
			if (!fmt) throw new WavHeaderError('The WAV file has its data before its format chunk.');
			if (body + size > fileSize) {
				throw new WavHeaderError('The WAV file is truncated: its data chunk is longer than the file.');
			}
			if (blockAlign === 0 || fmt.sampleRate === 0) throw new WavHeaderError('The WAV format chunk is invalid (zero block size or sample rate).');
			const frames = Math.floor(size / blockAlign);
			if (frames === 0) throw new WavHeaderError('The WAV file holds no samples.');
			const durationS = frames / fmt.sampleRate;
			if (durationS > limits.maxDurationS) {
				throw new WavHeaderError(`The recording is ${durationS.toFixed(1)} s long; the limit is ${limits.maxDurationS} s.`);
			}
			return { ...fmt, frames, durationS };
		}
		at = body + size + (size % 2); // chunks are padded to an even length
	}
	throw new WavHeaderError(fmt ? 'The WAV header is truncated (no data chunk found).' : 'The WAV header is truncated (no format chunk found).');
}
