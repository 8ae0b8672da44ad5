// Plain-words sentences about a comparison, for people without acoustics training. Every
// sentence is generated from the numbers in the model; the order is fixed: the overall picture,
// then bands from low to high, then early reflections, then which positions were compared.
import type { BandDifference } from '../analysis/compare';
import { sameBand, type BandVerdict } from '../analysis/targets';
import { capitalise, formatCount, formatDb, formatHz, formatList, formatPercent, formatSeconds } from '../format';
import { bandTimesOf, MID_FREQUENCY_BANDS_HZ, midFrequencyReverberation, reverberationOf } from './reverberation';
import { reverberationJudgement } from './statistics';
import type { DetectedReflection } from '../analysis/reflections';
import type { ComparisonModel, PositionResult, ReverberationValue } from './types';

/** A band's reverberation change worth a sentence: the JND of reverberation time, 5 % (ISO 3382-1:2009 Annex A, from memory). */
export const NOTABLE_REVERBERATION_CHANGE = 0.05;
/** C80 change worth a sentence: its JND, 1 dB (ISO 3382-1:2009 Annex A, from memory). */
export const NOTABLE_CLARITY_CHANGE_DB = 1;
export const MAX_SUMMARY_SENTENCES = 8;
/**
 * Reflections counted: those within 15 ms of the direct sound and less than 10 dB below it, the ones
 * ITU-R BS.1116-3 asks a listening room to keep at least 10 dB down (from memory).
 */
export const STRONG_REFLECTION = { withinMs: 15, belowDirectDb: 10 } as const;
/** Range over which the C80 change is averaged for the sentence about clarity. */
const CLARITY_RANGE_HZ = { low: 500, high: 2000 };

const TERM: Record<'t30S' | 't20S', string> = {
	t30S: 'reverberation time (T30)',
	t20S: 'reverberation time (T20, as T30 could not be measured reliably)'
};
const MIXED_TERM = 'reverberation time (T30, and T20 where T30 could not be measured reliably)';

interface BandChange {
	band: BandDifference;
	before: ReverberationValue & { valueS: number };
	after: ReverberationValue & { valueS: number };
	relativeChange: number;
	verdictBefore: BandVerdict | undefined;
	verdictAfter: BandVerdict | undefined;
}

type MissingSide = 'baseline' | 'treated' | 'both';

const MISSING_WHERE: Record<MissingSide, string> = {
	baseline: 'in the baseline visit',
	treated: 'in the treated visit',
	both: 'in either visit'
};

const mean = (values: number[]) => values.reduce((sum, v) => sum + v, 0) / values.length;

function changeVerb(before: number, after: number): string {
	return after < before ? 'fell' : 'rose';
}

function verdictAt(verdicts: BandVerdict[], centerHz: number): BandVerdict | undefined {
	return verdicts.find((v) => sameBand(v.centerHz, centerHz));
}

/** Reverberation in the middle frequencies: T_mid of each visit, T30 per band, else T20. */
function midFrequencySentence(model: ComparisonModel): string | null {
	const before = midFrequencyReverberation(bandTimesOf(model.differences, 'before'));
	const after = midFrequencyReverberation(bandTimesOf(model.differences, 'after'));
	if (before === null || after === null) return null;
	const used = new Set([...before.metrics, ...after.metrics]);
	const term = used.has('t20S') ? (used.has('t30S') ? MIXED_TERM : TERM.t20S) : TERM.t30S;
	const [b, a] = [before.valueS, after.valueS];
	const change = (a - b) / b;
	const opening = `In the middle frequencies (${formatHz(MID_FREQUENCY_BANDS_HZ[0])} and ${formatHz(MID_FREQUENCY_BANDS_HZ[1])}) the ${term}`;
	if (Math.abs(change) < NOTABLE_REVERBERATION_CHANGE) {
		return `${opening} stayed about the same: ${formatSeconds(b)} s before, ${formatSeconds(a)} s after.`;
	}
	return `${opening} ${changeVerb(b, a)} by ${formatPercent(Math.abs(change))} %, from ${formatSeconds(b)} s to ${formatSeconds(a)} s.`;
}

function targetCountSentence(model: ComparisonModel): string | null {
	const judged = [...model.verdicts.before, ...model.verdicts.after].some((v) => v.verdict !== 'unknown');
	if (model.target.length === 0 || !judged) return null;
	const inside = (verdicts: BandVerdict[]) => verdicts.filter((v) => v.verdict === 'inside').length;
	const before = inside(model.verdicts.before);
	const after = inside(model.verdicts.after);
	const targets = model.target.map((t) => t.targetS);
	const single = targets.every((t) => Math.abs(t - targets[0]) < 0.005) ? ` (${formatSeconds(targets[0])} s)` : '';
	const total = model.target.length;
	const bands = total === 1 ? 'frequency band' : 'frequency bands';
	if (before === after) {
		if (after === 0 && total === 1) return `The frequency band with a target for this room${single} is outside it, before and after.`;
		if (after === 0) return `None of the ${total} ${bands} is inside the target for this room${single}, before or after.`;
		return `${after} of ${total} ${bands} ${after === 1 ? 'is' : 'are'} inside the target for this room${single}, as before.`;
	}
	return `${after} of ${total} ${bands} ${after === 1 ? 'is' : 'are'} now inside the target for this room${single}, against ${before} before.`;
}

