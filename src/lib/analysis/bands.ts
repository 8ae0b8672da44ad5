/** Octave and one-third-octave bands: exact frequencies per IEC 61260-1:2014, nominal labels per ISO 266. */
// The one module of $lib/format it needs, so the engine does not load the whole formatter set.
import { formatHz } from '../format/frequency';

export type BandKind = 'octave' | 'third';

export interface Band {
	kind: BandKind;
	/** Band number x relative to 1 kHz (x = 0); thirds count in thirds of an octave. */
	index: number;
	/** Nominal mid-band frequency (ISO 266), the label people use. */
	nominalHz: number;
	/** Exact mid-band frequency f_m (IEC 61260-1). */
	exactHz: number;
	lowerHz: number;
	upperHz: number;
}

/** Octave frequency ratio, base-10 system: G = 10^(3/10) (IEC 61260-1:2014). */
export const OCTAVE_RATIO = 10 ** 0.3;
export const REFERENCE_FREQUENCY_HZ = 1000;

/** ISO 266 nominal one-third-octave frequencies from 20 Hz (x = −17) to 20 kHz (x = 13). */
const NOMINAL_THIRDS_HZ = [
	20, 25, 31.5, 40, 50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500, 3150,
	4000, 5000, 6300, 8000, 10000, 12500, 16000, 20000
];
const FIRST_NOMINAL_THIRD_INDEX = -17;

/** Bands the engine analyses: octaves 63 Hz–8 kHz, thirds 50 Hz–10 kHz. */
const BAND_RANGE: Record<BandKind, { first: number; last: number }> = {
	octave: { first: -4, last: 3 },
	third: { first: -13, last: 10 }
};

export function bandsPerOctave(kind: BandKind): 1 | 3 {
	return kind === 'octave' ? 1 : 3;
}

/** Exact mid-band frequency: f_m = f_r·G^(x/b) for odd b (IEC 61260-1:2014). */
export function exactMidbandHz(index: number, fractionDenominator: number): number {
	if (!Number.isInteger(index)) throw new RangeError(`band index must be an integer, got ${index}`);
	if (fractionDenominator % 2 === 1) return REFERENCE_FREQUENCY_HZ * OCTAVE_RATIO ** (index / fractionDenominator);
	// Even b: f_m = f_r·G^((2x+1)/(2b)) (IEC 61260-1:2014).
	return REFERENCE_FREQUENCY_HZ * OCTAVE_RATIO ** ((2 * index + 1) / (2 * fractionDenominator));
}

/** Band edges f₁,₂ = f_m·G^(∓1/(2b)) (IEC 61260-1:2014). */
export function bandEdgesHz(exactHz: number, fractionDenominator: number): { lowerHz: number; upperHz: number } {
	const half = OCTAVE_RATIO ** (1 / (2 * fractionDenominator));
	return { lowerHz: exactHz / half, upperHz: exactHz * half };
}

export function nominalFrequencyHz(kind: BandKind, index: number): number {
	const thirdIndex = kind === 'octave' ? 3 * index : index;
	const nominal = NOMINAL_THIRDS_HZ[thirdIndex - FIRST_NOMINAL_THIRD_INDEX];
	if (nominal === undefined) throw new RangeError(`no ISO 266 nominal frequency for ${kind} band ${index}`);
	return nominal;
}

export function bandAt(kind: BandKind, index: number): Band {
	const b = bandsPerOctave(kind);
	const exactHz = exactMidbandHz(index, b);
	return { kind, index, nominalHz: nominalFrequencyHz(kind, index), exactHz, ...bandEdgesHz(exactHz, b) };
}

export function analysisBands(kind: BandKind): Band[] {
	const { first, last } = BAND_RANGE[kind];
	const bands: Band[] = [];
	for (let index = first; index <= last; index++) bands.push(bandAt(kind, index));
	return bands;
}

/** Short label for messages: "125 Hz", "1.25 kHz" — the one frequency format of $lib/format. */
export const bandLabel: (nominalHz: number) => string = formatHz;
