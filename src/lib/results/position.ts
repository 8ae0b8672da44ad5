// One analysed capture as the results pages use it, built from the stored analysis JSON.
import { AnalysisInputError } from '../analysis/errors';
import type { AnalysisCurves, AnalysisResult, SmoothingKey } from '../analysis/types';
import type { PositionResult } from './types';

/** The stored metrics JSON: the analysis result without curves and warnings. */
export type StoredMetrics = Omit<AnalysisResult, 'curves' | 'warnings'>;

/** What a position needs from the stored metrics and curves (older or trimmed records may carry more). */
export type PositionMetricsInput = Pick<StoredMetrics, 'broadband' | 'bands' | 'peakToNoiseDb' | 'reflections'> & Partial<Pick<StoredMetrics, 'thirdOctaveBands'>>;
export type PositionCurvesInput = Pick<AnalysisCurves, 'frequencyResponse' | 'frequencyResponseSmoothed'>;

export const SMOOTHING_KEYS: readonly SmoothingKey[] = ['1', '3', '6', '12', '24'];

function invalid(message: string): never {
	throw new AnalysisInputError('invalid_option', message);
}

export function positionFromAnalysis(
	captureId: number,
	positionLabel: string,
	metrics: PositionMetricsInput,
	curves: PositionCurvesInput,
	labels: { sourceLabel?: string | null; micLabel?: string | null } = {}
): PositionResult {
	if (!Number.isInteger(captureId) || captureId <= 0) invalid(`captureId must be a positive integer, got ${captureId}`);
	if (typeof positionLabel !== 'string' || positionLabel.trim() === '') invalid(`capture ${captureId}: the position label is empty`);
	if (!metrics || !Array.isArray(metrics.bands) || !metrics.broadband) invalid(`capture ${captureId}: the stored metrics have no bands or no broadband values`);
	const response = curves?.frequencyResponse;
	if (!response || !Array.isArray(response.freqHz) || !Array.isArray(response.db)) invalid(`capture ${captureId}: the stored curves have no frequency response`);
	if (response.freqHz.length !== response.db.length) {
		invalid(`capture ${captureId}: frequency response has ${response.freqHz.length} frequencies but ${response.db.length} levels`);
	}
	const smoothed = {} as Record<SmoothingKey, number[]>;
	for (const key of SMOOTHING_KEYS) {
		const curve = curves.frequencyResponseSmoothed?.[key];
		if (!Array.isArray(curve)) invalid(`capture ${captureId}: the 1/${key}-octave smoothed response is missing`);
		if (curve.length !== response.freqHz.length) {
			invalid(`capture ${captureId}: the 1/${key}-octave smoothed response has ${curve.length} points, the response ${response.freqHz.length}`);
		}
		smoothed[key] = [...curve];
	}
	return {
		captureId,
		positionLabel: positionLabel.trim(),
		broadband: metrics.broadband,
		bands: [...metrics.bands].sort((a, b) => a.centerHz - b.centerHz),
		sourceLabel: labels.sourceLabel ?? null,
		micLabel: labels.micLabel ?? null,
		thirdBands: Array.isArray(metrics.thirdOctaveBands) ? [...metrics.thirdOctaveBands].sort((a, b) => a.centerHz - b.centerHz) : null,
		peakToNoiseDb: typeof metrics.peakToNoiseDb === 'number' && Number.isFinite(metrics.peakToNoiseDb) ? metrics.peakToNoiseDb : null,
		response: { freqHz: [...response.freqHz], db: [...response.db], smoothed },
		reflections: Array.isArray(metrics.reflections) ? [...metrics.reflections] : []
	};
}
