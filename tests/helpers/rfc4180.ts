// Reading CSV back in tests, independently of the writer under test.
import { expect } from 'vitest';

/**
 * A small RFC 4180 §2 reader: records end in CRLF (rule 1, the last one optionally), fields
 * are split by commas (rule 4), a field in double quotes may hold commas, CR, LF (rule 6) and
 * doubled quotes for a quote (rule 7). Throws on a bare LF or a stray quote, which RFC 4180 forbids.
 */
export function parseCsv(text: string): string[][] {
	const records: string[][] = [];
	let record: string[] = [];
	let field = '';
	let i = 0;
	let quoted = false;
	while (i < text.length) {
		const c = text[i];
		if (quoted) {
			if (c === '"' && text[i + 1] === '"') {
				field += '"';
				i += 2;
			} else if (c === '"') {
				quoted = false;
				i++;
				if (i < text.length && text[i] !== ',' && text[i] !== '\r') throw new Error(`character after a closing quote at ${i}`);
			} else {
				field += c;
				i++;
			}
		} else if (c === '"') {
			if (field !== '') throw new Error(`quote inside an unquoted field at ${i}`);
			quoted = true;
			i++;
		} else if (c === ',') {
			record.push(field);
			field = '';
			i++;
		} else if (c === '\r' && text[i + 1] === '\n') {
			record.push(field);
			records.push(record);
			record = [];
			field = '';
			i += 2;
		} else if (c === '\n' || c === '\r') {
			throw new Error(`bare line break outside quotes at ${i}`);
		} else {
			field += c;
			i++;
		}
	}
	if (quoted) throw new Error('unterminated quoted field');
	if (field !== '' || record.length > 0) records.push([...record, field]);
	return records;
}

/** Rows as objects keyed by the header, for reading columns by name. */
export function csvTable(text: string): Record<string, string>[] {
	const [header, ...rows] = parseCsv(text);
	for (const row of rows) expect(row).toHaveLength(header.length); // RFC 4180 §2 rule 4: same field count
	return rows.map((row) => Object.fromEntries(header.map((name, i) => [name, row[i]])));
}
