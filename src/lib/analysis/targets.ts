// Target reverberation times and the verdict of measured bands against them.
import { AnalysisInputError } from './errors';

export interface TargetBand {
	centerHz: number;
	targetS: number;
	lowerS: number;
	upperS: number;
}

export interface BandVerdict {
	centerHz: number;
	measuredS: number | null;
	target: TargetBand;
	verdict: 'inside' | 'above' | 'below' | 'unknown';
}

export type Din18041Use = 'music' | 'speech' | 'teaching' | 'inclusive-teaching' | 'sport';

function requirePositive(name: string, value: number): void {
	if (!Number.isFinite(value) || value <= 0) throw new AnalysisInputError('invalid_option', `${name} must be a finite number > 0, got ${value}`);
}

function checkCenters(centersHz: readonly number[]): void {
	centersHz.forEach((f, i) => {
		if (!Number.isFinite(f) || f <= 0) throw new AnalysisInputError('invalid_option', `band centre ${i} must be a frequency > 0 Hz, got ${f}`);
	});
}

/** Position of f between fA and fB on a log-frequency axis, clamped to 0…1. */
function logFraction(f: number, fA: number, fB: number): number {
	return Math.min(1, Math.max(0, Math.log(f / fA) / Math.log(fB / fA)));
}

/** Mean reverberation time for a listening room, ITU-R BS.1116-3: Tm = 0.25·(V/V0)^(1/3), V0 = 100 m³. */
export function bs1116MeanTime(volumeM3: number): number {
	requirePositive('volumeM3', volumeM3);
	return 0.25 * Math.cbrt(volumeM3 / 100);
}

/**
 * ITU-R BS.1116-3 tolerance mask around Tm (from memory, mask shape): ±0.05 s from 200 Hz to
 * 4 kHz; below 200 Hz the upper limit widens linearly in log frequency to +0.3 s at 63 Hz
 * (and stays there below), the lower limit stays −0.05 s; above 4 kHz the lower limit widens
 * to −0.1 s at 8 kHz (and stays there above), the upper limit stays +0.05 s.
 */
export function bs1116Target(volumeM3: number, centersHz: readonly number[]): TargetBand[] {
	const targetS = bs1116MeanTime(volumeM3);
	checkCenters(centersHz);
	return centersHz.map((centerHz) => {
		const upperMargin = centerHz < 200 ? 0.05 + 0.25 * logFraction(centerHz, 200, 63) : 0.05;
		const lowerMargin = centerHz > 4000 ? 0.05 + 0.05 * logFraction(centerHz, 4000, 8000) : 0.05;
		return { centerHz, targetS, lowerS: targetS - lowerMargin, upperS: targetS + upperMargin };
	});
}

// DIN 18041:2016 T_soll = a·lg(V/m³) + b for room groups A1…A5.
const DIN18041_COEFFICIENTS: Record<Din18041Use, { a: number; b: number }> = {
	music: { a: 0.45, b: 0.07 }, // A1
	speech: { a: 0.37, b: -0.14 }, // A2
	teaching: { a: 0.32, b: -0.17 }, // A3
	'inclusive-teaching': { a: 0.26, b: -0.14 }, // A4
	sport: { a: 0.75, b: -1.0 } // A5
};

/** Mid-frequency target T_soll in seconds (DIN 18041:2016, groups A1–A5). */
export function din18041Target(volumeM3: number, use: Din18041Use): number {
	requirePositive('volumeM3', volumeM3);
	const coefficients = DIN18041_COEFFICIENTS[use];
	if (!coefficients) throw new AnalysisInputError('invalid_option', `unknown DIN 18041 use "${String(use)}"`);
	const targetS = coefficients.a * Math.log10(volumeM3) + coefficients.b;
	if (targetS <= 0) throw new AnalysisInputError('invalid_option', `a volume of ${volumeM3} m³ is too small for DIN 18041 use "${use}"`);
	return targetS;
}

/**
 * DIN 18041 bands 250 Hz–2 kHz with the 0.8–1.2·T_soll tolerance (from memory); centres
 * outside that range get no target and are left out.
 */
export function din18041Bands(volumeM3: number, use: Din18041Use, centersHz: readonly number[]): TargetBand[] {
	const targetS = din18041Target(volumeM3, use);
	checkCenters(centersHz);
	return centersHz
		.filter((f) => f >= 250 / 1.01 && f <= 2000 * 1.01) // nominal or exact centres
		.map((centerHz) => ({ centerHz, targetS, lowerS: 0.8 * targetS, upperS: 1.2 * targetS }));
}

/** Band centres this close on a log axis (1/12 octave) are the same band, nominal or exact. */
const SAME_BAND_OCTAVES = 1 / 12;

export function sameBand(aHz: number, bHz: number): boolean {
	return Math.abs(Math.log2(aHz / bHz)) < SAME_BAND_OCTAVES;
}

/** One verdict per target band; a band with no finite measured value is 'unknown'. */
export function judgeAgainstTarget(
	measured: { centerHz: number; valueS: number | null }[],
	target: TargetBand[]
): BandVerdict[] {
	return target.map((band) => {
		const match = measured.find((m) => sameBand(m.centerHz, band.centerHz));
		const value = match?.valueS;
		const measuredS = typeof value === 'number' && Number.isFinite(value) ? value : null;
		const verdict =
			measuredS === null ? 'unknown' : measuredS > band.upperS ? 'above' : measuredS < band.lowerS ? 'below' : 'inside';
		return { centerHz: band.centerHz, measuredS, target: band, verdict };
	});
}