function claritySentence(model: ComparisonModel): string | null {
	const changes = model.differences
		.filter((d) => d.centerHz >= CLARITY_RANGE_HZ.low / 1.01 && d.centerHz <= CLARITY_RANGE_HZ.high * 1.01)
		.map((d) => d.metrics.c80Db?.difference ?? null)
		.filter((v): v is number => v !== null);
	if (changes.length === 0) return null;
	const change = mean(changes);
	if (Math.abs(change) < NOTABLE_CLARITY_CHANGE_DB) return null;
	const range = `${formatHz(CLARITY_RANGE_HZ.low)} and ${formatHz(CLARITY_RANGE_HZ.high)}`;
	return `Clarity for music (C80) ${change > 0 ? 'rose' : 'fell'} by ${formatDb(Math.abs(change))} dB on average between ${range}.`;
}

function targetClause(change: BandChange): string {
	const { verdictBefore: before, verdictAfter: after } = change;
	if (!after || after.verdict === 'unknown') return '';
	const same = before?.verdict === after.verdict;
	const when = same ? 'still' : 'now';
	if (after.verdict === 'inside') return ` and is ${when} inside the target`;
	const distance = after.verdict === 'above' ? change.after.valueS - after.target.upperS : after.target.lowerS - change.after.valueS;
	const side = after.verdict === 'above' ? 'above' : 'below';
	const amount = distance < 0.005 ? 'just' : `${formatSeconds(distance)} s`;
	return ` and is ${when} ${amount} ${side} the target`;
}

/** Says where T20 stood in for T30 (the verdicts use the same fallback). */
function fallbackNote(change: BandChange): string {
	const beforeT20 = change.before.metric === 't20S';
	const afterT20 = change.after.metric === 't20S';
	if (!beforeT20 && !afterT20) return '';
	const where = beforeT20 && afterT20 ? 'in both visits' : beforeT20 ? 'in the baseline visit' : 'in the treated visit';
	return ` (from T20 ${where}, where T30 could not be measured reliably)`;
}

function bandSentence(change: BandChange, term: string): string {
	const { before, after } = change;
	const frequency = formatHz(change.band.centerHz);
	const movement =
		before.valueS === after.valueS
			? `stayed at ${formatSeconds(after.valueS)} s`
			: `${changeVerb(before.valueS, after.valueS)} from ${formatSeconds(before.valueS)} s to ${formatSeconds(after.valueS)} s`;
	return `At ${frequency} ${term} ${movement}${targetClause(change)}${fallbackNote(change)}.`;
}

/** Bands worth a sentence and bands missing a value, from low to high. */
function classifyBands(model: ComparisonModel): { changes: BandChange[]; missing: Map<MissingSide, number[]> } {
	const changes: BandChange[] = [];
	const missing = new Map<MissingSide, number[]>();
	const bands = [...model.differences].sort((a, b) => a.centerHz - b.centerHz);
	for (const band of bands) {
		const before = reverberationOf(band, 'before');
		const after = reverberationOf(band, 'after');
		if (before.valueS === null || after.valueS === null) {
			const side: MissingSide = before.valueS === null && after.valueS === null ? 'both' : before.valueS === null ? 'baseline' : 'treated';
			missing.set(side, [...(missing.get(side) ?? []), band.centerHz]);
			continue;
		}
		const verdictBefore = verdictAt(model.verdicts.before, band.centerHz);
		const verdictAfter = verdictAt(model.verdicts.after, band.centerHz);
		const relativeChange = before.valueS === 0 ? Infinity : (after.valueS - before.valueS) / before.valueS;
		const verdictChanged = verdictBefore !== undefined && verdictAfter !== undefined && verdictBefore.verdict !== verdictAfter.verdict;
		if (Math.abs(relativeChange) >= NOTABLE_REVERBERATION_CHANGE || verdictChanged) {
			changes.push({ band, before: before as BandChange['before'], after: after as BandChange['after'], relativeChange, verdictBefore, verdictAfter });
		}
	}
	return { changes, missing };
}

function verdictChanged(change: BandChange): boolean {
	return change.verdictBefore !== undefined && change.verdictAfter !== undefined && change.verdictBefore.verdict !== change.verdictAfter.verdict;
}

/** Keeps the most telling band changes when they do not all fit: verdict changes first, then the largest. */
function mostTelling(changes: BandChange[], room: number): BandChange[] {
	if (changes.length <= room) return changes;
	const ranked = [...changes].sort(
		(a, b) =>
			Number(verdictChanged(b)) - Number(verdictChanged(a)) ||
			Math.abs(b.relativeChange) - Math.abs(a.relativeChange) ||
			a.band.centerHz - b.band.centerHz
	);
	const kept = new Set(ranked.slice(0, Math.max(0, room)));
	return changes.filter((c) => kept.has(c));
}

