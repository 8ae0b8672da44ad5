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
	 * Per analysis band: the band level of the analysed response — its power response |H(f)|²
	 * averaged over the band, the value the 1/1-octave (1/3 for third bands) smoothed response has
	 * at the band's centre, so the band chart and the response chart agree — with the offset added
	 * and the correction at the band's centre taken out. For a deconvolved sweep, H is the gain from
	 * the played signal to the recorded one, so a calibrated band level is the dB SPL a full-scale
	 * sine drive gives, averaged over the band. Null where the response does not reach the band.
	 */
	bands: { centerHz: number; levelDb: number | null }[];
	/**
	 * Added to every point of the stored frequency response (any smoothing) to give the levels
	 * above: the offset minus the correction at that frequency. Same grid as the response.
	 */
	responseShiftDb: number[];
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

/** The analysis's band levels in dB re full scale (as analysed, before any chain). */
export function bandLevelsDbfs(result: Pick<AnalysisResult, 'bands' | 'bandKind' | 'sampleRate'> & { curves: Pick<AnalysisCurves, 'frequencyResponse' | 'frequencyResponseSmoothed'> }): { centerHz: number; levelDb: number | null }[] {
	const fraction = result.bandKind === 'third' ? 3 : 1;
	const smoothed = result.curves.frequencyResponseSmoothed[fraction === 3 ? '3' : '1'];
	const grid = result.curves.frequencyResponse.freqHz;
	return result.bands.map((band) => {
		// Bands whose upper edge passes Nyquist hold less than their width.
		const upper = band.exactHz * 2 ** (1 / (2 * fraction));
		const mean = upper < result.sampleRate / 2 ? curveAt(grid, smoothed, band.exactHz) : null;
		return { centerHz: band.centerHz, levelDb: mean };
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
