// What a visit's numbers rest on: per band the spread over positions with its 95 % confidence
// interval, ISO 3382-2's uncertainty of the averaged T20 and T30, the mid-frequency T, and the
// measurement grade its positions reach; and for two visits, each band's difference judged
// against that spread.
import { averageBands, bandDifferences, type BandDifference } from '../analysis/compare';
import type { BandKind } from '../analysis/bands';
import { sameBand } from '../analysis/targets';
import type { BandMetrics } from '../analysis/types';
import { gradeVisit, type GradeAssessment } from './grade';
import { midFrequencyReverberation, type MidFrequencyReverberation } from './reverberation';
import {
	bandSpreads,
	INTEGRATED_IMPULSE_EQUIVALENT_DECAYS,
	judgeDifference,
	reverberationTimeUncertainty,
	spreadOf,
	type DifferenceJudgement,
	type Spread
} from './spread';
import { AVERAGED_METRICS, type AveragedMetric, type BandJudgement, type PositionComparison, type PositionResult } from './types';

export interface BandStatistics {
	centerHz: number;
	metrics: Record<AveragedMetric, Spread>;
	/**
	 * σ of the averaged T20 and T30 by ISO 3382-2:2008 (bandwidth, decays per position, positions
	 * with a value), seconds; null where the band has no such value.
	 */
	uncertainty: { t20S: number | null; t30S: number | null };
}

export interface VisitStatistics {
	bandKind: BandKind;
	/** Positions behind the numbers. */
	positions: number;
	bands: BandStatistics[];
	broadband: Record<AveragedMetric, Spread>;
	/** T_mid of the averaged octaves (T30, else T20 per band); null for thirds or when a band is missing. */
	midFrequency: MidFrequencyReverberation | null;
	grade: GradeAssessment;
}

function uncertaintyOf(metric: 't20S' | 't30S', spread: Spread, centerHz: number, bandKind: BandKind): number | null {
	if (spread.mean === null || !(spread.mean > 0) || spread.count < 1) return null;
	return reverberationTimeUncertainty({
		metric: metric === 't20S' ? 't20' : 't30',
		reverberationTimeS: spread.mean,
		centerHz,
		bandKind,
		decaysPerPosition: INTEGRATED_IMPULSE_EQUIVALENT_DECAYS,
		positions: spread.count
	});
}

/** Band rows of one kind of each position: octaves, or thirds where the position has them. */
export function bandsOfKind(positions: readonly PositionResult[], bandKind: BandKind): BandMetrics[][] {
	return bandKind === 'octave' ? positions.map((p) => p.bands) : positions.filter((p) => p.thirdBands?.length).map((p) => p.thirdBands as BandMetrics[]);
}

export function visitStatistics(positions: readonly PositionResult[], bandKind: BandKind = 'octave'): VisitStatistics {
	const rows = bandsOfKind(positions, bandKind);
	const bands = bandSpreads(rows, AVERAGED_METRICS).map(({ centerHz, values }): BandStatistics => {
		const metrics = values as Record<AveragedMetric, Spread>;
		return {
			centerHz,
			metrics,
			uncertainty: { t20S: uncertaintyOf('t20S', metrics.t20S, centerHz, bandKind), t30S: uncertaintyOf('t30S', metrics.t30S, centerHz, bandKind) }
		};
	});
	const broadband = Object.fromEntries(
		AVERAGED_METRICS.map((metric) => [metric, spreadOf(positions.map((p) => (typeof p.broadband[metric] === 'number' ? (p.broadband[metric] as number) : null)))])
	) as Record<AveragedMetric, Spread>;
	const midFrequency =
		bandKind === 'octave' ? midFrequencyReverberation(bands.map((b) => ({ centerHz: b.centerHz, t30S: b.metrics.t30S.mean, t20S: b.metrics.t20S.mean }))) : null;
	const grade = gradeVisit(positions.map((p) => ({ label: p.positionLabel, sourceLabel: p.sourceLabel ?? null, micLabel: p.micLabel ?? null })));
	return { bandKind, positions: rows.length, bands, broadband, midFrequency, grade };
}

/** Per band (union of both sides) and metric, the before/after difference judged by judgeDifference. */
export function judgeBands(before: readonly BandStatistics[], after: readonly BandStatistics[]): BandJudgement[] {
	const centres: number[] = [];
	for (const band of [...before, ...after]) if (!centres.some((c) => sameBand(c, band.centerHz))) centres.push(band.centerHz);
	centres.sort((a, b) => a - b);
	const empty = spreadOf([]);
	return centres.map((centerHz) => {
		const b = before.find((x) => sameBand(x.centerHz, centerHz));
		const a = after.find((x) => sameBand(x.centerHz, centerHz));
		const metrics: Record<string, DifferenceJudgement> = {};
		for (const metric of AVERAGED_METRICS) metrics[metric] = judgeDifference(metric, b?.metrics[metric] ?? empty, a?.metrics[metric] ?? empty);
		return { centerHz, metrics };
	});
}

/** The judgement a reverberation statement rests on: T30's, or T20's where T30 has no difference. */
export function reverberationJudgement(judgement: BandJudgement | undefined): (DifferenceJudgement & { metric: 't30S' | 't20S' }) | null {
	if (!judgement) return null;
	const t30 = judgement.metrics.t30S;
	if (t30 && t30.difference !== null) return { ...t30, metric: 't30S' };
	const t20 = judgement.metrics.t20S;
	if (t20 && t20.difference !== null) return { ...t20, metric: 't20S' };
	return null;
}

/** The matched positions one by one: each position's bands before against the same position after. */
export function comparePositions(baseline: readonly PositionResult[], treated: readonly PositionResult[], labels: readonly string[]): PositionComparison[] {
	return labels.flatMap((label) => {
		const before = baseline.find((p) => p.positionLabel === label);
		const after = treated.find((p) => p.positionLabel === label);
		if (!before || !after) return [];
		const differences: BandDifference[] = bandDifferences(averageBands([before.bands], AVERAGED_METRICS), averageBands([after.bands], AVERAGED_METRICS), AVERAGED_METRICS);
		const [broadband] = bandDifferences(
			averageBands([[{ ...before.broadband, centerHz: 1 }]], AVERAGED_METRICS),
			averageBands([[{ ...after.broadband, centerHz: 1 }]], AVERAGED_METRICS),
			AVERAGED_METRICS
		);
		return [{ positionLabel: label, differences, broadband: broadband.metrics }];
	});
}
