// Words for the spread and the grade, shared by the pages, the report and its PDF.
import { capitalise, formatCount, formatList, MISSING } from '../format';
import { GRADE_REQUIREMENTS, type GradeAssessment, type MeasurementGrade } from './grade';
import type { Spread } from './spread';

export const GRADE_NAMES: Record<MeasurementGrade, string> = { survey: 'survey', engineering: 'engineering', precision: 'precision' };

const plural = (n: number, one: string, many: string) => `${formatCount(n)} ${n === 1 ? one : many}`;

/** "2 source positions, 3 microphone positions, 3 source–microphone combinations". */
export function countsPhrase(assessment: GradeAssessment): string {
	const { sources, microphones, combinations } = assessment.counts;
	return [
		plural(sources, 'source position', 'source positions'),
		plural(microphones, 'microphone position', 'microphone positions'),
		plural(combinations, 'source–microphone combination', 'source–microphone combinations')
	].join(', ');
}

/** "Survey grade" / "Below the survey grade", named after ISO 3382-2:2008 Table 1. */
export function gradeHeadline(assessment: GradeAssessment): string {
	return assessment.grade === null ? 'Below the survey grade of ISO 3382-2' : `${capitalise(GRADE_NAMES[assessment.grade])} grade (ISO 3382-2)`;
}

/** Sentences: what the visit has, what the next grade lacks, and the assumptions about labels. */
export function gradeSentences(assessment: GradeAssessment): string[] {
	const sentences = [`${capitalise(countsPhrase(assessment))}.`];
	if (assessment.next) {
		// "engineering needs 2 source positions; this visit has 1" → "2 source positions (this visit has 1)".
		const lacks = assessment.next.shortfalls.map((s) => s.replace(/^\w+ needs /, '').replace(/; (this visit has \d+)$/, ' ($1)'));
		sentences.push(`For the ${GRADE_NAMES[assessment.next.grade]} grade: ${formatList(lacks)}.`);
	} else sentences.push('This is the highest grade of ISO 3382-2.');
	return [...sentences, ...assessment.assumptions];
}

/** The requirements of each grade, as ISO 3382-2:2008 Table 1 gives them (see GRADE_REQUIREMENTS). */
export function gradeTable(): { grade: MeasurementGrade; sources: number; microphones: number; combinations: number }[] {
	return (Object.keys(GRADE_REQUIREMENTS) as MeasurementGrade[]).map((grade) => ({ grade, ...GRADE_REQUIREMENTS[grade] }));
}

/** "0.60 ± 0.25" with the value's own formatter; the mean alone below two values; — without one. */
export function formatSpread(spread: Spread | undefined, format: (value: number) => string): string {
	if (!spread || spread.mean === null) return MISSING;
	return spread.halfWidth === null ? format(spread.mean) : `${format(spread.mean)} ± ${format(spread.halfWidth)}`;
}
