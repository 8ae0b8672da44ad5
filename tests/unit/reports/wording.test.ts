import { describe, expect, it } from 'vitest';
import { formatPublishedDate, splitParagraphs, verdictWords } from '../../../src/lib/server/reports/wording';

describe('wording', () => {
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
