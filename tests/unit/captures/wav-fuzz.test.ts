// Fuzzing the two WAV readers — the upload check's header reader (`readWavHeader`) and the
// analysis job's decoder (`decodeWav`) — with 10,000 mutated files built from valid ones:
// truncations, flipped header bytes, huge and zero size fields, odd chunk orders, duplicate and
// unknown chunks, short reads. Every file must be read or refused with the reader's own error
// type and a one-line reason; nothing else may be thrown and no file may take long. The PRNG is
// seeded, so a failure names a case that can be built again.
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from '../../../src/lib/analysis/errors';
import { decodeWav, encodeWav, type EncodedBitDepth } from '../../../src/lib/analysis/wav';
import { bytesSource, readWavHeader, WavHeaderError, type RangeSource } from '../../../src/lib/server/captures/wav-header';

const CASES = 10_000;
/** Per file and reader; the files are at most a few tens of kB (common practice, no source). */
const TIME_BOUND_MS = 250;

/** mulberry32: a small seeded PRNG (public-domain algorithm by Tommy Ettinger). */
function prng(seed: number) {
	let a = seed >>> 0;
	const next = () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
	return { next, int: (n: number) => Math.floor(next() * n), pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)] };
}
type Rng = ReturnType<typeof prng>;

interface Chunk {
	id: string;
	body: Uint8Array;
	/** A size field that lies (huge, zero, off by some): written instead of the body's length. */
	declared?: number;
}

function parse(wav: Uint8Array): Chunk[] {
	const view = new DataView(wav.buffer, wav.byteOffset, wav.byteLength);
	const out: Chunk[] = [];
	for (let at = 12; at + 8 <= wav.length; ) {
		const size = view.getUint32(at + 4, true);
		out.push({ id: String.fromCharCode(...wav.subarray(at, at + 4)), body: wav.slice(at + 8, at + 8 + size) });
		at += 8 + size + (size % 2);
	}
	return out;
}

function build(chunks: Chunk[], riffSize?: number): Uint8Array {
	const length = 12 + chunks.reduce((n, c) => n + 8 + c.body.length + (c.body.length % 2), 0);
	const out = new Uint8Array(length);
	const view = new DataView(out.buffer);
	out.set([0x52, 0x49, 0x46, 0x46, 0, 0, 0, 0, 0x57, 0x41, 0x56, 0x45]);
	view.setUint32(4, riffSize ?? length - 8, true);
	let at = 12;
	for (const c of chunks) {
		for (let i = 0; i < 4; i++) out[at + i] = c.id.charCodeAt(i) & 0xff;
		view.setUint32(at + 4, c.declared ?? c.body.length, true);
		out.set(c.body, at + 8);
		at += 8 + c.body.length + (c.body.length % 2);
	}
	return out;
}

function signal(frames: number, channels: number): Float64Array[] {
	return Array.from({ length: channels }, (_, c) => new Float64Array(frames).map((_, i) => 0.6 * Math.sin(0.05 * (c + 1) * i) * Math.exp(-i / 800)));
}

/** Valid starting points: the encodings and layouts the readers accept. */
function seeds(): Chunk[][] {
	const out: Chunk[][] = [];
	for (const depth of [16, 24, '32f'] as EncodedBitDepth[]) {
		for (const channels of [1, 2]) out.push(parse(encodeWav(signal(600, channels), 48_000, depth)));
	}
	const tags = new TextEncoder().encode('INFOINAM\x0c\x00\x00\x00living room\x00');
	out.push([{ id: 'LIST', body: tags }, ...parse(encodeWav(signal(500, 1), 44_100, 16))]);
	return out;
}

const SIZE_LIES = [0, 1, 15, 16, 17, 0x7fffffff, 0x80000000, 0xfffffff0, 0xffffffff];
const IDS = ['fmt ', 'data', 'LIST', 'JUNK', 'fact', 'cue ', '\x00\x00\x00\x00', 'FMT ', 'dat\x00'];

type Mutation = (chunks: Chunk[], r: Rng) => { chunks: Chunk[]; riffSize?: number; cut?: number; flips?: number[]; shortRead?: boolean };

