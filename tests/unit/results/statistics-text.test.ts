import { describe, expect, it } from 'vitest';
import { gradeFromCounts } from '../../../src/lib/results/grade';
import { spreadOf } from '../../../src/lib/results/spread';
import { formatSpread, gradeHeadline, gradeSentences, gradeTable } from '../../../src/lib/results/statistics-text';
import { formatSeconds } from '../../../src/lib/format';

describe('grade wording', () => {
	it('names the grade, the counts and what the next grade lacks (ISO 3382-2:2008 Table 1, from memory)', () => {
		// Two loudspeakers, three seats, three pairs: survey (1/2/2) reached, engineering (2/2/6) lacks 3 combinations.
		const survey = gradeFromCounts({ sources: 2, microphones: 3, combinations: 3 });
		expect(gradeHeadline(survey)).toBe('Survey grade (ISO 3382-2)');
		expect(gradeSentences(survey)).toEqual([
			'2 source positions, 3 microphone positions, 3 source–microphone combinations.',
			'For the engineering grade: 6 source–microphone combinations (this visit has 3).'
		]);
	});

	it('says so below survey and at precision', () => {
		const none = gradeFromCounts({ sources: 1, microphones: 1, combinations: 1 });
		expect(gradeHeadline(none)).toBe('Below the survey grade of ISO 3382-2');
		expect(gradeSentences(none)[1]).toBe('For the survey grade: 2 microphone positions (this visit has 1) and 2 source–microphone combinations (this visit has 1).');
		const precision = gradeFromCounts({ sources: 2, microphones: 6, combinations: 12 });
		expect(gradeSentences(precision)[1]).toBe('This is the highest grade of ISO 3382-2.');
	});

	it('lists the three grades with their minimum numbers', () => {
		expect(gradeTable().map((r) => [r.grade, r.sources, r.microphones, r.combinations])).toEqual([
			['survey', 1, 2, 2],
			['engineering', 2, 2, 6],
			['precision', 2, 3, 12]
		]);
	});
});

describe('formatSpread', () => {
	it('writes mean ± half-width, the mean alone for one value, a dash for none', () => {
		// 0.5, 0.6, 0.7 s: mean 0.60, half-width t(0.975, 2)·0.1/√3 = 4.303·0.0577 = 0.248 s (NIST t table).
		expect(formatSpread(spreadOf([0.5, 0.6, 0.7]), formatSeconds)).toBe('0.60 ± 0.25');
		expect(formatSpread(spreadOf([0.5]), formatSeconds)).toBe('0.50');
		expect(formatSpread(spreadOf([null]), formatSeconds)).toBe('—');
		expect(formatSpread(undefined, formatSeconds)).toBe('—');
	});
});
