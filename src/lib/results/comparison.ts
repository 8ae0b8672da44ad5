// Two visits of a room compared: positions matched by label, the matched averages band by band,
// and the reverberation verdicts against a target before and after.
import { averageBands, bandDifferences } from '../analysis/compare';
import { bs1116Target, judgeAgainstTarget, sameBand, type TargetBand } from '../analysis/targets';
import { reverberationOf, type Side } from './reverberation';
import { averagePositions } from './session';
import { bandsOfKind, comparePositions, judgeBands, visitStatistics } from './statistics';
import { plainSummary } from './summary';
import { AVERAGED_METRICS, type ComparisonResult, type PositionResult, type RoomFacts, type SessionSummary, type SourcedVerdict } from './types';

/** Room uses for critical listening, where ITU-R BS.1116-3 gives the default target. */
const LISTENING_USES: readonly string[] = ['listening', 'control', 'home-theatre'];

const byLabel = (a: string, b: string) => a.localeCompare(b, 'en', { numeric: true });

function labelsOf(summary: SessionSummary): Set<string> {
	return new Set(summary.positions.map((p) => p.positionLabel));
}

/** Octaves the BS.1116-3 tolerance mask is drawn over, 63 Hz – 8 kHz (from memory): the 31.5 Hz and 16 kHz octaves get no target. */
const TARGET_RANGE_HZ = { low: 63, high: 8000 };

export function defaultTarget(room: Pick<RoomFacts, 'roomUse' | 'volumeM3'>, centersHz: readonly number[]): TargetBand[] {
	const inRange = centersHz.filter((c) => c >= TARGET_RANGE_HZ.low / 1.01 && c <= TARGET_RANGE_HZ.high * 1.01);
	return LISTENING_USES.includes(room.roomUse) && inRange.length > 0 ? bs1116Target(room.volumeM3, inRange) : [];
}

/** The matched positions' one-third-octave bands compared, when both visits have them. */
function thirdsComparison(baseline: PositionResult[], treated: PositionResult[]): ComparisonResult['thirds'] {
	const before = bandsOfKind(baseline, 'third');
	const after = bandsOfKind(treated, 'third');
	if (before.length === 0 || after.length === 0) return null;
	const differences = bandDifferences(averageBands(before, AVERAGED_METRICS), averageBands(after, AVERAGED_METRICS), AVERAGED_METRICS);
	return { differences, judgements: judgeBands(visitStatistics(baseline, 'third').bands, visitStatistics(treated, 'third').bands) };
}

export function compareSessions(
	room: RoomFacts,
	baseline: SessionSummary,
	treated: SessionSummary,
	options: { target?: TargetBand[] } = {}
): ComparisonResult {
	const baselineLabels = labelsOf(baseline);
	const treatedLabels = labelsOf(treated);
	const matchedPositions = [...baselineLabels].filter((label) => treatedLabels.has(label)).sort(byLabel);
	const baselineOnly = [...baselineLabels].filter((label) => !treatedLabels.has(label)).sort(byLabel);
	const treatedOnly = [...treatedLabels].filter((label) => !baselineLabels.has(label)).sort(byLabel);

	const matched = new Set(matchedPositions);
	const matchedAverage = {
		baseline: averagePositions(baseline.positions.filter((p) => matched.has(p.positionLabel))),
		treated: averagePositions(treated.positions.filter((p) => matched.has(p.positionLabel)))
	};
	const differences = bandDifferences(matchedAverage.baseline, matchedAverage.treated, AVERAGED_METRICS);
	const target = options.target ?? defaultTarget(room, differences.map((d) => d.centerHz));

	const judge = (side: Side): SourcedVerdict[] => {
		const values = differences.map((band) => ({ centerHz: band.centerHz, ...reverberationOf(band, side) }));
		// The same band lookup judgeAgainstTarget makes, to say which metric each verdict used.
		const metricAt = (centerHz: number) => values.find((v) => sameBand(v.centerHz, centerHz))?.metric ?? null;
		return judgeAgainstTarget(values, target).map((verdict) => ({
			...verdict,
			metric: verdict.measuredS === null ? null : metricAt(verdict.centerHz)
		}));
	};

	const matchedOf = (summary: SessionSummary) => summary.positions.filter((p) => matched.has(p.positionLabel));
	const matchedStatistics = { baseline: visitStatistics(matchedOf(baseline)), treated: visitStatistics(matchedOf(treated)) };
	const judgements = judgeBands(matchedStatistics.baseline.bands, matchedStatistics.treated.bands);
	const positionDifferences = comparePositions(baseline.positions, treated.positions, matchedPositions);
	const thirds = thirdsComparison(matchedOf(baseline), matchedOf(treated));

	const model: ComparisonResult = {
		room,
		baseline,
		treated,
		matchedPositions,
		baselineOnly,
		treatedOnly,
		differences,
		target,
		verdicts: { before: judge('before'), after: judge('after') },
		summary: [],
		matchedAverage,
		judgements,
		positionDifferences,
		matchedStatistics,
		thirds
	};
	model.summary = plainSummary(model);
	return model;
}
