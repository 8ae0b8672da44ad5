import { describe, expect, it } from 'vitest';
import {
	formatFrequencyRange,
	formatPublishedDate,
	formatSigned,
	formatTargetRange,
	formatTimeRange,
	splitParagraphs,
	verdictWords
} from '../../../src/lib/server/reports/format';

const MINUS = '\u2212';

describe('formatFrequencyRange', () => {
	const cases: [number, number, string][] = [
		[42, 48, '42–48 Hz'],
		[2000, 4000, '2–4 kHz'],
		[800, 1250, '800 Hz–1.25 kHz'],
		[31.5, 63, '31.5–63 Hz']
	];
	it.each(cases)('%d–%d → %s', (lo, hi, expected) => {
		expect(formatFrequencyRange(lo, hi)).toBe(expected);
	});
});

describe('formatTimeRange', () => {
	const cases: [number | null, number | null, string][] = [
		[20, 120, '20–120 ms'],
		[35, null, 'from 35 ms'],
		[null, 80, 'up to 80 ms'],
		[null, null, '—']
	];
	it.each(cases)('%s…%s → %s', (lo, hi, expected) => {
		expect(formatTimeRange(lo, hi)).toBe(expected);
	});
});

describe('formatSigned', () => {
	const cases: [number | null, number, string][] = [
		[0.123, 2, '+0.12'],
		[-0.321, 2, `${MINUS}0.32`],
		[0.004, 2, '0.00'], // rounds to zero: no sign
		[-0.004, 2, '0.00'],
		[-47.3, 0, `${MINUS}47`],
		[null, 2, '—']
	];
	it.each(cases)('%s with %d decimals → %s', (value, decimals, expected) => {
		expect(formatSigned(value, decimals)).toBe(expected);
	});
});

describe('small formats', () => {
	it('writes a target range with two decimals', () => {
		expect(formatTargetRange(0.158, 0.3594)).toBe('0.16–0.36');
	});

	it('names verdicts in plain words', () => {
		expect(verdictWords('inside')).toBe('within target');
		expect(verdictWords('above')).toBe('above target');
		expect(verdictWords('below')).toBe('below target');
		expect(verdictWords('unknown')).toBe('not measured');
		expect(verdictWords(null)).toBe('—');
	});

	it('reads the publication date in UTC', () => {
		expect(formatPublishedDate(new Date('2025-03-10T23:30:00Z'))).toBe('10 March 2025');
		expect(formatPublishedDate(new Date('2025-03-10T23:30:00-02:00'))).toBe('11 March 2025');
	});
});

describe('splitParagraphs', () => {
	const cases: [string, string[]][] = [
		['One.\n\nTwo.', ['One.', 'Two.']],
		['One\nstill one.\r\n\r\nTwo.', ['One\nstill one.', 'Two.']],
		['  \n \n\t', []],
		['A.\n  \n\n\nB.', ['A.', 'B.']]
	];
	it.each(cases)('%j', (text, expected) => {
		expect(splitParagraphs(text)).toEqual(expected);
	});
});