const mutations: Record<string, Mutation> = {
	truncate: (chunks, r) => ({ chunks, cut: r.int(build(chunks).length) }),
	flipHeaderByte: (chunks, r) => ({ chunks, flips: Array.from({ length: 1 + r.int(4) }, () => r.int(Math.min(80, build(chunks).length))) }),
	flipAnyByte: (chunks, r) => ({ chunks, flips: Array.from({ length: 1 + r.int(8) }, () => r.int(build(chunks).length)) }),
	hugeChunkSize: (chunks, r) => {
		const i = r.int(chunks.length);
		return { chunks: chunks.map((c, j) => (j === i ? { ...c, declared: r.pick(SIZE_LIES) } : c)) };
	},
	offByChunkSize: (chunks, r) => {
		const i = r.int(chunks.length);
		return { chunks: chunks.map((c, j) => (j === i ? { ...c, declared: Math.max(0, c.body.length + r.int(9) - 4) } : c)) };
	},
	riffSize: (chunks, r) => ({ chunks, riffSize: r.pick(SIZE_LIES) }),
	reorder: (chunks, r) => {
		const shuffled = [...chunks];
		for (let i = shuffled.length - 1; i > 0; i--) {
			const j = r.int(i + 1);
			[shuffled[i], shuffled[j]] = [shuffled[j], shuffled[i]];
		}
		return { chunks: shuffled };
	},
	duplicate: (chunks, r) => {
		const copy = [...chunks];
		if (chunks.length > 0) copy.splice(r.int(copy.length + 1), 0, chunks[r.int(chunks.length)]);
		return { chunks: copy };
	},
	drop: (chunks, r) => ({ chunks: chunks.filter((_, j) => j !== r.int(chunks.length)) }),
	insertChunk: (chunks, r) => {
		const copy = [...chunks];
		const body = new Uint8Array(r.pick([0, 1, 3, 16, 40, 300, 70_000])).map(() => r.int(256));
		copy.splice(r.int(copy.length + 1), 0, { id: r.pick(IDS), body });
		return { chunks: copy };
	},
	formatField: (chunks, r) => {
		const values = [0, 1, 2, 3, 7, 8, 9, 12, 17, 24, 32, 64, 255, 0xfffe, 0xffff, 8000, 44_100, 48_000, 192_001, 0xffffffff];
		return {
			chunks: chunks.map((c) => {
				if (c.id !== 'fmt ') return c;
				const body = c.body.slice();
				const view = new DataView(body.buffer);
				const field = r.pick([0, 2, 4, 8, 12, 14, 24]);
				if (field + 4 <= body.length && (field === 4 || field === 8)) view.setUint32(field, r.pick(values), true);
				else if (field + 2 <= body.length) view.setUint16(field, r.pick(values) & 0xffff, true);
				return { ...c, body };
			})
		};
	},
	shortFormat: (chunks, r) => ({ chunks: chunks.map((c) => (c.id === 'fmt ' ? { ...c, body: c.body.slice(0, r.int(c.body.length)) } : c)) }),
	shortRead: (chunks) => ({ chunks, shortRead: true })
};

/** A source whose reads come back short, as a store that drops a connection might. */
function shortReads(bytes: Uint8Array, r: Rng): RangeSource {
	return { size: bytes.length, read: async (offset, length) => bytes.subarray(offset, offset + r.int(length + 1)) };
}

interface Outcome {
	read: boolean;
	reason?: string;
	ms: number;
	header?: { channels: number; sampleRate: number; frames: number };
}

async function throughHeader(source: RangeSource): Promise<Outcome> {
	const t = performance.now();
	try {
		const h = await readWavHeader(source, { maxDurationS: 60 });
		return { read: true, ms: performance.now() - t, header: { channels: h.channels, sampleRate: h.sampleRate, frames: h.frames } };
	} catch (e) {
		if (!(e instanceof WavHeaderError)) throw new Error(`header reader threw ${String(e)} (${(e as Error)?.stack})`);
		return { read: false, reason: e.message, ms: performance.now() - t };
	}
}

