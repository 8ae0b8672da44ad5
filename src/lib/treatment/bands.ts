// Octave bands used for planning. Nominal centre frequencies per ISO 266.

/** Bands every per-band array in this module is aligned to. */
export const PLANNING_BANDS_HZ = [63, 125, 250, 500, 1000, 2000, 4000, 8000] as const;

/** Bands that absorption tables publish (the common 125 Hz – 4 kHz set). */
export const TABLE_BANDS_HZ = [125, 250, 500, 1000, 2000, 4000] as const;

export type PlanningBandHz = (typeof PLANNING_BANDS_HZ)[number];
export type TableBandHz = (typeof TABLE_BANDS_HZ)[number];

/** One value per planning band, index-aligned with PLANNING_BANDS_HZ. */
export type BandValues = readonly number[];

/** Six values, index-aligned with TABLE_BANDS_HZ (125 Hz … 4 kHz). */
export type TableBandValues = readonly [number, number, number, number, number, number];

/** Throws unless `values` holds one finite number per planning band. */
export function checkBandValues(values: readonly number[], what: string): void {
	if (values.length !== PLANNING_BANDS_HZ.length) {
		throw new Error(
			`${what}: expected ${PLANNING_BANDS_HZ.length} values (bands ${PLANNING_BANDS_HZ.join(', ')} Hz), got ${values.length}`
		);
	}
	values.forEach((v, i) => {
		if (!Number.isFinite(v)) {
			throw new Error(`${what}: value at ${PLANNING_BANDS_HZ[i]} Hz is not a finite number`);
		}
	});
}

/** Builds a per-band array by evaluating `fn` at each planning band centre. */
export function perBand(fn: (bandHz: number, index: number) => number): number[] {
	return PLANNING_BANDS_HZ.map((f, i) => fn(f, i));
}

/** Geometric centre of a frequency range. */
export function geometricCentreHz(fLoHz: number, fHiHz: number): number {
	return Math.sqrt(fLoHz * fHiHz);
}

/** Octave band edges around a centre: fc/√2 … fc·√2 (IEC 61260-1 uses G^(±1/2), G ≈ 2). */
export function octaveEdgesHz(centreHz: number): { loHz: number; hiHz: number } {
	return { loHz: centreHz / Math.SQRT2, hiHz: centreHz * Math.SQRT2 };
}
