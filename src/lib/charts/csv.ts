// CSV text for the chart downloads, written to RFC 4180 (Shafranovich, "Common Format and MIME
// Type for Comma-Separated Values (CSV) Files", IETF, 2005). Every CSV export goes through
// `csvField`, which also neutralises cells a spreadsheet would run as formulas.

export type CsvCell = string | number | null;

/** Characters that force a field into double quotes (RFC 4180 §2, rule 6). */
const NEEDS_QUOTES = /[",\r\n]/;

/** First characters that make a spreadsheet read a cell as a formula (OWASP, "CSV Injection"). */
const FORMULA_START = /^[=+\-@\t\r]/;
/** A plain decimal number written as text: a spreadsheet reads it as that number, not a formula. */
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * A text cell a spreadsheet would run as a formula (`=HYPERLINK(…)`, `@SUM(…)`, `-2+3`) gets a
 * leading single quote, so it is shown as text (OWASP, "CSV Injection"). Numbers, and text
 * that is a plain number ("-12.5"), stay numbers.
 */
export function neutraliseFormula(value: string): string {
	return FORMULA_START.test(value) && !PLAIN_NUMBER.test(value) ? `'${value}` : value;
}

/**
 * One field: null and non-finite numbers become empty fields; text that would run as a formula
 * is neutralised; quotes are doubled inside quoted fields (§2, rule 7).
 */
export function csvField(value: CsvCell): string {
	if (value === null) return '';
	if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
	if (typeof value !== 'string') throw new TypeError(`CSV cell must be a string, number or null, got ${typeof value}`);
	const text = neutraliseFormula(value);
	return NEEDS_QUOTES.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** Header line then one line per row, lines ended by CRLF (RFC 4180 §2, rules 1–3). */
export function toCsv(headers: string[], rows: CsvCell[][]): string {
	const width = headers.length;
	if (width === 0) throw new RangeError('a CSV needs at least one column header');
	const lines = [headers.map(csvField).join(',')];
	rows.forEach((row, i) => {
		// §2 rule 4: every line has the same number of fields as the header.
		if (row.length !== width) throw new RangeError(`CSV row ${i} has ${row.length} fields, the header has ${width}`);
		lines.push(row.map(csvField).join(','));
	});
	return lines.join('\r\n') + '\r\n';
}
