// Synthetic comparisons for report tests: two visits of one room, built with the product's own
// averaging and target functions from per-band values given here.
import { averageBands, bandDifferences, type MetricRow } from '../../../../src/lib/analysis/compare';
import { bs1116Target, judgeAgainstTarget } from '../../../../src/lib/analysis/targets';
import type { SmoothingKey } from '../../../../src/lib/analysis/types';
import { judgeBands, visitStatistics } from '../../../../src/lib/results/statistics';
import { AVERAGED_METRICS, type ComparisonModel, type PositionResult, type ProblemBandView, type SessionSummary } from '../../../../src/lib/results/types';
import type { ReportDocument } from '../../../../src/lib/server/reports/pdf';

export const OCTAVE_CENTRES = [63, 125, 250, 500, 1000, 2000, 4000, 8000];

/** C80 of an ideal exponential decay with reverberation time T: 10·lg(e^(k·0.08) − 1), k = 6·ln10/T (Cabrera, Xun & Guski 2016). */
export function idealC80Db(t: number): number {
	return 10 * Math.log10(Math.exp(((6 * Math.LN10) / t) * 0.08) - 1);
}

/** Frequencies 48 per octave from 20 Hz to 20 kHz, the grid the stored responses use. */
function responseGrid(): number[] {
	const grid: number[] = [];
	for (let k = 0; 20 * 2 ** (k / 48) <= 20000 * 1.0001; k++) grid.push(20 * 2 ** (k / 48));
	return grid;
}

/** A smooth made-up response: a resonance at `peakHz` of `peakDb`, a dip near 120 Hz, a gentle top roll-off. */
function syntheticResponse(peakHz: number, peakDb: number, dipDb: number): SessionSummary['averageResponse'] {
	const freqHz = responseGrid();
	const db = freqHz.map((f) => {
		const peak = peakDb / (1 + (Math.log2(f / peakHz) / 0.12) ** 2);
		const dip = -dipDb / (1 + (Math.log2(f / 120) / 0.1) ** 2);
		const rollOff = -3 * Math.max(0, Math.log2(f / 8000));
		const lowCut = -12 * Math.max(0, Math.log2(30 / f));
		return 78 + peak + dip + rollOff + lowCut + 1.5 * Math.sin(Math.log2(f) * 5);
	});
	const smoothed = Object.fromEntries((['1', '3', '6', '12', '24'] as SmoothingKey[]).map((key) => [key, db])) as Record<SmoothingKey, number[]>;
	return { freqHz, db, smoothed };
}

export interface VisitSpec {
	conditionLabel: string;
	measuredOn: string;
	/** Per position label, per octave centre: T30 (null: not measurable). */
	t30ByPosition: Record<string, (number | null)[]>;
	/** T20 where T30 is null; defaults to null too. */
	t20ByPosition?: Record<string, (number | null)[]>;
	response: SessionSummary['averageResponse'];
}

/** A visit averaged over the given positions (the comparison averages matched positions only). */
function session(id: number, spec: VisitSpec, labels: string[]): SessionSummary {
	const rows: MetricRow[][] = labels.map((label) =>
		OCTAVE_CENTRES.map((centerHz, b) => {
			const t30 = spec.t30ByPosition[label][b];
			const t20 = t30 ?? spec.t20ByPosition?.[label]?.[b] ?? null;
			const decay = t30 ?? t20;
			return { centerHz, t30S: t30, t20S: t20, edtS: decay, c80Db: decay === null ? null : idealC80Db(decay) };
		})
	);
	const average = averageBands(rows, AVERAGED_METRICS as unknown as string[]);
	// Each position as the statistics read it: its bands, one loudspeaker, its own microphone label.
	const positions = labels.map((label, i) => ({ positionLabel: label, sourceLabel: 'main pair', micLabel: label, bands: rows[i], broadband: {} })) as unknown as PositionResult[];
	return {
		sessionId: id,
		conditionLabel: spec.conditionLabel,
		measuredOn: spec.measuredOn,
		positions: [],
		average,
		broadbandAverage: {},
		averageResponse: spec.response,
		outliers: [],
		statistics: visitStatistics(positions),
		thirds: null
	};
}

export interface ComparisonSpec {
	roomName: string;
	dimensionsM: [number, number, number];
	before: VisitSpec;
	after: VisitSpec;
	withTarget: boolean;
	summary: string[];
}

export function buildComparison(spec: ComparisonSpec): ComparisonModel {
	const [lengthM, widthM, heightM] = spec.dimensionsM;
	const volumeM3 = lengthM * widthM * heightM;
	const beforeLabels = Object.keys(spec.before.t30ByPosition);
	const afterLabels = Object.keys(spec.after.t30ByPosition);
	const matchedPositions = beforeLabels.filter((l) => afterLabels.includes(l));
	const baseline = session(1, spec.before, matchedPositions);
	const treated = session(2, spec.after, matchedPositions);
	const target = spec.withTarget ? bs1116Target(volumeM3, OCTAVE_CENTRES) : [];
	const measured = (s: SessionSummary) => s.average.map((band) => ({ centerHz: band.centerHz, valueS: band.values.t30S.mean ?? band.values.t20S.mean }));
	return {
		room: { name: spec.roomName, lengthM, widthM, heightM, volumeM3, roomUse: 'Mixing and listening' },
		baseline,
		treated,
		matchedPositions,
		baselineOnly: beforeLabels.filter((l) => !afterLabels.includes(l)),
		treatedOnly: afterLabels.filter((l) => !beforeLabels.includes(l)),
		differences: bandDifferences(baseline.average, treated.average, AVERAGED_METRICS as unknown as string[]),
		target,
		verdicts: { before: judgeAgainstTarget(measured(baseline), target), after: judgeAgainstTarget(measured(treated), target) },
		summary: spec.summary,
		judgements: judgeBands(baseline.statistics.bands, treated.statistics.bands),
		positionDifferences: [],
		matchedStatistics: { baseline: baseline.statistics, treated: treated.statistics },
		thirds: null
	};
}

