// Panel (membrane) bass trap: a limp panel of surface mass m' over a sealed cavity of depth d.
import { formatHz } from '../format';
import { AIR_HEAT_CAPACITY_RATIO, checkAir, DEFAULT_AIR, type AirProperties } from './air';
import { octaveEdgesHz, PLANNING_BANDS_HZ } from './bands';

/**
 * 'empty': adiabatic cavity, f0 = (1/2π)·√(ρ0c0²/(m'·d)) ≈ 60/√(m'·d).
 * 'porous': cavity filled with fibre, compression becomes isothermal, ρ0c0² → ρ0c0²/γ, so
 * f0 ≈ 50/√(m'·d) (Everest & Pohlmann, Master Handbook of Acoustics; Cox & D'Antonio — from memory).
 */
export type CavityFill = 'empty' | 'porous';

export interface MembraneTrap {
	/** Surface mass of the panel m', kg/m². */
	surfaceMassKgM2: number;
	/** Depth of the sealed cavity behind the panel, m. */
	cavityDepthM: number;
	cavityFill: CavityFill;
}

export interface PanelStock {
	id: string;
	name: string;
	densityKgM3: number;
	source: string;
	confidence: 'from memory';
}

/** Densities of common panel stock (from memory; a datasheet value is better). */
export const PANEL_STOCK: readonly PanelStock[] = [
	{ id: 'plywood', name: 'Plywood (birch/poplar average)', densityKgM3: 600, source: 'typical timber-panel density', confidence: 'from memory' },
	{ id: 'mdf', name: 'MDF', densityKgM3: 750, source: 'typical timber-panel density', confidence: 'from memory' },
	{ id: 'hardboard', name: 'Hardboard', densityKgM3: 900, source: 'typical timber-panel density', confidence: 'from memory' }
];

/** Standard panel thicknesses the trap designer tries, mm. */
export const PANEL_THICKNESSES_MM = [3, 4, 6, 9, 12, 18] as const;

/** m' = ρ·t */
export function panelSurfaceMass(thicknessM: number, densityKgM3 = 600): number {
	if (!(thicknessM > 0)) throw new Error(`panel thickness must be positive, got ${thicknessM} m`);
	if (!(densityKgM3 > 0)) throw new Error(`panel density must be positive, got ${densityKgM3} kg/m³`);
	return thicknessM * densityKgM3;
}

/** Cavity stiffness per area divided by the fill factor: ρ0c0² (adiabatic) or ρ0c0²/γ (isothermal). */
function cavityModulus(fill: CavityFill, air: AirProperties): number {
	checkAir(air);
	const adiabatic = air.density * air.speedOfSound ** 2;
	if (fill === 'empty') return adiabatic;
	if (fill === 'porous') return adiabatic / AIR_HEAT_CAPACITY_RATIO;
	throw new Error(`cavity fill must be "empty" or "porous", got "${String(fill)}"`);
}

/** f0 = (1/2π)·√(K/(m'·d)), K = ρ0c0² or ρ0c0²/γ — mass–spring resonance of the panel on the air cavity. */
export function membraneResonanceHz(trap: MembraneTrap, air: AirProperties = DEFAULT_AIR): number {
	if (!(trap.surfaceMassKgM2 > 0)) throw new Error(`surface mass must be positive, got ${trap.surfaceMassKgM2} kg/m²`);
	if (!(trap.cavityDepthM > 0)) throw new Error(`cavity depth must be positive, got ${trap.cavityDepthM} m`);
	return Math.sqrt(cavityModulus(trap.cavityFill, air) / (trap.surfaceMassKgM2 * trap.cavityDepthM)) / (2 * Math.PI);
}

/** Inverse of membraneResonanceHz: d = K / (m'·(2π f0)²). */
export function cavityDepthForResonance(
	targetHz: number,
	surfaceMassKgM2: number,
	cavityFill: CavityFill,
	air: AirProperties = DEFAULT_AIR
): number {
	if (!(targetHz > 0)) throw new Error(`target resonance must be positive, got ${targetHz} Hz`);
	if (!(surfaceMassKgM2 > 0)) throw new Error(`surface mass must be positive, got ${surfaceMassKgM2} kg/m²`);
	const omega = 2 * Math.PI * targetHz;
	return cavityModulus(cavityFill, air) / (surfaceMassKgM2 * omega * omega);
}

/**
 * The lumped mass–spring model needs a cavity much shallower than the wavelength; beyond
 * d ≈ λ/12 at f0 its prediction drifts (common practice, no source).
 */
export function membraneModelWarnings(trap: MembraneTrap, air: AirProperties = DEFAULT_AIR): string[] {
	const f0 = membraneResonanceHz(trap, air);
	const lambda = air.speedOfSound / f0;
	return trap.cavityDepthM > lambda / 12
		? [`cavity depth ${(trap.cavityDepthM * 1000).toFixed(0)} mm exceeds λ/12 at ${formatHz(f0)}; the resonance estimate is rough`]
		: [];
}

/**
 * Planning estimate of the trap's absorption, not a physical model: a resonance curve
 * α(f) = α_peak / (1 + Q²·(f/f0 − f0/f)²) with α_peak = 0.4 and Q = √2, so α falls to half
 * the peak one half-octave either side of f0 (common practice, no source).
 */
export const MEMBRANE_ESTIMATE = { peakAbsorption: 0.4, quality: Math.SQRT2 } as const;

export function membraneAbsorptionEstimate(
	frequencyHz: number,
	resonanceHz: number,
	estimate: { peakAbsorption: number; quality: number } = MEMBRANE_ESTIMATE
): number {
	const detune = frequencyHz / resonanceHz - resonanceHz / frequencyHz;
	return estimate.peakAbsorption / (1 + estimate.quality ** 2 * detune * detune);
}

/** Band of action: where the estimate is at least half its peak, f0/√2 … f0·√2 for Q = √2. */
export function membraneActionRangeHz(resonanceHz: number): { loHz: number; hiHz: number } {
	return octaveEdgesHz(resonanceHz);
}

/** Estimate per planning band, averaged over 9 log-spaced points in each octave (the resonance is narrower than a band). */
export function membraneBandAbsorption(trap: MembraneTrap, air: AirProperties = DEFAULT_AIR): number[] {
	const f0 = membraneResonanceHz(trap, air);
	return PLANNING_BANDS_HZ.map((fc) => {
		const { loHz, hiHz } = octaveEdgesHz(fc);
		let sum = 0;
		for (let i = 0; i < 9; i++) sum += membraneAbsorptionEstimate(loHz * (hiHz / loHz) ** (i / 8), f0);
		return sum / 9;
	});
}
