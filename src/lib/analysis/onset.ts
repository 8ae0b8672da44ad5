import { AnalysisInputError } from './errors';

/** ISO 3382-1:2009 Annex A.3.4: the start lies where the squared signal first comes within 20 dB of its maximum. */
export const START_POINT_THRESHOLD_DB = 20;

function peakSquared(x: Float64Array): number {
	let peak = 0;
	for (let i = 0; i < x.length; i++) {
		const p = x[i] * x[i];
		if (p > peak) peak = p;
	}
	return peak;
}

/**
 * Start point of an impulse response (ISO 3382-1:2009, A.3.4): the first sample whose square is
 * within `thresholdDb` of the squared maximum, i.e. where the response has risen out of the
 * background but before the direct sound's peak.
 */
export function findImpulseStart(ir: Float64Array, thresholdDb = START_POINT_THRESHOLD_DB): number {
	if (ir.length === 0) throw new AnalysisInputError('no_samples', 'the impulse response has no samples');
	if (!(thresholdDb > 0)) throw new RangeError(`threshold must be a positive number of dB, got ${thresholdDb}`);
	const peak = peakSquared(ir);
	if (!(peak > 0)) throw new AnalysisInputError('silent_signal', 'the impulse response is silent');
	const threshold = peak * 10 ** (-thresholdDb / 10);
	for (let i = 0; i < ir.length; i++) {
		if (ir[i] * ir[i] >= threshold) return i;
	}
	return 0;
}

/** Index of the direct sound's peak: the largest |x| within `windowS` after the start point. */
export function findDirectSoundPeak(ir: Float64Array, startIndex: number, sampleRate: number, windowS = 0.001): number {
	const end = Math.min(ir.length, startIndex + Math.max(1, Math.round(windowS * sampleRate)));
	let best = startIndex;
	for (let i = startIndex; i < end; i++) {
		if (Math.abs(ir[i]) > Math.abs(ir[best])) best = i;
	}
	return best;
}
