// The measurement grade a visit reaches — survey, engineering or precision, ISO 3382-2:2008
// Table 1 — from its numbers of source positions, microphone positions and source–microphone
// combinations, with the reason each higher grade is not reached.

export const MEASUREMENT_GRADES = ['survey', 'engineering', 'precision'] as const;
export type MeasurementGrade = (typeof MEASUREMENT_GRADES)[number];

export interface GradeRequirement {
	sources: number;
	microphones: number;
	combinations: number;
}

/**
 * Minimum numbers per grade, ISO 3382-2:2008 Table 1 (from memory): survey 1 source, 2 microphone positions, 2 combinations; engineering 2,
 * 2, 6; precision 2, 3, 12. The table's row of decays per position (1, 2, 3) is for the
 * interrupted-noise method and does not apply to impulse responses; its footnotes are not
 * modelled, nor the spacing rules of the same clause (distances between positions and from
 * surfaces), which the grade does not check.
 */
export const GRADE_REQUIREMENTS: Readonly<Record<MeasurementGrade, GradeRequirement>> = {
	survey: { sources: 1, microphones: 2, combinations: 2 },
	engineering: { sources: 2, microphones: 2, combinations: 6 },
	precision: { sources: 2, microphones: 3, combinations: 12 }
};

export interface PositionCounts {
	sources: number;
	microphones: number;
	/** Distinct source–microphone pairs; repeats of a pair count once. */
	combinations: number;
}

/** What a position needs for counting (a stored position row will do). */
export interface LabelledPosition {
	/** The position's own label (P1…). */
	label: string;
	sourceLabel: string | null;
	micLabel: string | null;
}

/** Source label given to positions that have none. */
const UNNAMED_SOURCE = '\u0000unnamed source';

/**
 * Counts distinct sources, microphone positions and pairs, labels compared trimmed and without
 * regard to case. Unlabelled positions are counted conservatively and said so in `assumptions`:
 * positions without a source label share one source position; a position without a microphone
 * label is its own microphone position (a position row is one placement).
 */
export function countPositions(positions: readonly LabelledPosition[]): PositionCounts & { assumptions: string[] } {
	const key = (label: string) => label.trim().toLowerCase();
	const sources = new Set<string>();
	const microphones = new Set<string>();
	const pairs = new Set<string>();
	let noSource = 0;
	let noMic = 0;
	for (const p of positions) {
		const source = p.sourceLabel?.trim() ? key(p.sourceLabel) : UNNAMED_SOURCE;
		if (source === UNNAMED_SOURCE) noSource++;
		const mic = p.micLabel?.trim() ? `mic:${key(p.micLabel)}` : `position:${key(p.label)}`;
		if (!p.micLabel?.trim()) noMic++;
		sources.add(source);
		microphones.add(mic);
		pairs.add(JSON.stringify([source, mic]));
	}
	const assumptions: string[] = [];
	const have = (n: number) => (n === 1 ? '1 position has' : `${n} positions have`);
	if (noSource > 0) assumptions.push(`${have(noSource)} no source label; counted as one unnamed source position.`);
	if (noMic > 0) assumptions.push(`${have(noMic)} no microphone label; each such position is counted as its own microphone position.`);
	return { sources: sources.size, microphones: microphones.size, combinations: pairs.size, assumptions };
}

const NOUNS: Record<keyof GradeRequirement, [string, string]> = {
	sources: ['source position', 'source positions'],
	microphones: ['microphone position', 'microphone positions'],
	combinations: ['source–microphone combination', 'source–microphone combinations']
};

const counted = (n: number, [one, many]: [string, string]) => `${n} ${n === 1 ? one : many}`;

/** Why a grade is not reached, one sentence per missing requirement: "engineering needs 2 source positions; this visit has 1". */
export function gradeShortfalls(grade: MeasurementGrade, counts: PositionCounts): string[] {
	const needed = GRADE_REQUIREMENTS[grade];
	return (Object.keys(NOUNS) as (keyof GradeRequirement)[])
		.filter((what) => counts[what] < needed[what])
		.map((what) => `${grade} needs ${counted(needed[what], NOUNS[what])}; this visit has ${counts[what]}`);
}

export interface GradeAssessment {
	counts: PositionCounts;
	/** The highest grade reached, null below survey. */
	grade: MeasurementGrade | null;
	/** Every grade with what it lacks (empty when reached). */
	grades: { grade: MeasurementGrade; reached: boolean; shortfalls: string[] }[];
	/** The next grade up and what it lacks; null at precision. */
	next: { grade: MeasurementGrade; shortfalls: string[] } | null;
	assumptions: string[];
}

function validCounts(counts: PositionCounts): void {
	for (const what of Object.keys(NOUNS) as (keyof GradeRequirement)[]) {
		if (!(Number.isInteger(counts[what]) && counts[what] >= 0)) throw new RangeError(`${NOUNS[what][1]} must be a whole number ≥ 0, got ${counts[what]}`);
	}
	if (counts.combinations > counts.sources * counts.microphones) {
		throw new RangeError(`${counts.combinations} combinations cannot come from ${counts.sources} sources and ${counts.microphones} microphone positions`);
	}
}

/** The grade reached by the counts: every requirement of a grade must be met. */
export function gradeFromCounts(counts: PositionCounts, assumptions: string[] = []): GradeAssessment {
	validCounts(counts);
	const grades = MEASUREMENT_GRADES.map((grade) => {
		const shortfalls = gradeShortfalls(grade, counts);
		return { grade, reached: shortfalls.length === 0, shortfalls };
	});
	// The table's grades nest (each asks at least as much as the one below), so the highest reached is the grade.
	const reached = grades.filter((g) => g.reached);
	const grade = reached.length ? reached[reached.length - 1].grade : null;
	const nextIndex = grade === null ? 0 : MEASUREMENT_GRADES.indexOf(grade) + 1;
	const next = nextIndex < grades.length ? { grade: grades[nextIndex].grade, shortfalls: grades[nextIndex].shortfalls } : null;
	return { counts: { sources: counts.sources, microphones: counts.microphones, combinations: counts.combinations }, grade, grades, next, assumptions };
}

/** The grade of a visit from its positions (those with an analysed capture). */
export function gradeVisit(positions: readonly LabelledPosition[]): GradeAssessment {
	const { assumptions, ...counts } = countPositions(positions);
	return gradeFromCounts(counts, assumptions);
}
