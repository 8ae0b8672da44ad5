// The upload check's header reader: walks the RIFF chunk list with ranged reads, so metadata
// chunks of any length before `fmt ` (a LIST of tags, a JUNK pad) do not hide the format.
// Layout per the RIFF/WAVE description (Microsoft/IBM "Multimedia Programming Interface and Data
// Specifications 1.0", 1991, RIFF chunks and WAVE form): each chunk is a four-character id, a
// 32-bit little-endian size, the body, and a pad byte when the size is odd.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { decodeWav, encodeWav } from '../../../src/lib/analysis/wav';
import { bytesSource, fileSource, HEADER_PROBE_BYTES, MAX_CHUNKS, readWavHeader, WavHeaderError, type RangeSource } from '../../../src/lib/server/captures/wav-header';

const limits = { maxDurationS: 60 };

function chunk(id: string, body: Uint8Array): Uint8Array {
	const out = new Uint8Array(8 + body.length + (body.length % 2));
	out.set([...id].map((c) => c.charCodeAt(0)), 0);
	new DataView(out.buffer).setUint32(4, body.length, true);
	out.set(body, 8);
	return out;
}

function riff(chunks: Uint8Array[]): Uint8Array {
	const bodyLength = 4 + chunks.reduce((n, c) => n + c.length, 0);
	const out = new Uint8Array(8 + bodyLength);
	out.set([0x52, 0x49, 0x46, 0x46], 0);
	new DataView(out.buffer).setUint32(4, bodyLength, true);
	out.set([0x57, 0x41, 0x56, 0x45], 8);
	let at = 12;
	for (const c of chunks) {
		out.set(c, at);
		at += c.length;
	}
	return out;
}

/** The chunks of a WAV written by the encoder: its `fmt ` and `data`. */
function chunksOf(wav: Uint8Array): Map<string, Uint8Array> {
	const view = new DataView(wav.buffer, wav.byteOffset, wav.byteLength);
	const out = new Map<string, Uint8Array>();
	for (let at = 12; at + 8 <= wav.length; ) {
		const id = String.fromCharCode(...wav.subarray(at, at + 4));
		const size = view.getUint32(at + 4, true);
		out.set(id, wav.subarray(at + 8, at + 8 + size));
		at += 8 + size + (size % 2);
	}
	return out;
}

const tone = new Float64Array(4800).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 1000 * i) / 48_000));
const plain = chunksOf(encodeWav(tone, 48_000, 16));
/** A LIST chunk of tags longer than the first read (70 kB, as in the report). */
const bigList = chunk('LIST', new Uint8Array(70_000).map((_, i) => (i < 4 ? 'INFO'.charCodeAt(i) : 0x20 + (i % 90))));
const withBigList = riff([bigList, chunk('fmt ', plain.get('fmt ')!), chunk('data', plain.get('data')!)]);

/** Counts and sizes the reads, to show the walk reads headers, not the chunks in between. */
function counting(source: RangeSource) {
	const reads: { offset: number; length: number }[] = [];
	return { reads, source: { size: source.size, read: (offset: number, length: number) => (reads.push({ offset, length }), source.read(offset, length)) } };
}

describe('readWavHeader', () => {
	const dir = mkdtempSync(join(tmpdir(), 'wav-header-'));
	afterAll(() => rmSync(dir, { recursive: true, force: true }));

	it('reads a WAV whose format chunk comes after a LIST chunk longer than the first read', async () => {
		expect(bigList.length).toBeGreaterThan(HEADER_PROBE_BYTES);
		const { reads, source } = counting(bytesSource(withBigList));
		const header = await readWavHeader(source, limits);
		expect(header).toMatchObject({ format: 'pcm', channels: 1, sampleRate: 48_000, bitsPerSample: 16, frames: 4800 });
		expect(header.durationS).toBeCloseTo(0.1, 12);
		expect(header.dataOffset).toBe(12 + bigList.length + 8 + 16 + 8);
		expect(header.dataBytes).toBe(9600);
		// One first window, then small reads at the chunk headers past it.
		expect(reads[0]).toEqual({ offset: 0, length: HEADER_PROBE_BYTES });
		expect(reads.slice(1).every((r) => r.length <= 48)).toBe(true);
		expect(reads.length).toBeLessThanOrEqual(4);
		// The analysis decodes the same file.
		expect(decodeWav(withBigList).samples.length).toBe(4800);
	});

	it('reads the same file from disk through ranged reads', async () => {
		const path = join(dir, 'long-list.wav');
		writeFileSync(path, withBigList);
		const source = await fileSource(path);
		try {
			expect(await readWavHeader(source, limits)).toMatchObject({ channels: 1, sampleRate: 48_000, frames: 4800 });
		} finally {
			await source.close();
		}
	});

	it('reads the data chunk before the format chunk, and skips unknown chunks of odd length', async () => {
		const file = riff([chunk('JUNK', new Uint8Array(3)), chunk('data', plain.get('data')!), chunk('fmt ', plain.get('fmt ')!)]);
		expect(await readWavHeader(bytesSource(file), limits)).toMatchObject({ frames: 4800, dataOffset: 12 + 12 + 8 });
	});

	it('refuses a data chunk longer than the file, naming the truncation', async () => {
		const cut = withBigList.subarray(0, withBigList.length - 100);
		await expect(readWavHeader(bytesSource(cut), limits)).rejects.toThrow(/truncated: its data chunk is longer than the file/);
	});

	it('refuses a metadata chunk that claims more bytes than the file has', async () => {
		const file = riff([bigList, chunk('fmt ', plain.get('fmt ')!), chunk('data', plain.get('data')!)]);
		new DataView(file.buffer).setUint32(16, 0xfffffff0, true);
		await expect(readWavHeader(bytesSource(file), limits)).rejects.toThrow(/"LIST" chunk is longer than the file/);
	});

	it(`stops after ${MAX_CHUNKS} chunks`, async () => {
		const many = Array.from({ length: MAX_CHUNKS + 1 }, () => chunk('JUNK', new Uint8Array(2)));
		const file = riff([...many, chunk('fmt ', plain.get('fmt ')!), chunk('data', plain.get('data')!)]);
		await expect(readWavHeader(bytesSource(file), limits)).rejects.toThrow(new RegExp(`more than ${MAX_CHUNKS} chunks`));
		const fewer = riff([...many.slice(0, MAX_CHUNKS - 2), chunk('fmt ', plain.get('fmt ')!), chunk('data', plain.get('data')!)]);
		expect((await readWavHeader(bytesSource(fewer), limits)).frames).toBe(4800);
	});

	it('refuses a format chunk whose block size disagrees with its channels and sample size', async () => {
		const fmt = plain.get('fmt ')!.slice();
		new DataView(fmt.buffer).setUint16(12, 4, true); // 1 channel of 16 bits is 2 bytes a frame
		await expect(readWavHeader(bytesSource(riff([chunk('fmt ', fmt), chunk('data', plain.get('data')!)])), limits)).rejects.toThrow(WavHeaderError);
	});

	it('refuses a recording longer than the limit from its header alone', async () => {
		await expect(readWavHeader(bytesSource(withBigList), { maxDurationS: 0.05 })).rejects.toThrow(/0\.1 s long; the limit is 0\.05 s/);
	});
});
