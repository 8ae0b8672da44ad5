// Synthetic results for the results-model tests: bands, positions and visits built from a few numbers.
import type { DetectedReflection } from '../../../src/lib/analysis/reflections';
import type { BandMetrics, SmoothingKey } from '../../../src/lib/analysis/types';
import { summariseSession } from '../../../src/lib/results/session';
import type { PositionResult, RoomFacts, SessionSummary } from '../../../src/lib/results/types';

export type BandInput = Partial<BandMetrics> & { centerHz: number };

export function makeBand(input: BandInput): BandMetrics {
	return {
		exactHz: input.centerHz,
		edtS: null,
		t20S: null,
		t30S: null,
		c50Db: null,
		c80Db: null,
		d50: null,
		tsMs: null,
		peakToNoiseDb: 50,
		r: { edt: null, t20: null, t30: null },
		xi: { edt: null, t20: null, t30: null },
		curvaturePct: null,
		biased: false,
		...input
	};
}

export function makeReflection(levelDb: number, delayMs = 5): DetectedReflection {
	return { delayMs, levelDb, extraPathM: 0.343 * delayMs, surface: null, predictedDelayMs: null };
}

const DEFAULT_GRID_HZ = [100, 200, 400, 800];

export interface PositionInput {
	label: string;
	captureId?: number;
	bands: BandInput[];
	broadband?: Partial<BandMetrics>;
	reflectionLevelsDb?: number[];
	freqHz?: number[];
	/** Response level in dB at every grid point (the smoothed versions get the same). */
	responseDb?: number[];
	sourceLabel?: string | null;
	micLabel?: string | null;
	thirdBands?: BandInput[];
}

let nextCaptureId = 1;

export function makePosition(input: PositionInput): PositionResult {
	const freqHz = input.freqHz ?? DEFAULT_GRID_HZ;
	const db = input.responseDb ?? freqHz.map(() => 0);
	const smoothed = Object.fromEntries((['1', '3', '6', '12', '24'] as SmoothingKey[]).map((k) => [k, [...db]])) as Record<SmoothingKey, number[]>;
	return {
		captureId: input.captureId ?? nextCaptureId++,
		positionLabel: input.label,
		broadband: makeBand({ centerHz: 0, ...input.broadband }),
		bands: input.bands.map(makeBand),
		peakToNoiseDb: 50,
		sourceLabel: input.sourceLabel ?? null,
		micLabel: input.micLabel ?? null,
		thirdBands: input.thirdBands ? input.thirdBands.map(makeBand) : null,
		response: { freqHz: [...freqHz], db: [...db], smoothed },
		reflections: (input.reflectionLevelsDb ?? []).map((level, i) => makeReflection(level, 2 + i))
	};
}

export function makeSession(positions: PositionInput[], meta: { sessionId?: number; conditionLabel?: string } = {}): SessionSummary {
	return summariseSession(
		{ sessionId: meta.sessionId ?? 1, conditionLabel: meta.conditionLabel ?? 'untreated', measuredOn: '2026-03-01' },
		positions.map(makePosition)
	);
}

/** A 5.2 × 4.0 × 3.5 m listening room: V = 72.8 m³. */
export function makeRoom(overrides: Partial<RoomFacts> = {}): RoomFacts {
	return { name: 'Studio A', lengthM: 5.2, widthM: 4.0, heightM: 3.5, volumeM3: 72.8, roomUse: 'listening', ...overrides };
}
