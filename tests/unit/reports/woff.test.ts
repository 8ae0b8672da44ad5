import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';
import { describe, expect, it } from 'vitest';
import { FontFormatError, woffToSfnt } from '../../../src/lib/server/reports/woff';

const require = createRequire(import.meta.url);
const WOFF = readFileSync(require.resolve('@fontsource/jetbrains-mono/files/jetbrains-mono-latin-400-normal.woff'));

/** OpenType table checksum: the sum of the table's big-endian uint32 words, zero-padded, mod 2^32 (OpenType spec, "Table directory"). */
function tableChecksum(data: Buffer): number {
	const padded = Buffer.alloc((data.length + 3) & ~3);
	data.copy(padded);
	let sum = 0;
	for (let i = 0; i < padded.length; i += 4) sum = (sum + padded.readUInt32BE(i)) >>> 0;
	return sum;
}

interface TableRecord {
	tag: string;
	checksum: number;
	offset: number;
	length: number;
}

function records(sfnt: Buffer): TableRecord[] {
	const count = sfnt.readUInt16BE(4);
	return Array.from({ length: count }, (_, i) => {
		const at = 12 + 16 * i;
		return { tag: sfnt.toString('latin1', at, at + 4), checksum: sfnt.readUInt32BE(at + 4), offset: sfnt.readUInt32BE(at + 8), length: sfnt.readUInt32BE(at + 12) };
	});
}

type FontLike = { numGlyphs: number; unitsPerEm: number; postscriptName: string; glyphForCodePoint(cp: number): { advanceWidth: number; id: number } };

describe('woffToSfnt', () => {
	const sfnt = woffToSfnt(WOFF);

	it('writes the OpenType offset table for the WOFF flavour and table count', () => {
		// WOFF 1.0 §3: flavor at byte 4, numTables at byte 12 of the WOFF header.
		expect(sfnt.readUInt32BE(0)).toBe(WOFF.readUInt32BE(4));
		const n = WOFF.readUInt16BE(12);
		expect(sfnt.readUInt16BE(4)).toBe(n);
		// OpenType spec: searchRange = 16·(largest power of 2 ≤ n), entrySelector = log2 of it, rangeShift = 16·n − searchRange.
		const power = 2 ** Math.floor(Math.log2(n));
		expect(sfnt.readUInt16BE(6)).toBe(16 * power);
		expect(sfnt.readUInt16BE(8)).toBe(Math.log2(power));
		expect(sfnt.readUInt16BE(10)).toBe(16 * n - 16 * power);
	});

	it('restores every table so its OpenType checksum matches the one WOFF stored', () => {
		const tables = records(sfnt);
		expect(tables.map((t) => t.tag)).toEqual([...tables.map((t) => t.tag)].sort());
		for (const table of tables) {
			expect(table.offset % 4, `${table.tag} is 4-byte aligned`).toBe(0);
			const data = Buffer.from(sfnt.subarray(table.offset, table.offset + table.length));
			// The head checksum is taken with checkSumAdjustment (bytes 8–11) set to 0.
			if (table.tag === 'head') data.writeUInt32BE(0, 8);
			expect(tableChecksum(data), table.tag).toBe(table.checksum);
		}
	});

	it('reads as the same font as fontkit reads the WOFF', () => {
		const fromWoff = fontkit.create(WOFF) as unknown as FontLike;
		const fromSfnt = fontkit.create(sfnt) as unknown as FontLike;
		expect(fromSfnt.numGlyphs).toBe(fromWoff.numGlyphs);
		expect(fromSfnt.unitsPerEm).toBe(fromWoff.unitsPerEm);
		expect(fromSfnt.postscriptName).toBe(fromWoff.postscriptName);
		for (const char of '0123456789.−—×³ Hz dB') {
			const a = fromWoff.glyphForCodePoint(char.codePointAt(0) as number);
			const b = fromSfnt.glyphForCodePoint(char.codePointAt(0) as number);
			expect(b.id, char).toBe(a.id);
			expect(b.advanceWidth, char).toBe(a.advanceWidth);
		}
	});

	const bad: [string, Buffer][] = [
		['a TrueType file', Buffer.from([0, 1, 0, 0, ...new Array(60).fill(0)])],
		['an empty buffer', Buffer.alloc(0)],
		['a WOFF cut after its header', WOFF.subarray(0, 60)]
	];
	it.each(bad)('rejects %s', (_, input) => {
		expect(() => woffToSfnt(input)).toThrow(FontFormatError);
	});
});
