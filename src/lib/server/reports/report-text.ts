// The report's fixed wording: how the numbers were measured, and the safety cautions.
import type { ComparisonModel } from '../../results/types';
import { formatBand } from '../../format';
import type { GradeAssessment } from '../../results/grade';
import { countsPhrase, GRADE_NAMES } from '../../results/statistics-text';
import type { ReportBandRow } from './report-data';

/** Basis named for a target when the report does not say otherwise. */
export const DEFAULT_TARGET_BASIS = 'ITU-R BS.1116-3';

function listInWords(items: readonly string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function bandSpan(rows: readonly ReportBandRow[]): string {
	if (rows.length === 0) return '63 Hz to 8 kHz';
	return `${formatBand(rows[0].centerHz)} to ${formatBand(rows[rows.length - 1].centerHz)}`;
}

/** "the positions compared (2 source positions, …) reach its survey grade", per visit when the grades differ. */
export function gradeClause(comparison: Pick<ComparisonModel, 'matchedStatistics'>): string {
	const { baseline, treated } = comparison.matchedStatistics;
	const name = (g: GradeAssessment) => (g.grade === null ? 'none of its grades' : `its ${GRADE_NAMES[g.grade]} grade`);
	if (baseline.grade.grade === treated.grade.grade) return `the positions compared (${countsPhrase(treated.grade)}) reach ${name(treated.grade)}`;
	return `the positions compared reach ${name(baseline.grade)} before (${countsPhrase(baseline.grade)}) and ${name(treated.grade)} after (${countsPhrase(treated.grade)})`;
}

/** One paragraph per point of method, stating what this comparison actually rests on. */
export function methodParagraphs(comparison: ComparisonModel, rows: readonly ReportBandRow[], targetBasis: string): string[] {
	const matched = comparison.matchedPositions;
	const paragraphs = [
		`Measured following ISO 3382-2; ${gradeClause(comparison)}. Impulse responses come from exponential sine sweeps played and recorded in the room, or from impulse responses uploaded as such.`,
		`Results are given in octave bands from ${bandSpan(rows)}, filtered as specified for band filters in IEC 61260-1. Reverberation time is T30, evaluated from the decay curve obtained by Schroeder backward integration; where the dynamic range of a band did not allow T30, T20 is given instead and marked.`,
		matched.length === 0
			? 'No measurement position was measured in both visits, so no spatial average could be compared.'
			: `Each value is the spatial average over the ${matched.length} position${matched.length === 1 ? '' : 's'} measured in both visits: ${listInWords(matched)}.`
	];
	const excluded: string[] = [];
	if (comparison.baselineOnly.length > 0) excluded.push(`${listInWords(comparison.baselineOnly)} (before only)`);
	if (comparison.treatedOnly.length > 0) excluded.push(`${listInWords(comparison.treatedOnly)} (after only)`);
	if (excluded.length > 0) paragraphs.push(`Positions measured in one visit only are left out of the comparison: ${excluded.join('; ')}.`);
	paragraphs.push(
		comparison.target.length > 0
			? `The target reverberation time and its tolerance follow ${targetBasis}.`
			: 'No target reverberation time was set for this room.'
	);
	return paragraphs;
}

export const SAFETY_PARAGRAPHS: readonly string[] = [
	'Treatment work follows local building and fire codes: mounting heavy panels, bass traps or ceiling clouds to the building structure needs fixings rated for the load, and materials used in occupied rooms need the fire rating those codes require. Consult licensed professionals before installing.',
	'Measurement sweeps are loud. Set playback levels with care, keep people out of the room during a measurement or give them hearing protection, and protect your own hearing.'
];
