// A visit's results over its positions: spatial averages per band, the power-averaged response
// and the positions that stand out.
import { averageBands, outlierPositions, powerAverageCurves, type AveragedBand } from '../analysis/compare';
import type { SmoothingKey } from '../analysis/types';
import { SMOOTHING_KEYS } from './position';
import { bandsOfKind, visitStatistics } from './statistics';
import { AVERAGED_METRICS, type PositionResult, type SessionMeta, type SessionSummary } from './types';

/** T30 more than this fraction away from the other positions' mean flags a position (common practice, no source). */
export const OUTLIER_FRACTION = 0.2;

/** Broadband rows have centre 0; the averaging needs a positive centre shared by all positions. */
const BROADBAND_PLACEHOLDER_HZ = 1;

/**
 * Arithmetic means over positions, per band (ISO 3382-2:2008, 5.3, from memory: reverberation times are
 * averaged arithmetically over the positions). The energy parameters (C50, C80, D50, Ts) are
 * averaged the same way, C50/C80 in dB — our stated choice, so one rule covers every metric.
 */
export function averagePositions(positions: PositionResult[]): AveragedBand[] {
	return averageBands(
		positions.map((p) => p.bands),
		AVERAGED_METRICS
	);
}

export function averageBroadband(positions: PositionResult[]): AveragedBand['values'] {
	const [row] = averageBands(
		positions.map((p) => [{ ...p.broadband, centerHz: BROADBAND_PLACEHOLDER_HZ }]),
		AVERAGED_METRICS
	);
	if (row) return row.values;
	return Object.fromEntries(AVERAGED_METRICS.map((metric) => [metric, { mean: null, count: 0, std: null }]));
}

/** Points from the start where every grid agrees (grids built from the same start point differ only in length). */
function commonGridLength(grids: number[][]): number {
	let length = Math.min(...grids.map((g) => g.length));
	for (let k = 0; k < length; k++) {
		const f = grids[0][k];
		if (grids.some((g) => Math.abs(g[k] - f) > 1e-9 * Math.max(1, Math.abs(f)))) {
			length = k;
			break;
		}
	}
	return length;
}

/** Power average of the responses, and of each smoothed version, over their common frequencies; null if none. */
export function averageResponses(positions: PositionResult[]): SessionSummary['averageResponse'] {
	if (positions.length === 0) return null;
	const length = commonGridLength(positions.map((p) => p.response.freqHz));
	if (length === 0) return null;
	const freqHz = positions[0].response.freqHz.slice(0, length);
	const averageOf = (levels: (p: PositionResult) => number[]) =>
		powerAverageCurves(positions.map((p) => ({ freqHz: p.response.freqHz.slice(0, length), db: levels(p).slice(0, length) }))).db;
	const smoothed = {} as Record<SmoothingKey, number[]>;
	for (const key of SMOOTHING_KEYS) smoothed[key] = averageOf((p) => p.response.smoothed[key]);
	return { freqHz, db: averageOf((p) => p.response.db), smoothed };
}

/** Averages and statistics over the positions' one-third-octave bands; null when none has them. */
export function thirdsOf(positions: PositionResult[]): SessionSummary['thirds'] {
	const rows = bandsOfKind(positions, 'third');
	if (rows.length === 0) return null;
	return { average: averageBands(rows, AVERAGED_METRICS), statistics: visitStatistics(positions, 'third') };
}

export function summariseSession(meta: SessionMeta, positions: PositionResult[]): SessionSummary {
	const outliers = outlierPositions(
		positions.map((p) => p.bands),
		{ metric: 't30S', fraction: OUTLIER_FRACTION }
	).map((flag) => ({
		positionLabel: positions[flag.positionIndex].positionLabel,
		centerHz: flag.centerHz,
		metric: 't30S' as const,
		value: flag.value,
		referenceMean: flag.referenceMean,
		deviation: flag.deviation
	}));
	return {
		sessionId: meta.sessionId,
		conditionLabel: meta.conditionLabel,
		measuredOn: meta.measuredOn,
		positions,
		average: averagePositions(positions),
		broadbandAverage: averageBroadband(positions),
		averageResponse: averageResponses(positions),
		outliers,
		statistics: visitStatistics(positions, 'octave'),
		thirds: thirdsOf(positions)
	};
}
