import { describe, expect, it } from 'vitest';
import { countPositions, GRADE_REQUIREMENTS, gradeFromCounts, gradeVisit, type LabelledPosition } from '../../../src/lib/results/grade';

// ISO 3382-2:2008 Table 1, minimum numbers (from memory): survey 1 source, 2 microphone
// positions, 2 combinations; engineering 2, 2, 6; precision 2, 3, 12. Each boundary is tried
// just at and just below.

describe('GRADE_REQUIREMENTS: the table as stated', () => {
	it('holds the three grades', () => {
		expect(GRADE_REQUIREMENTS).toEqual({
			survey: { sources: 1, microphones: 2, combinations: 2 },
			engineering: { sources: 2, microphones: 2, combinations: 6 },
			precision: { sources: 2, microphones: 3, combinations: 12 }
		});
	});
});

describe('gradeFromCounts: every boundary, at and just below', () => {
	it.each([
		// survey
		{ counts: { sources: 1, microphones: 2, combinations: 2 }, grade: 'survey' },
		{ counts: { sources: 1, microphones: 1, combinations: 1 }, grade: null, shortfall: 'survey needs 2 microphone positions; this visit has 1' },
		{ counts: { sources: 1, microphones: 2, combinations: 1 }, grade: null, shortfall: 'survey needs 2 source–microphone combinations; this visit has 1' },
		{ counts: { sources: 0, microphones: 0, combinations: 0 }, grade: null, shortfall: 'survey needs 1 source position; this visit has 0' },
		// engineering
		{ counts: { sources: 2, microphones: 3, combinations: 6 }, grade: 'engineering' },
		{ counts: { sources: 2, microphones: 3, combinations: 5 }, grade: 'survey', shortfall: 'engineering needs 6 source–microphone combinations; this visit has 5' },
		{ counts: { sources: 1, microphones: 6, combinations: 6 }, grade: 'survey', shortfall: 'engineering needs 2 source positions; this visit has 1' },
		{ counts: { sources: 6, microphones: 1, combinations: 6 }, grade: null, shortfall: 'engineering needs 2 microphone positions; this visit has 1' },
		// precision
		{ counts: { sources: 2, microphones: 6, combinations: 12 }, grade: 'precision' },
		{ counts: { sources: 2, microphones: 6, combinations: 11 }, grade: 'engineering', shortfall: 'precision needs 12 source–microphone combinations; this visit has 11' },
		{ counts: { sources: 6, microphones: 2, combinations: 12 }, grade: 'engineering', shortfall: 'precision needs 3 microphone positions; this visit has 2' },
		{ counts: { sources: 1, microphones: 12, combinations: 12 }, grade: 'survey', shortfall: 'precision needs 2 source positions; this visit has 1' }
	] as const)('$counts.sources sources, $counts.microphones microphones, $counts.combinations combinations → $grade', ({ counts, grade, ...rest }) => {
		const assessment = gradeFromCounts(counts);
		expect(assessment.grade).toBe(grade);
		if ('shortfall' in rest) {
			const all = assessment.grades.flatMap((g) => g.shortfalls);
			expect(all).toContain(rest.shortfall);
		}
	});

	it('says what the next grade up needs', () => {
		const assessment = gradeFromCounts({ sources: 1, microphones: 4, combinations: 4 });
		expect(assessment.grade).toBe('survey');
		expect(assessment.next).toEqual({
			grade: 'engineering',
			shortfalls: ['engineering needs 2 source positions; this visit has 1', 'engineering needs 6 source–microphone combinations; this visit has 4']
		});
		expect(gradeFromCounts({ sources: 3, microphones: 4, combinations: 12 }).next).toBeNull();
	});

	it('refuses counts that cannot be', () => {
		expect(() => gradeFromCounts({ sources: 1, microphones: 2, combinations: 3 })).toThrow(/cannot come from/);
		expect(() => gradeFromCounts({ sources: 1.5, microphones: 2, combinations: 2 })).toThrow(/whole number/);
	});
});

describe('gradeVisit: counting labelled positions', () => {
	const row = (label: string, sourceLabel: string | null, micLabel: string | null): LabelledPosition => ({ label, sourceLabel, micLabel });

	it('two sources at three microphones each: 6 combinations, engineering', () => {
		const positions = ['M1', 'M2', 'M3'].flatMap((mic) => ['S1', 'S2'].map((source) => row(`${source}${mic}`, source, mic)));
		const assessment = gradeVisit(positions);
		expect(assessment.counts).toEqual({ sources: 2, microphones: 3, combinations: 6 });
		expect(assessment.grade).toBe('engineering');
		expect(assessment.assumptions).toEqual([]);
	});

	it('a repeated pair counts once; labels match regardless of case and spaces', () => {
		const counts = countPositions([row('P1', 'S1', 'M1'), row('P2', ' s1 ', 'm1'), row('P3', 'S1', 'M2')]);
		expect(counts).toMatchObject({ sources: 1, microphones: 2, combinations: 2 });
	});

	it('unlabelled sources share one source; unlabelled microphones are their positions — and it is said', () => {
		const assessment = gradeVisit([row('P1', null, null), row('P2', null, null), row('P3', '', 'M9')]);
		expect(assessment.counts).toEqual({ sources: 1, microphones: 3, combinations: 3 });
		expect(assessment.grade).toBe('survey');
		expect(assessment.assumptions).toEqual([
			'3 positions have no source label; counted as one unnamed source position.',
			'2 positions have no microphone label; each such position is counted as its own microphone position.'
		]);
		expect(assessment.next?.shortfalls).toContain('engineering needs 2 source positions; this visit has 1');
	});

	it('a visit with no positions reaches no grade', () => {
		expect(gradeVisit([]).grade).toBeNull();
	});
});
