// The octaves beyond the standard 63 Hz – 8 kHz set — 31.5 Hz and 16 kHz — where a record allows them.
import { bandAt, type Band } from './bands';
import { BAND_FILTER_ORDER, zeroPhasePassEdges } from './filters';
import type { DeconvolutionSummary } from './types';

/** Band numbers re 1 kHz of the extra octaves: −5 (31.5 Hz) and 4 (16 kHz), ISO 266 nominal. */
export const EXTRA_OCTAVE_INDICES = [-5, 4] as const;

/**
 * The extra octaves a record allows. The band's filter must fit below half the sample rate (the
 * 16 kHz octave's upper edge is 22.4 kHz by IEC 61260-1, so it needs 48 kHz or more); and a
 * deconvolved sweep must have swept the band — down to its lower edge, and up to a quarter octave
 * above its mid-band frequency (our rule: sweeps seldom reach 22.4 kHz, and the top quarter octave
 * of the band carries little of a room's decay). Whether the decay itself stands clear of the
 * noise is left to the gates every band passes.
 */
export function extraOctaves(sampleRate: number, sweep: Pick<DeconvolutionSummary, 'f1Hz' | 'f2Hz'> | null): Band[] {
	if (!(sampleRate > 0)) throw new RangeError(`sample rate must be positive, got ${sampleRate}`);
	return EXTRA_OCTAVE_INDICES.map((index) => bandAt('octave', index)).filter((band) => {
		const edges = zeroPhasePassEdges(band.lowerHz, band.upperHz, sampleRate, BAND_FILTER_ORDER);
		if (!(band.upperHz < sampleRate / 2 && edges.highHz < sampleRate / 2)) return false;
		return !sweep || (band.lowerHz >= sweep.f1Hz && band.exactHz * 2 ** 0.25 <= sweep.f2Hz);
	});
}
