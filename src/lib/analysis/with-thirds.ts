// One analysis for the stored results: a recording's octaves (with the 31.5 Hz and 16 kHz octaves
// where it allows them) together with its one-third octaves.
import { analyseRecording } from './analyse';
import type { AnalysisResult, RecordingAnalysisOptions } from './types';

/**
 * A recording analysed in octave bands, the extra octaves included where the record allows
 * (extra-octaves.ts), and, from a second pass over
 * the same recording, its one-third-octave bands as `thirdOctaveBands` (numbers only: the octave
 * pass carries the warnings and curves).
 */
export function analyseRecordingWithThirds(bytes: Uint8Array, options: Omit<RecordingAnalysisOptions, 'bands'> = {}): AnalysisResult {
	const octaves = analyseRecording(bytes, { ...options, bands: 'octave', extraOctaves: true });
	const thirds = analyseRecording(bytes, { ...options, bands: 'third' });
	return { ...octaves, thirdOctaveBands: thirds.bands };
}
