import { describe, expect, it } from 'vitest';
import { csvField, toCsv, type CsvCell } from '../../../src/lib/charts/csv';
import { runPython } from './helpers/python';

describe('csvField (RFC 4180 §2)', () => {
	// RFC 4180 §2 rule 6: fields containing line breaks (CRLF), double quotes or commas are enclosed
	// in double quotes; rule 7: a double quote inside a quoted field is escaped by another double quote.
	const cases: { value: CsvCell; expected: string; why: string }[] = [
		{ value: 'plain', expected: 'plain', why: 'no special characters: not quoted (rule 5, quoting optional)' },
		{ value: 'a,b', expected: '"a,b"', why: 'comma (rule 6)' },
		{ value: 'say "hi"', expected: '"say ""hi"""', why: 'quotes doubled (rule 7)' },
		{ value: 'line1\r\nline2', expected: '"line1\r\nline2"', why: 'CRLF (rule 6)' },
		{ value: 'line1\nline2', expected: '"line1\nline2"', why: 'bare LF is a line break too' },
		{ value: 'cr\ronly', expected: '"cr\ronly"', why: 'bare CR' },
		{ value: ' spaced ', expected: ' spaced ', why: 'spaces are part of a field and not trimmed (rule 4)' },
		{ value: '', expected: '', why: 'empty string' },
		{ value: null, expected: '', why: 'null → empty field' },
		{ value: -12.5, expected: '-12.5', why: 'numbers as plain ASCII' },
		{ value: 0, expected: '0', why: 'zero is not empty' },
		{ value: Number.NaN, expected: '', why: 'NaN is not a number to write' },
		{ value: Number.POSITIVE_INFINITY, expected: '', why: 'infinity neither' }
	];
	it.each(cases)('$why', ({ value, expected }) => {
		expect(csvField(value)).toBe(expected);
	});

	it('rejects values that are not cells', () => {
		expect(() => csvField({} as unknown as CsvCell)).toThrow(TypeError);
	});
});

describe('toCsv', () => {
	it('separates records with CRLF and ends the last one with CRLF (RFC 4180 §2 rules 1–3)', () => {
		expect(toCsv(['f (Hz)', 'dB'], [[125, -3.2], [250, null]])).toBe('f (Hz),dB\r\n125,-3.2\r\n250,\r\n');
	});

	it('needs every row as wide as the header (RFC 4180 §2 rule 4)', () => {
		expect(() => toCsv(['a', 'b'], [[1]])).toThrow(/row 0 has 1 fields, the header has 2/);
		expect(() => toCsv([], [])).toThrow(/at least one column/);
	});

	it("reads back field for field with Python's csv module (an independent RFC 4180 reader)", () => {
		const headers = ['label', 'note', 'value'];
		const rows: CsvCell[][] = [
			['Pos 1, "front"', 'modal peak\r\n42–48 Hz', -6.5],
			['µ-mic °C', '', null],
			['plain', 'a"b', 1e-7]
		];
		const parsed = runPython<string[][]>(
			'import csv, io, json, sys\ntext = json.load(sys.stdin)\nprint(json.dumps(list(csv.reader(io.StringIO(text, newline="")))))',
			toCsv(headers, rows)
		);
		expect(parsed).toEqual([headers, ['Pos 1, "front"', 'modal peak\r\n42–48 Hz', '-6.5'], ['µ-mic °C', '', ''], ['plain', 'a"b', '1e-7']]);
	});
});
