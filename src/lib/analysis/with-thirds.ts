// One analysis for the stored results: a recording's octaves (with the 31.5 Hz and 16 kHz octaves
// where it allows them) together with its one-third octaves.
import { analyseRecordingInOctavesAndThirds } from './analyse';
import type { AnalysisResult, RecordingAnalysisOptions } from './types';

/**
 * A recording analysed in octave bands, the extra octaves included where the record allows
 * (extra-octaves.ts), and, from a second pass over
 * the same recording, its one-third-octave bands as `thirdOctaveBands` (numbers only: the octave
 * pass carries the warnings and curves).
 */
export function analyseRecordingWithThirds(bytes: Uint8Array, options: Omit<RecordingAnalysisOptions, 'bands'> = {}): AnalysisResult {
	// One decoding and deconvolution serve both passes; the thirds skip the curves they would drop.
	const { octaves, thirds } = analyseRecordingInOctavesAndThirds(bytes, options, { extraOctaves: true });
	return { ...octaves, thirdOctaveBands: thirds.bands };
}
