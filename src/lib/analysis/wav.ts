import * as wavefileModule from 'wavefile';
import { AnalysisInputError } from './errors';

/** Decoded audio: one channel, scaled to −1..1 full scale. */
export interface DecodedWav {
	samples: Float64Array;
	sampleRate: number;
	channels: number;
	bitDepth: number;
	format: 'pcm' | 'float';
	durationS: number;
	warnings: string[];
	clipping: ClippingSummary;
}

export interface ClippingSummary {
	runs: number;
	samples: number;
}

export interface DecodeWavOptions {
	/** 0-based channel to return. */
	channel?: number;
	maxDurationS?: number;
}

export type EncodedBitDepth = 16 | 24 | '32f';

export const MIN_SAMPLE_RATE = 44_100;
export const MAX_SAMPLE_RATE = 192_000;
export const MAX_CHANNELS = 8;
export const DEFAULT_MAX_DURATION_S = 60;
/** Clipping rule: ≥ 3 consecutive samples at ≥ 0.999 of full scale (common practice, no source). */
export const CLIP_LEVEL = 0.999;
export const CLIP_MIN_RUN = 3;

const WAVE_FORMAT_PCM = 1;
const WAVE_FORMAT_IEEE_FLOAT = 3;
const WAVE_FORMAT_EXTENSIBLE = 0xfffe;

interface WaveFileFmt {
	audioFormat: number;
	numChannels: number;
	sampleRate: number;
	blockAlign: number;
	bitsPerSample: number;
	/** Extensible only: the sub-format GUID as four little-endian 32-bit words; the first is the format code. */
	subformat?: number[];
}

interface WaveFileInstance {
	fmt: WaveFileFmt;
	fromScratch(channels: number, sampleRate: number, bitDepth: string, samples: ArrayLike<number> | ArrayLike<number>[]): void;
	toBuffer(): Uint8Array;
}

type WaveFileClass = new () => WaveFileInstance;

// The package exposes the class as a named export under Vite and on its CommonJS default under Node.
const wavefileExports = wavefileModule as unknown as { WaveFile?: WaveFileClass; default?: { WaveFile?: WaveFileClass } };
const WaveFile: WaveFileClass = (wavefileExports.WaveFile ?? wavefileExports.default?.WaveFile) as WaveFileClass;

interface ChunkLayout {
	fmtOffset: number;
	fmtBytes: number;
	dataOffset: number;
	dataBytes: number;
}

function fourCC(bytes: Uint8Array, offset: number): string {
	return String.fromCharCode(bytes[offset], bytes[offset + 1], bytes[offset + 2], bytes[offset + 3]);
}

/**
 * Walks the RIFF chunks ourselves and reads only `fmt ` and `data`: wavefile accepts a data chunk
 * longer than the file without a word, and parses every metadata chunk it knows (a `cue ` chunk
 * with a corrupt point count makes it loop and allocate without end).
 */
function checkChunkLayout(bytes: Uint8Array): ChunkLayout {
	if (bytes.length < 12) {
		if (bytes.length >= 4 && fourCC(bytes, 0) === 'RIFF') {
			throw new AnalysisInputError('header_truncated', `the WAV header is cut short: the file has only ${bytes.length} bytes`);
		}
		throw new AnalysisInputError('not_riff_wave', 'not a WAV file: it does not start with a RIFF/WAVE header');
	}
	if (fourCC(bytes, 0) !== 'RIFF' || fourCC(bytes, 8) !== 'WAVE') {
		throw new AnalysisInputError('not_riff_wave', 'not a WAV file: it does not start with a RIFF/WAVE header');
	}
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	let offset = 12;
	let fmt: { fmtOffset: number; fmtBytes: number } | null = null;
	let data: { dataOffset: number; dataBytes: number } | null = null;
	while (offset + 8 <= bytes.length && !(fmt && data)) {
		const id = fourCC(bytes, offset);
		const size = view.getUint32(offset + 4, true);
		const body = offset + 8;
		if (id === 'fmt ' && !fmt) {
			if (size < 16 || body + size > bytes.length) {
				throw new AnalysisInputError('header_truncated', 'the WAV format chunk is cut short');
			}
			fmt = { fmtOffset: body, fmtBytes: size };
		} else if (id === 'data' && !data) {
			if (body + size > bytes.length) {
				throw new AnalysisInputError(
					'data_truncated',
					`the WAV data chunk declares ${size} bytes but only ${bytes.length - body} follow: the file is cut short`
				);
			}
			data = { dataOffset: body, dataBytes: size };
		}
		offset = body + size + (size % 2);
	}
	if (!fmt && !data && offset + 8 > bytes.length) {
		throw new AnalysisInputError('header_truncated', 'the WAV header is cut short: no format or data chunk');
	}
	if (!fmt) throw new AnalysisInputError('missing_chunk', 'the WAV file has no format ("fmt ") chunk');
	if (!data) throw new AnalysisInputError('missing_chunk', 'the WAV file has no data chunk');
	return { ...fmt, ...data };
}