function matchedPositions(model: ComparisonModel, side: 'baseline' | 'treated'): PositionResult[] {
	const matched = new Set(model.matchedPositions);
	return model[side].positions.filter((p) => matched.has(p.positionLabel));
}

/** Reflections that count (STRONG_REFLECTION) at one position. */
export function strongReflectionCount(reflections: readonly Pick<DetectedReflection, 'delayMs' | 'levelDb'>[]): number {
	return reflections.filter((r) => r.delayMs <= STRONG_REFLECTION.withinMs && r.levelDb > -STRONG_REFLECTION.belowDirectDb).length;
}

/** Mean count of strong reflections per position; null without positions. */
export function strongReflectionsPerPosition(positions: readonly { reflections: readonly Pick<DetectedReflection, 'delayMs' | 'levelDb'>[] }[]): number | null {
	return positions.length === 0 ? null : mean(positions.map((p) => strongReflectionCount(p.reflections)));
}

/** The strong reflections per matched position of each visit (what the summary and the pages quote). */
export function matchedStrongReflections(model: ComparisonModel): { before: number | null; after: number | null } {
	return { before: strongReflectionsPerPosition(matchedPositions(model, 'baseline')), after: strongReflectionsPerPosition(matchedPositions(model, 'treated')) };
}

function reflectionSentence(model: ComparisonModel): string | null {
	const { before, after } = matchedStrongReflections(model);
	if (before === null || after === null || (before === 0 && after === 0)) return null;
	const { withinMs, belowDirectDb } = STRONG_REFLECTION;
	return `Strong early reflections (within ${withinMs} ms, less than ${belowDirectDb} dB below the direct sound): ${formatCount(before)} before, ${formatCount(after)} after (average per position).`;
}

/**
 * Bands whose reverberation changed noticeably (NOTABLE_REVERBERATION_CHANGE) but by no more than
 * the spread between positions (judgeDifference): the change may come from where the microphone stood.
 */
function spreadSentence(model: ComparisonModel, changes: BandChange[]): string | null {
	const within = changes
		.filter((change) => Math.abs(change.relativeChange) >= NOTABLE_REVERBERATION_CHANGE)
		.filter((change) => reverberationJudgement(model.judgements?.find((j) => sameBand(j.centerHz, change.band.centerHz)))?.verdict === 'within-spread')
		.map((change) => formatHz(change.band.centerHz));
	if (within.length === 0) return null;
	return `At ${formatList(within)} the change in reverberation is no larger than the spread between positions, so it may come from where the microphone stood rather than from the room.`;
}

function positionSentence(model: ComparisonModel): string {
	const count = model.matchedPositions.length;
	if (count === 0) return 'No position was measured in both visits, so the visits cannot be compared position by position.';
	const verb = (labels: string[]) => (labels.length === 1 ? 'was' : 'were');
	let sentence = `Compared at ${count} ${count === 1 ? 'position' : 'positions'} measured in both visits`;
	if (model.baselineOnly.length > 0) {
		sentence += `; ${formatList(model.baselineOnly)} ${verb(model.baselineOnly)} measured only before`;
		if (model.treatedOnly.length > 0) sentence += ` and ${formatList(model.treatedOnly)} only after`;
	} else if (model.treatedOnly.length > 0) {
		sentence += `; ${formatList(model.treatedOnly)} ${verb(model.treatedOnly)} measured only after`;
	}
	return `${sentence}.`;
}

export function plainSummary(model: ComparisonModel): string[] {
	const mid = midFrequencySentence(model);
	const overall = [mid, targetCountSentence(model), claritySentence(model)].filter((s): s is string => s !== null);
	const reflections = reflectionSentence(model);
	const closing = [reflections, positionSentence(model)].filter((s): s is string => s !== null);

	const { changes, missing } = classifyBands(model);
	const spread = spreadSentence(model, changes);
	if (spread) closing.unshift(spread);
	let termIntroduced = mid !== null;
	const term = () => {
		const text = termIntroduced ? 'reverberation' : `the ${TERM.t30S}`;
		termIntroduced = true;
		return text;
	};
	const room = MAX_SUMMARY_SENTENCES - overall.length - closing.length - missing.size;
	const bandSentences = mostTelling(changes, room).map((change) => bandSentence(change, term()));
	const missingSentences = (['baseline', 'treated', 'both'] as const)
		.filter((side) => missing.has(side))
		.map((side) => {
			const where = formatList((missing.get(side) ?? []).map(formatHz));
			return `${capitalise(term())} could not be measured reliably at ${where} ${MISSING_WHERE[side]}.`;
		});
	return [...overall, ...bandSentences, ...missingSentences, ...closing];
}