function throughDecoder(bytes: Uint8Array): Outcome {
	const t = performance.now();
	try {
		const d = decodeWav(bytes, { maxDurationS: 60 });
		return { read: true, ms: performance.now() - t, header: { channels: d.channels, sampleRate: d.sampleRate, frames: d.samples.length } };
	} catch (e) {
		if (!(e instanceof AnalysisInputError)) throw new Error(`decoder threw ${String(e)} (${(e as Error)?.stack})`);
		return { read: false, reason: e.message, ms: performance.now() - t };
	}
}

const oneLine = (reason: string | undefined) => typeof reason === 'string' && reason.trim().length > 0 && !/[\r\n]/.test(reason) && reason.length <= 300;

describe('WAV readers under 10,000 mutated files', () => {
	it('read or refuse every file with their own error and a one-line reason, quickly, and agree on what they both read', async () => {
		const r = prng(20261203);
		const bases = seeds();
		const names = Object.keys(mutations);
		const tally = { header: { read: 0, refused: 0 }, decoder: { read: 0, refused: 0 } };
		let slowest = 0;
		const failures: string[] = [];
		for (let n = 0; n < CASES; n++) {
			const name = names[n % names.length];
			let m = mutations[name](bases[r.int(bases.length)], r);
			// A third of the cases get a second mutation on top.
			if (r.next() < 1 / 3) {
				const second = mutations[r.pick(names)](m.chunks, r);
				m = { ...m, ...second, cut: second.cut ?? m.cut, flips: second.flips ?? m.flips };
			}
			let bytes = build(m.chunks, m.riffSize);
			for (const at of m.flips ?? []) if (at < bytes.length) bytes[at] ^= 1 << r.int(8);
			if (m.cut !== undefined) bytes = bytes.slice(0, m.cut);
			const label = `case ${n} (${name}, ${bytes.length} bytes)`;

			const header = await throughHeader(m.shortRead ? shortReads(bytes, r) : bytesSource(bytes));
			const decoded = throughDecoder(bytes);
			for (const [reader, o] of [['header', header], ['decoder', decoded]] as const) {
				tally[reader][o.read ? 'read' : 'refused']++;
				if (!o.read && !oneLine(o.reason)) failures.push(`${label}: ${reader} reason ${JSON.stringify(o.reason)}`);
				if (o.ms >= TIME_BOUND_MS) failures.push(`${label}: ${reader} took ${o.ms.toFixed(1)} ms`);
				slowest = Math.max(slowest, o.ms);
			}
			if (header.read && decoded.read && JSON.stringify(header.header) !== JSON.stringify(decoded.header)) {
				failures.push(`${label}: header read ${JSON.stringify(header.header)}, decoder ${JSON.stringify(decoded.header)}`);
			}
		}
		expect(failures.slice(0, 20)).toEqual([]);
		// Both outcomes occur: the mutations neither all break nor all spare the files.
		for (const reader of ['header', 'decoder'] as const) {
			expect(tally[reader].read, reader).toBeGreaterThan(CASES / 20);
			expect(tally[reader].refused, reader).toBeGreaterThan(CASES / 4);
			expect(tally[reader].read + tally[reader].refused).toBe(CASES);
		}
		console.info(`wav fuzz: ${JSON.stringify(tally)}, slowest ${slowest.toFixed(1)} ms`);
	}, 60_000);
});

describe('metadata chunks the readers skip', () => {
	it('a cue chunk whose point count is corrupt (found by the fuzzing above) does not stall the decoder', async () => {
		const [fmt, data] = parse(encodeWav(signal(600, 1), 48_000, 16));
		const cue = new Uint8Array(16);
		new DataView(cue.buffer).setUint32(0, 0xfffffff0, true); // dwCuePoints: four billion points in 16 bytes
		const bytes = build([fmt, { id: 'cue ', body: cue }, data]);
		const t = performance.now();
		expect(decodeWav(bytes).samples.length).toBe(600);
		expect((await readWavHeader(bytesSource(bytes), { maxDurationS: 60 })).frames).toBe(600);
		expect(performance.now() - t).toBeLessThan(TIME_BOUND_MS);
	});
});