/** The format chunk's fields (WAVEFORMATEX, and WAVEFORMATEXTENSIBLE's sub-format code). */
function readFormat(bytes: Uint8Array, layout: ChunkLayout): WaveFileFmt {
	const view = new DataView(bytes.buffer, bytes.byteOffset + layout.fmtOffset, layout.fmtBytes);
	const fmt: WaveFileFmt = {
		audioFormat: view.getUint16(0, true),
		numChannels: view.getUint16(2, true),
		sampleRate: view.getUint32(4, true),
		blockAlign: view.getUint16(12, true),
		bitsPerSample: view.getUint16(14, true)
	};
	if (fmt.audioFormat === WAVE_FORMAT_EXTENSIBLE) {
		if (layout.fmtBytes < 40) throw new AnalysisInputError('unsupported_format', 'the WAV extensible format chunk is cut short');
		fmt.subformat = [view.getUint32(24, true), view.getUint32(28, true), view.getUint32(32, true), view.getUint32(36, true)];
	}
	return fmt;
}

function sampleFormat(fmt: WaveFileFmt): 'pcm' | 'float' {
	const code = fmt.audioFormat === WAVE_FORMAT_EXTENSIBLE ? (fmt.subformat?.[0] ?? -1) & 0xffff : fmt.audioFormat;
	if (code === WAVE_FORMAT_PCM) return 'pcm';
	if (code === WAVE_FORMAT_IEEE_FLOAT) return 'float';
	throw new AnalysisInputError('unsupported_format', `unsupported WAV encoding (format code ${code}): use PCM or IEEE float`);
}

function checkBitDepth(format: 'pcm' | 'float', bits: number): void {
	const supported = format === 'pcm' ? [16, 24, 32] : [32, 64];
	if (!supported.includes(bits)) {
		throw new AnalysisInputError(
			'unsupported_bit_depth',
			`unsupported bit depth: ${bits}-bit ${format === 'pcm' ? 'PCM' : 'float'} (use 16, 24 or 32-bit PCM, or 32/64-bit float)`
		);
	}
}

/** Reads one channel as doubles scaled so that integer full scale is ±1 (divide by 2^(bits−1)). */
function readChannel(data: Uint8Array, format: 'pcm' | 'float', bits: number, channels: number, channel: number, frames: number): Float64Array {
	const view = new DataView(data.buffer, data.byteOffset, data.byteLength);
	const bytesPerSample = bits / 8;
	const stride = bytesPerSample * channels;
	const out = new Float64Array(frames);
	let offset = channel * bytesPerSample;
	if (format === 'float' && bits === 32) {
		for (let i = 0; i < frames; i++, offset += stride) out[i] = view.getFloat32(offset, true);
	} else if (format === 'float') {
		for (let i = 0; i < frames; i++, offset += stride) out[i] = view.getFloat64(offset, true);
	} else if (bits === 16) {
		for (let i = 0; i < frames; i++, offset += stride) out[i] = view.getInt16(offset, true) / 32768;
	} else if (bits === 24) {
		for (let i = 0; i < frames; i++, offset += stride) {
			const value = data[offset] | (data[offset + 1] << 8) | (data[offset + 2] << 16);
			out[i] = ((value << 8) >> 8) / 8388608;
		}
	} else {
		for (let i = 0; i < frames; i++, offset += stride) out[i] = view.getInt32(offset, true) / 2147483648;
	}
	return out;
}

export function detectClipping(samples: Float64Array, level = CLIP_LEVEL, minRun = CLIP_MIN_RUN): ClippingSummary {
	let runs = 0;
	let clipped = 0;
	let run = 0;
	for (let i = 0; i <= samples.length; i++) {
		if (i < samples.length && Math.abs(samples[i]) >= level) {
			run++;
			continue;
		}
		if (run >= minRun) {
			runs++;
			clipped += run;
		}
		run = 0;
	}
	return { runs, samples: clipped };
}

