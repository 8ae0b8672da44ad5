// WOFF 1.0 to plain sfnt (TrueType/OpenType) so the font is inflated once per process with
// node's zlib instead of on every table read (W3C WOFF File Format 1.0, 2012, §3–§5).
import { inflateSync } from 'node:zlib';

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'
const WOFF_HEADER_SIZE = 44;
const WOFF_ENTRY_SIZE = 20;
const SFNT_HEADER_SIZE = 12;
const SFNT_RECORD_SIZE = 16;

export class FontFormatError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'FontFormatError';
	}
}

interface WoffTable {
	tag: number;
	offset: number;
	compLength: number;
	origLength: number;
	origChecksum: number;
}

const pad4 = (n: number) => (n + 3) & ~3;

/** The sfnt file a WOFF 1.0 file wraps, table for table. */
export function woffToSfnt(woff: Uint8Array): Buffer {
	const input = Buffer.from(woff.buffer, woff.byteOffset, woff.byteLength);
	if (input.length < WOFF_HEADER_SIZE || input.readUInt32BE(0) !== WOFF_SIGNATURE) throw new FontFormatError('not a WOFF 1.0 file (no wOFF signature)');
	const flavor = input.readUInt32BE(4);
	const numTables = input.readUInt16BE(12);
	if (numTables === 0 || WOFF_HEADER_SIZE + numTables * WOFF_ENTRY_SIZE > input.length) throw new FontFormatError(`WOFF table directory of ${numTables} tables does not fit the file`);

	const tables: WoffTable[] = [];
	for (let i = 0; i < numTables; i++) {
		const at = WOFF_HEADER_SIZE + i * WOFF_ENTRY_SIZE;
		const table = {
			tag: input.readUInt32BE(at),
			offset: input.readUInt32BE(at + 4),
			compLength: input.readUInt32BE(at + 8),
			origLength: input.readUInt32BE(at + 12),
			origChecksum: input.readUInt32BE(at + 16)
		};
		if (table.offset + table.compLength > input.length || table.compLength > table.origLength) {
			throw new FontFormatError(`WOFF table ${i} lies outside the file or is larger compressed than plain`);
		}
		tables.push(table);
	}
	// §5: the sfnt table records are sorted by tag.
	tables.sort((a, b) => a.tag - b.tag);

	const dataStart = SFNT_HEADER_SIZE + numTables * SFNT_RECORD_SIZE;
	const size = tables.reduce((total, t) => total + pad4(t.origLength), dataStart);
	const output = Buffer.alloc(size);
	// OpenType offset table: searchRange = 16·2^⌊log2 n⌋, entrySelector = ⌊log2 n⌋, rangeShift = 16·n − searchRange.
	const entrySelector = Math.floor(Math.log2(numTables));
	output.writeUInt32BE(flavor, 0);
	output.writeUInt16BE(numTables, 4);
	output.writeUInt16BE(16 * 2 ** entrySelector, 6);
	output.writeUInt16BE(entrySelector, 8);
	output.writeUInt16BE(16 * numTables - 16 * 2 ** entrySelector, 10);

	let offset = dataStart;
	tables.forEach((table, i) => {
		const stored = input.subarray(table.offset, table.offset + table.compLength);
		// §4: a table is zlib-compressed exactly when its stored length is below its plain length.
		const data = table.compLength < table.origLength ? inflateSync(stored) : stored;
		if (data.length !== table.origLength) throw new FontFormatError(`WOFF table ${i} inflates to ${data.length} bytes, expected ${table.origLength}`);
		const record = SFNT_HEADER_SIZE + i * SFNT_RECORD_SIZE;
		output.writeUInt32BE(table.tag, record);
		output.writeUInt32BE(table.origChecksum, record + 4);
		output.writeUInt32BE(offset, record + 8);
		output.writeUInt32BE(table.origLength, record + 12);
		data.copy(output, offset);
		offset += pad4(table.origLength);
	});
	return output;
}
