import * as wavefileModule from 'wavefile';
import { describe, expect, it } from 'vitest';
import { AnalysisInputError, type AnalysisInputErrorCode } from '../../../src/lib/analysis/errors';
import { decodeWav, detectClipping, encodeWav } from '../../../src/lib/analysis/wav';

interface TestWaveFile {
	fmt: { audioFormat: number; subformat: number[]; validBitsPerSample: number };
	fromScratch(channels: number, sampleRate: number, bitDepth: string, samples: ArrayLike<number> | ArrayLike<number>[]): void;
	toBuffer(): Uint8Array;
}
const exported = wavefileModule as unknown as { WaveFile?: new () => TestWaveFile; default?: { WaveFile: new () => TestWaveFile } };
const WaveFile = (exported.WaveFile ?? exported.default!.WaveFile) as new () => TestWaveFile;

/** A different test tone per channel, inside ±0.9. */
function channelSignal(channel: number, frames: number): Float64Array {
	return new Float64Array(frames).map((_, i) => 0.9 * Math.sin(0.01 * (channel + 1) * i + channel) * Math.cos(0.0007 * i));
}

type Depth = '16' | '24' | '32' | '32f' | '64';

/** Integer codes for PCM (rounded x·2^(bits−1)), plain values for float: what a recorder would store. */
function toStored(x: Float64Array, depth: Depth): number[] {
	if (depth === '32f' || depth === '64') return Array.from(x);
	const scale = 2 ** (Number(depth) - 1);
	return Array.from(x, (v) => Math.round(v * scale));
}

function makeWav(depth: Depth, sampleRate: number, channels: number, frames: number, extensible = false): Uint8Array {
	const wav = new WaveFile();
	const data = Array.from({ length: channels }, (_, c) => toStored(channelSignal(c, frames), depth));
	wav.fromScratch(channels, sampleRate, depth, channels === 1 ? data[0] : data);
	if (extensible) {
		// WAVE_FORMAT_EXTENSIBLE with the sub-format GUID's first word = 1 (PCM) or 3 (IEEE float).
		wav.fmt.audioFormat = 0xfffe;
		wav.fmt.subformat = [depth === '32f' || depth === '64' ? 3 : 1, 1048576, 2852126848, 1905997824];
	}
	return wav.toBuffer();
}

/** Quantisation step: one LSB for PCM; float32 keeps 24 bits of mantissa; float64 is exact. */
const QUANTUM: Record<Depth, number> = { '16': 2 ** -15, '24': 2 ** -23, '32': 2 ** -31, '32f': 2 ** -24, '64': 1e-15 };

function expectCode(call: () => unknown, code: AnalysisInputErrorCode): void {
	try {
		call();
		expect.unreachable(`expected ${code}`);
	} catch (error) {
		expect(error).toBeInstanceOf(AnalysisInputError);
		expect((error as AnalysisInputError).code).toBe(code);
		expect((error as Error).message.length).toBeGreaterThan(10);
	}
}

describe('WAV decoding: every supported format gives the stored samples within quantisation', () => {
	const cases: { depth: Depth; sampleRate: number; channels: number; extensible: boolean }[] = [];
	for (const depth of ['16', '24', '32', '32f', '64'] as const) {
		cases.push({ depth, sampleRate: 48000, channels: 1, extensible: false });
		cases.push({ depth, sampleRate: 44100, channels: 2, extensible: false });
		cases.push({ depth, sampleRate: 96000, channels: 8, extensible: true });
	}
	cases.push({ depth: '24', sampleRate: 192000, channels: 3, extensible: true });
	cases.push({ depth: '16', sampleRate: 88200, channels: 4, extensible: true });

	it.each(cases)('$depth-bit, $sampleRate Hz, $channels channel(s), extensible: $extensible', ({ depth, sampleRate, channels, extensible }) => {
		const frames = 1000;
		const bytes = makeWav(depth, sampleRate, channels, frames, extensible);
		for (const channel of [0, channels - 1]) {
			const decoded = decodeWav(bytes, { channel });
			expect(decoded.sampleRate).toBe(sampleRate);
			expect(decoded.channels).toBe(channels);
			expect(decoded.bitDepth).toBe(Number(depth.replace('f', '')));
			expect(decoded.format).toBe(depth === '32f' || depth === '64' ? 'float' : 'pcm');
			expect(decoded.durationS).toBeCloseTo(frames / sampleRate, 12);
			expect(decoded.samples).toHaveLength(frames);
			const expected = channelSignal(channel, frames);
			let worst = 0;
			for (let i = 0; i < frames; i++) worst = Math.max(worst, Math.abs(decoded.samples[i] - expected[i]));
			// Rounding to the stored grid is at most half a step.
			expect(worst).toBeLessThanOrEqual(QUANTUM[depth] / 2 + 1e-16);
			expect(decoded.warnings).toEqual([]);
		}
	});
});