/** A typical small control room, before and after broadband and low-frequency treatment. */
export function typicalComparison(): ComparisonModel {
	return buildComparison({
		roomName: 'Control Room B',
		dimensionsM: [5.2, 4.1, 2.7],
		withTarget: true,
		summary: [
			'The room now dies away about twice as fast as before in every band from 125 Hz up.',
			'The boom around 45 Hz is 6 dB lower, but it is still the strongest peak in the room.',
			'Above 250 Hz the reverberation time is now inside the target for a listening room of this size.'
		],
		before: {
			conditionLabel: 'untreated',
			measuredOn: '2025-01-14',
			response: syntheticResponse(45, 14, 9),
			t30ByPosition: {
				'Mix seat': [0.82, 0.64, 0.56, 0.5, 0.47, 0.45, 0.41, 0.35],
				'Sofa left': [0.86, 0.6, 0.54, 0.48, 0.46, 0.43, 0.4, 0.33],
				'Sofa right': [0.79, 0.62, 0.57, 0.49, 0.48, 0.44, 0.39, 0.34],
				Door: [0.9, 0.66, 0.58, 0.51, 0.47, 0.44, 0.4, 0.35]
			}
		},
		after: {
			conditionLabel: 'after bass traps and panels',
			measuredOn: '2025-03-02',
			response: syntheticResponse(45, 8, 5),
			t30ByPosition: {
				'Mix seat': [0.52, 0.33, 0.24, 0.21, 0.2, 0.2, 0.19, 0.18],
				'Sofa left': [0.55, 0.31, 0.23, 0.22, 0.21, 0.2, 0.2, 0.17],
				'Sofa right': [0.5, 0.34, 0.25, 0.21, 0.2, 0.19, 0.19, 0.18]
			}
		}
	});
}

export function typicalProblemBands(): ProblemBandView[] {
	return [
		{ id: 12, fLoHz: 2000, fHiHz: 4000, tLoMs: 20, tHiMs: 120, severity: 'minor', note: 'Flutter echo between the side walls, heard when clapping at the mix seat.', status: 'addressed' },
		{ id: 11, fLoHz: 42, fHiHz: 48, tLoMs: null, tHiMs: null, severity: 'severe', note: 'Modal peak from the length mode; the bass traps in the front corners take off about 6 dB, a further pair on the rear wall is advised.', status: 'open' },
		{ id: 13, fLoHz: 110, fHiHz: 130, tLoMs: null, tHiMs: null, severity: 'moderate', note: 'Dip at the mix seat from the floor reflection.', status: 'open' }
	];
}

export function typicalReport(overrides: Partial<ReportDocument> = {}): ReportDocument {
	return {
		practiceName: 'Halvorsen Acoustic Consulting',
		projectName: 'Studio refit 2025',
		clientName: 'Northgate Music Ltd',
		publishedAt: new Date(Date.UTC(2025, 2, 10)),
		title: 'Treatment results',
		comparison: typicalComparison(),
		advice:
			'The treatment has done what it was meant to do: the room is now even and well damped above 125 Hz.\n\nThe remaining low-frequency peak at 45 Hz is a room mode along the length. Add two more bass traps on the rear wall, floor to ceiling, and measure again.\n\nKeep the sofa at least 60 cm from the rear wall.',
		problemBands: typicalProblemBands(),
		plan: { title: 'Next steps', lines: ['Install two rear-wall bass traps (floor to ceiling).', 'Re-measure at the mix seat and both sofa positions.'] },
		...overrides
	};
}

/** A comparison with gaps: bands without T30 (one with T20 only), no target, no response before. */
export function sparseComparison(): ComparisonModel {
	return buildComparison({
		roomName: 'Rehearsal Room 2',
		dimensionsM: [7, 5.5, 3.1],
		withTarget: false,
		summary: ['Only part of the bands could be measured; the low bands were too noisy.'],
		before: {
			conditionLabel: 'as found',
			measuredOn: '2025-04-01',
			response: null,
			t30ByPosition: { A: [null, null, 1.1, 1.0, 0.95, 0.9, 0.8, 0.7] },
			t20ByPosition: { A: [null, 1.3, null, null, null, null, null, null] }
		},
		after: {
			conditionLabel: 'curtains',
			measuredOn: '2025-04-20',
			response: syntheticResponse(60, 6, 4),
			t30ByPosition: { A: [null, null, null, 0.7, 0.62, 0.55, 0.5, 0.45], B: [null, null, null, 0.72, 0.6, 0.57, 0.52, 0.44] }
		}
	});
}
