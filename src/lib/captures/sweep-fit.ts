// Whether a recorded sweep can hold the test signal it is said to be a recording of, checked from
// the WAV header when the file is picked, so a wrong choice is caught before the upload and not
// after the analysis. The engine needs the whole sweep and at least MIN_DECAY_AFTER_SWEEP_S of the
// room after it (the same limit as `deconvolveSweep` in src/lib/analysis/deconvolve.ts).
import { formatSeconds } from '../format';

export const MIN_DECAY_AFTER_SWEEP_S = 0.05;

export interface PlayedSweep {
	name: string;
	/** The sweep itself, without the silence after it. */
	durationS: number;
}

/** Why this recording cannot be of this sweep, or null when it can. */
export function sweepMismatch(recordingS: number, sweep: PlayedSweep): string | null {
	if (recordingS >= sweep.durationS + MIN_DECAY_AFTER_SWEEP_S) return null;
	return (
		`This recording is ${formatSeconds(recordingS)} s long, shorter than the ${formatSeconds(sweep.durationS)} s sweep "${sweep.name}": ` +
		'choose the sweep that was played (or upload its reference file), or mark the file as an impulse response if it is one.'
	);
}