describe('WAV rejections, each with its code', () => {
	const good = makeWav('16', 48000, 2, 4800);

	it('not RIFF/WAVE', () => {
		expectCode(() => decodeWav(new TextEncoder().encode('this is not a wave file at all, just some text')), 'not_riff_wave');
		const wrongForm = good.slice();
		wrongForm.set(new TextEncoder().encode('AVI '), 8);
		expectCode(() => decodeWav(wrongForm), 'not_riff_wave');
	});

	it.each([10, 20, 30])('header truncated after %i bytes', (length) => {
		expectCode(() => decodeWav(good.slice(0, length)), 'header_truncated');
	});

	it('data chunk longer than the file', () => {
		expectCode(() => decodeWav(good.slice(0, good.length - 100)), 'data_truncated');
	});

	it('zero samples', () => {
		expectCode(() => decodeWav(makeWav('16', 48000, 1, 0)), 'no_samples');
	});

	it.each([NaN, Infinity, -Infinity])('a non-finite float sample (%f)', (bad) => {
		const wav = new WaveFile();
		const samples = Array.from(channelSignal(0, 100));
		samples[42] = bad;
		wav.fromScratch(1, 48000, '32f', samples);
		expectCode(() => decodeWav(wav.toBuffer()), 'non_finite_samples');
	});

	it.each([-1, 2, 1.5])('channel %f of a stereo file', (channel) => {
		expectCode(() => decodeWav(good, { channel }), 'channel_out_of_range');
	});

	it('8-bit PCM', () => {
		const wav = new WaveFile();
		wav.fromScratch(1, 48000, '8', new Array(100).fill(128));
		expectCode(() => decodeWav(wav.toBuffer()), 'unsupported_bit_depth');
	});

	it.each([22050, 32000, 384000])('sample rate %i Hz', (sampleRate) => {
		expectCode(() => decodeWav(makeWav('16', sampleRate, 1, 100)), 'unsupported_sample_rate');
	});

	it('A-law encoding', () => {
		const wav = new WaveFile();
		wav.fromScratch(1, 48000, '16', toStored(channelSignal(0, 100), '16'));
		(wav as unknown as { toALaw(): void }).toALaw();
		expectCode(() => decodeWav(wav.toBuffer()), 'unsupported_format');
	});

	it('an extensible file whose sub-format is neither PCM nor float', () => {
		const wav = new WaveFile();
		wav.fromScratch(3, 48000, '16', [0, 1, 2].map((c) => toStored(channelSignal(c, 100), '16')));
		wav.fmt.audioFormat = 0xfffe;
		wav.fmt.subformat = [2, 1048576, 2852126848, 1905997824];
		expectCode(() => decodeWav(wav.toBuffer()), 'unsupported_format');
	});

	it('longer than the limit', () => {
		expectCode(() => decodeWav(good, { maxDurationS: 0.05 }), 'too_long');
		expect(decodeWav(good, { maxDurationS: 0.1 }).samples).toHaveLength(4800);
	});
});

describe('clipping (≥ 3 consecutive samples at ≥ 0.999 of full scale, common practice, no source)', () => {
	it.each([
		{ runs: [5], expected: { runs: 1, samples: 5 } },
		{ runs: [2, 2, 2], expected: { runs: 0, samples: 0 } },
		{ runs: [3, 1, 4], expected: { runs: 2, samples: 7 } }
	])('runs of $runs full-scale samples → $expected', ({ runs, expected }) => {
		const x = new Float64Array(1000).map((_, i) => 0.5 * Math.sin(i));
		let at = 100;
		for (const length of runs) {
			for (let i = 0; i < length; i++) x[at + i] = i % 2 ? -1 : 1;
			at += length + 50;
		}
		expect(detectClipping(x)).toEqual(expected);
	});

	it('a clipped file decodes with a clipping warning', () => {
		const x = channelSignal(0, 4800);
		for (let i = 1000; i < 1010; i++) x[i] = 1;
		const decoded = decodeWav(encodeWav(x, 48000, 24));
		expect(decoded.clipping).toEqual({ runs: 1, samples: 10 });
		expect(decoded.warnings).toHaveLength(1);
		expect(decoded.warnings[0]).toMatch(/clipping/);
	});
});

describe('WAV encoding for the sweep download', () => {
	it.each([
		{ depth: 16, quantum: 2 ** -15 },
		{ depth: 24, quantum: 2 ** -23 },
		{ depth: '32f', quantum: 2 ** -24 }
	] as const)('$depth: decodes back within half a step', ({ depth, quantum }) => {
		const x = channelSignal(1, 2000);
		const decoded = decodeWav(encodeWav(x, 96000, depth));
		expect(decoded.sampleRate).toBe(96000);
		for (let i = 0; i < x.length; i++) expect(Math.abs(decoded.samples[i] - x[i])).toBeLessThanOrEqual(quantum / 2 + 1e-16);
	});

	it('clamps full scale instead of wrapping around', () => {
		const decoded = decodeWav(encodeWav(new Float64Array([1, -1, 1.5]), 48000, 16));
		expect(Array.from(decoded.samples)).toEqual([32767 / 32768, -1, 32767 / 32768]);
	});

	it.each([
		() => encodeWav(new Float64Array(10), 0, 16),
		() => encodeWav(new Float64Array(10), 44100.5, 24),
		() => encodeWav(new Float64Array(0), 48000, 16),
		() => encodeWav(new Float64Array([NaN]), 48000, 16)
	])('rejects bad input %#', (call) => {
		expect(call).toThrow(RangeError);
	});
});
