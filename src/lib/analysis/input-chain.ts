// Levels of an analysed capture through its input chain: band levels read from the analysis's
// smoothed power response, the chain's SPL calibration (dB SPL = dBFS + offset) and the
// microphone's correction. Pure: the worker stores what this returns beside the analysis.
import { correctionOnGrid, type CorrectionPoint, type CorrectionSense } from './mic-correction';
import { levelAxisLabel, type LevelAxisLabel } from './level-alignment';
import type { AnalysisCurves, AnalysisResult } from './types';

/** What of a chain the levels need (a stored input chain will do). */
export interface InputChainLevels {
	id: number;
	/** dB SPL = dBFS + offsetDb; null when the chain is not calibrated. */
	offsetDb: number | null;
	statedLevelDbSpl: number | null;
	correction: { filename: string; points: CorrectionPoint[]; sense: CorrectionSense } | null;
}

export interface CaptureLevels {
	/** True when the levels are dB SPL (the chain was calibrated). */
	calibrated: boolean;
	axisLabel: LevelAxisLabel;
	/** The chain's offset that was added, null when not calibrated. */
	offsetDb: number | null;
	/** The microphone correction that was taken out, null when none. */
	correction: { filename: string; sense: CorrectionSense; lowHz: number; highHz: number } | null;
	/**
	 * Per analysis band: the band's sound exposure level of the analysed response, 10·lg(2·Σx²/fs)
	 * (full-scale units, AES17 convention, so a 1 s sine of amplitude A reads 20·lg A), with the
	 * offset added and the correction at the band's centre taken out. Null where the response
	 * does not reach the band.
	 */
	bands: { centerHz: number; levelDb: number | null }[];
	/**
	 * Added to every point of the stored frequency response (any smoothing) to give the levels
	 * above: the offset minus the correction at that frequency. Same grid as the response.
	 */
	responseShiftDb: number[];
}

/** Bandwidth factor of the smoothing windows: a 1/b-octave window [f·2^(−1/2b), f·2^(1/2b)] is f·(2^(1/2b) − 2^(−1/2b)) wide. */
function bandwidthHz(centreHz: number, fraction: 1 | 3): number {
	const half = 2 ** (1 / (2 * fraction));
	return centreHz * (half - 1 / half);
}

/** Value of a log-spaced curve at a frequency, linear in dB over log frequency; null outside it. */
function curveAt(freqHz: readonly number[], db: readonly number[], f: number): number | null {
	const n = freqHz.length;
	if (n === 0 || !(f >= freqHz[0] * 0.999) || !(f <= freqHz[n - 1] * 1.001)) return null;
	let i = 0;
	while (i + 1 < n && freqHz[i + 1] <= f) i++;
	if (i + 1 >= n || f <= freqHz[i]) return db[i];
	const u = Math.log(f / freqHz[i]) / Math.log(freqHz[i + 1] / freqHz[i]);
	return db[i] + u * (db[i + 1] - db[i]);
}

/**
 * Band level from the 1/b-octave smoothed power response at the band's centre. The smoothed
 * value is the mean of |X(k)|² over the bins of the band; by Parseval's relation for the DFT
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, §8.6.4) the band's energy is
 * Σx² = (2/N)·Σ_band |X(k)|² = 2·B·mean|X|²/fs for a one-sided band of width B away from DC and
 * Nyquist, so 10·lg(2·Σx²/fs) = 10·lg(4·B·mean|X|²/fs²).
 */
export function bandLevelFromSmoothed(meanPowerDb: number, centreHz: number, fraction: 1 | 3, sampleRate: number): number {
	return meanPowerDb + 10 * Math.log10((4 * bandwidthHz(centreHz, fraction)) / sampleRate ** 2);
}

/** The analysis's band levels in dB re full scale (as analysed, before any chain). */
export function bandLevelsDbfs(result: Pick<AnalysisResult, 'bands' | 'bandKind' | 'sampleRate'> & { curves: Pick<AnalysisCurves, 'frequencyResponse' | 'frequencyResponseSmoothed'> }): { centerHz: number; levelDb: number | null }[] {
	const fraction = result.bandKind === 'third' ? 3 : 1;
	const smoothed = result.curves.frequencyResponseSmoothed[fraction === 3 ? '3' : '1'];
	const grid = result.curves.frequencyResponse.freqHz;
	return result.bands.map((band) => {
		// Bands whose upper edge passes Nyquist hold less than their width.
		const upper = band.exactHz * 2 ** (1 / (2 * fraction));
		const mean = upper < result.sampleRate / 2 ? curveAt(grid, smoothed, band.exactHz) : null;
		return { centerHz: band.centerHz, levelDb: mean === null ? null : bandLevelFromSmoothed(mean, band.exactHz, fraction, result.sampleRate) };
	});
}

const round = (value: number, digits = 2) => Math.round(value * 10 ** digits) / 10 ** digits;

/**
 * The capture's levels through its input chain (none: relative levels, dB re full scale). The
 * correction is taken out at each band's centre: a correction that varies inside a band is
 * averaged only approximately (common practice, no source; measurement microphones' files vary
 * smoothly above 100 Hz).
 */
export function captureLevels(
	result: Pick<AnalysisResult, 'bands' | 'bandKind' | 'sampleRate'> & { curves: Pick<AnalysisCurves, 'frequencyResponse' | 'frequencyResponseSmoothed'> },
	chain: InputChainLevels | null
): CaptureLevels {
	const offset = chain?.offsetDb ?? null;
	if (offset !== null && !Number.isFinite(offset)) throw new RangeError(`calibration offset must be finite, got ${offset}`);
	const correction = chain?.correction ?? null;
	const sign = correction?.sense === 'correction' ? 1 : -1;
	const at = (freqHz: readonly number[]) => (correction ? correctionOnGrid(correction, freqHz).map((v) => sign * v) : freqHz.map(() => 0));
	const bands = bandLevelsDbfs(result);
	const bandCorrections = at(bands.map((b) => b.centerHz));
	const grid = result.curves.frequencyResponse.freqHz;
	const gridCorrections = at(grid);
	return {
		calibrated: offset !== null,
		axisLabel: levelAxisLabel(offset !== null),
		offsetDb: offset,
		correction: correction && {
			filename: correction.filename,
			sense: correction.sense,
			lowHz: correction.points[0].freqHz,
			highHz: correction.points[correction.points.length - 1].freqHz
		},
		bands: bands.map((b, i) => ({ centerHz: b.centerHz, levelDb: b.levelDb === null ? null : round(b.levelDb + (offset ?? 0) + bandCorrections[i]) })),
		responseShiftDb: gridCorrections.map((c) => round((offset ?? 0) + c))
	};
}
