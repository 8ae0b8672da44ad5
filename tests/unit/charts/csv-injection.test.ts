import { describe, expect, it } from 'vitest';
import { csvField, neutraliseFormula, toCsv } from '../../../src/lib/charts/csv';
import { planBuilds, planCutList, separateParts } from '../../../src/lib/plans/build';
import { cutListCsv, cutPieceRows } from '../../../src/lib/plans/exports';
import { item, POROUS, STOCK } from '../plans/fixtures';
import { parseCsv } from '../../helpers/rfc4180';

// OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): a cell that begins
// with =, +, -, @, tab (0x09) or carriage return (0x0D) is run as a formula by spreadsheet
// programs; prepend a single quote so it is shown as text, and quote the field as RFC 4180 asks.

describe('neutraliseFormula', () => {
	it.each([
		['=HYPERLINK("http://example.invalid","open")', `'=HYPERLINK("http://example.invalid","open")`],
		['+1+cmd', "'+1+cmd"],
		['-2+3', "'-2+3"],
		['@SUM(A1:A9)', "'@SUM(A1:A9)"],
		['\t=1', "'\t=1"],
		['\r=1', "'\r=1"]
	])('%j gets a leading quote', (value, expected) => {
		expect(neutraliseFormula(value)).toBe(expected);
	});

	it.each(['-12.5', '+3', '-0.25e-3', '42', 'Living room', 'a=b', "it's", ''])('%j is left as it is', (value) => {
		expect(neutraliseFormula(value)).toBe(value);
	});
});

describe('csvField', () => {
	it('keeps numbers as numbers, negative ones included', () => {
		expect(csvField(-12.5)).toBe('-12.5');
		expect(csvField(-0)).toBe('0');
	});

	it('neutralises, then quotes a field that holds quotes, commas or line breaks (RFC 4180 §2 rules 6–7)', () => {
		expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
		expect(csvField('@a,b')).toBe(`"'@a,b"`);
		expect(csvField('\r=1')).toBe(`"'\r=1"`);
	});

	it('applies to header cells and rows alike, and the file reads back to the neutralised text', () => {
		const text = toCsv(['=label', 'value'], [['+note', -3], ['-4', '=1+1']]);
		expect(parseCsv(text)).toEqual([
			["'=label", 'value'],
			["'+note", '-3'],
			['-4', "'=1+1"]
		]);
	});
});

describe('an export through the shared writer', () => {
	it('the cut list CSV neutralises a piece named like a formula', () => {
		const { builds } = planBuilds([item({ label: '=HYPERLINK("http://example.invalid")', quantity: 1, params: POROUS })]);
		const cut = planCutList(builds, STOCK, 3);
		if (!cut.ok) throw new Error(cut.error);
		const rows = parseCsv(cutListCsv(cutPieceRows(cut.cutList, separateParts(builds)), 'mm'));
		const cells = rows.slice(1).flat();
		const named = cells.filter((c) => c.includes('HYPERLINK'));
		expect(named.length).toBeGreaterThan(0);
		// No cell starts with a formula character unless it is a plain number.
		expect(cells.filter((c) => /^[=+\-@\t\r]/.test(c) && !/^[+-]?\d+(\.\d*)?$/.test(c))).toEqual([]);
		expect(named.every((c) => c.startsWith("'=HYPERLINK"))).toBe(true);
	});
});
