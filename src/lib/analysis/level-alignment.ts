// Levels of several positions made comparable before they are averaged or drawn together: in
// dB SPL when every position's input chain is calibrated, otherwise each normalised to 0 dB at a
// stated band — and the words that say which, for the axis and the caption.
import { bandLabel } from './bands';
import { sameBand } from './targets';

export type LevelAxisLabel = 'dB SPL' | 'dB (relative)';

/** "dB SPL" only for calibrated levels; anything else is relative. */
export function levelAxisLabel(calibrated: boolean): LevelAxisLabel {
	return calibrated ? 'dB SPL' : 'dB (relative)';
}

export interface BandLevel {
	centerHz: number;
	/** null: not measured in this band. */
	levelDb: number | null;
}

export interface PositionBandLevels {
	positionLabel: string;
	/** Band levels in dBFS (AES17) as analysed, before any calibration. */
	bands: BandLevel[];
	/** The position's chain offset (dB SPL = dBFS + offset), null when its chain was not calibrated. */
	calibrationOffsetDb: number | null;
}

export interface AlignmentOptions {
	/** Band set to 0 dB when levels are normalised (default the 1 kHz octave). */
	referenceHz?: number;
	/** Normalise even when every chain is calibrated (to compare shapes). Default false. */
	normalise?: boolean;
}

/** The 1 kHz octave band: the default reference for normalised levels (common practice, no source). */
export const DEFAULT_REFERENCE_HZ = 1000;

export interface AlignedLevels {
	mode: 'calibrated' | 'normalised';
	axisLabel: LevelAxisLabel;
	/** Set when mode is 'normalised': the band put at 0 dB in every position. */
	referenceHz: number | null;
	/** Positions in the given order; excluded ones are left out. */
	positions: { positionLabel: string; bands: BandLevel[] }[];
	/** Power average 10·lg(mean 10^(L/10)) per band over the positions with a level there. */
	average: (BandLevel & { count: number })[];
	/** Positions left out, and why. */
	excluded: { positionLabel: string; reason: string }[];
	/** One sentence for the caption: what the levels are and how they were aligned. */
	description: string;
}

function finite(value: number | null): value is number {
	return typeof value === 'number' && Number.isFinite(value);
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * Aligns per-position band levels for averaging. When every position has a calibration offset
 * (and normalising is not asked for), levels become dB SPL and are averaged as measured. Otherwise
 * each position is shifted so its level in the reference band is 0 dB — a position without a level
 * there is left out, with the reason — so a capture recorded at a lower gain no longer pulls the
 * average down. Averages are power averages (energy mean of the levels, the rule for sound
 * pressure levels; common practice, no source).
 */
export function alignBandLevels(positions: PositionBandLevels[], options: AlignmentOptions = {}): AlignedLevels {
	const referenceHz = options.referenceHz ?? DEFAULT_REFERENCE_HZ;
	if (!(Number.isFinite(referenceHz) && referenceHz > 0)) throw new RangeError(`reference band must be > 0 Hz, got ${referenceHz}`);
	for (const p of positions) {
		if (p.calibrationOffsetDb !== null && !Number.isFinite(p.calibrationOffsetDb)) {
			throw new RangeError(`position ${p.positionLabel}: calibration offset must be finite or null, got ${p.calibrationOffsetDb}`);
		}
		for (const band of p.bands) {
			if (!(Number.isFinite(band.centerHz) && band.centerHz > 0)) throw new RangeError(`position ${p.positionLabel}: band centre must be > 0 Hz, got ${band.centerHz}`);
		}
	}
	const uncalibrated = positions.filter((p) => p.calibrationOffsetDb === null);
	const calibrated = positions.length > 0 && uncalibrated.length === 0 && !options.normalise;

	const aligned: AlignedLevels['positions'] = [];
	const excluded: AlignedLevels['excluded'] = [];
	for (const p of positions) {
		let shift: number;
		if (calibrated) shift = p.calibrationOffsetDb as number;
		else {
			const reference = p.bands.find((band) => sameBand(band.centerHz, referenceHz))?.levelDb ?? null;
			if (!finite(reference)) {
				excluded.push({ positionLabel: p.positionLabel, reason: `no level in the ${bandLabel(referenceHz)} band to normalise to` });
				continue;
			}
			shift = -reference;
		}
		aligned.push({
			positionLabel: p.positionLabel,
			bands: p.bands.map((band) => ({ centerHz: band.centerHz, levelDb: finite(band.levelDb) ? band.levelDb + shift : null }))
		});
	}

	const centres: number[] = [];
	for (const p of aligned) for (const { centerHz } of p.bands) if (!centres.some((c) => sameBand(c, centerHz))) centres.push(centerHz);
	centres.sort((a, b) => a - b);
	const average = centres.map((centerHz) => {
		const levels = aligned
			.map((p) => p.bands.find((band) => sameBand(band.centerHz, centerHz))?.levelDb ?? null)
			.filter(finite);
		const levelDb = levels.length ? 10 * Math.log10(levels.reduce((sum, l) => sum + 10 ** (l / 10), 0) / levels.length) : null;
		return { centerHz, levelDb, count: levels.length };
	});

	let description: string;
	if (calibrated) description = 'Sound pressure levels in dB SPL from calibrated input chains, averaged as measured.';
	else {
		const why = options.normalise
			? 'for comparing shapes'
			: positions.length === 0
				? 'as no position is calibrated'
				: uncalibrated.length === positions.length
					? 'as the input chains are not calibrated'
					: `as ${plural(uncalibrated.length, 'position is', 'positions are')} not calibrated`;
		description = `Relative levels: each position set to 0 dB in the ${bandLabel(referenceHz)} band before averaging, ${why}.`;
	}
	return {
		mode: calibrated ? 'calibrated' : 'normalised',
		axisLabel: levelAxisLabel(calibrated),
		referenceHz: calibrated ? null : referenceHz,
		positions: aligned,
		average,
		excluded,
		description
	};
}