export function decodeWav(bytes: Uint8Array, options: DecodeWavOptions = {}): DecodedWav {
	const channel = options.channel ?? 0;
	const maxDurationS = options.maxDurationS ?? DEFAULT_MAX_DURATION_S;
	const layout = checkChunkLayout(bytes);

	const fmt = readFormat(bytes, layout);
	const format = sampleFormat(fmt);
	const bits = fmt.bitsPerSample;
	checkBitDepth(format, bits);
	if (fmt.numChannels < 1 || fmt.numChannels > MAX_CHANNELS) {
		throw new AnalysisInputError('unsupported_channel_count', `unsupported channel count ${fmt.numChannels}: 1 to ${MAX_CHANNELS} channels`);
	}
	if (!(fmt.sampleRate >= MIN_SAMPLE_RATE && fmt.sampleRate <= MAX_SAMPLE_RATE)) {
		throw new AnalysisInputError(
			'unsupported_sample_rate',
			`unsupported sample rate ${fmt.sampleRate} Hz: use ${MIN_SAMPLE_RATE} to ${MAX_SAMPLE_RATE} Hz`
		);
	}
	if (!Number.isInteger(channel) || channel < 0 || channel >= fmt.numChannels) {
		throw new AnalysisInputError(
			'channel_out_of_range',
			`channel ${channel} does not exist: the file has ${fmt.numChannels} channel${fmt.numChannels === 1 ? '' : 's'} (0-based)`
		);
	}
	const frameBytes = (bits / 8) * fmt.numChannels;
	if (fmt.blockAlign !== frameBytes) {
		throw new AnalysisInputError(
			'unsupported_format',
			`the WAV format chunk is inconsistent: a block of ${fmt.blockAlign} bytes for ${fmt.numChannels} channel${fmt.numChannels === 1 ? '' : 's'} of ${bits} bits`
		);
	}
	const frames = Math.floor(layout.dataBytes / frameBytes);
	if (frames === 0) throw new AnalysisInputError('no_samples', 'the WAV file contains no samples');
	const durationS = frames / fmt.sampleRate;
	if (durationS > maxDurationS) {
		throw new AnalysisInputError('too_long', `the recording lasts ${durationS.toFixed(1)} s: the limit is ${maxDurationS} s`);
	}

	const samples = readChannel(bytes.subarray(layout.dataOffset, layout.dataOffset + layout.dataBytes), format, bits, fmt.numChannels, channel, frames);
	for (let i = 0; i < samples.length; i++) {
		if (!Number.isFinite(samples[i])) {
			throw new AnalysisInputError('non_finite_samples', `sample ${i} of channel ${channel} is not a finite number (NaN or infinity)`);
		}
	}
	const clipping = detectClipping(samples);
	const warnings: string[] = [];
	if (clipping.runs > 0) {
		warnings.push(
			`clipping: ${clipping.runs} run${clipping.runs === 1 ? '' : 's'} (${clipping.samples} samples) at full scale in channel ${channel} — lower the level and measure again`
		);
	}
	return { samples, sampleRate: fmt.sampleRate, channels: fmt.numChannels, bitDepth: bits, format, durationS, warnings, clipping };
}

/** Writes a WAV file of one or more equally long channels (PCM 16/24-bit scaled by 2^(bits−1) and clamped, or 32-bit float). */
export function encodeWav(channels: Float64Array | readonly Float64Array[], sampleRate: number, bitDepth: EncodedBitDepth): Uint8Array {
	const list = channels instanceof Float64Array ? [channels] : channels;
	if (!Number.isInteger(sampleRate) || sampleRate <= 0) throw new RangeError(`sample rate must be a positive integer, got ${sampleRate}`);
	if (list.length < 1 || list.length > MAX_CHANNELS) throw new RangeError(`need 1 to ${MAX_CHANNELS} channels, got ${list.length}`);
	const frames = list[0].length;
	if (frames === 0) throw new RangeError('cannot write a WAV file with no samples');
	if (list.some((channel) => channel.length !== frames)) throw new RangeError('all channels must have the same length');
	const data = list.map((samples, c): ArrayLike<number> => {
		for (let i = 0; i < frames; i++) {
			if (!Number.isFinite(samples[i])) throw new RangeError(`sample ${i} of channel ${c} is not finite`);
		}
		if (bitDepth === '32f') return samples;
		const scale = 2 ** (bitDepth - 1);
		const ints = new Int32Array(frames);
		for (let i = 0; i < frames; i++) ints[i] = Math.max(-scale, Math.min(scale - 1, Math.round(samples[i] * scale)));
		return ints;
	});
	const wav = new WaveFile();
	wav.fromScratch(list.length, sampleRate, String(bitDepth), list.length === 1 ? data[0] : data);
	return wav.toBuffer();
}
