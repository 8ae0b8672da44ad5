// Porous absorber: empirical models of the material, a layer with an air gap on a rigid wall,
// and its absorption at normal and random incidence. Time convention e^{+jωt} throughout, so a
// lossy wavenumber has a negative imaginary part and a stiffness a negative reactance.
import { checkAir, DEFAULT_AIR, type AirProperties } from './air';
import { octaveEdgesHz, PLANNING_BANDS_HZ } from './bands';
import * as C from './complex';
import { integrateUnit } from './quadrature';

export type PorousModel = 'delany-bazley' | 'miki';

export interface PorousMedium {
	/** Characteristic impedance Zc (Pa·s/m). */
	characteristicImpedance: C.Complex;
	/** Complex wavenumber k (1/m). */
	wavenumber: C.Complex;
}

export interface PorousLayer {
	/** Air-flow resistivity σ in Pa·s/m² (10 kPa·s/m² = 10 000). */
	flowResistivity: number;
	thicknessM: number;
	/** Air gap between the layer and the rigid wall, m (0 = mounted on the wall). */
	airGapM?: number;
	model?: PorousModel;
}

/** Delany–Bazley's data range: 0.01 < X = ρ0·f/σ < 1 (Delany & Bazley, Appl. Acoust. 3:105, 1970). */
export const DELANY_BAZLEY_RANGE = { min: 0.01, max: 1 } as const;

/** X = ρ0·f/σ, the dimensionless frequency both models are fitted on. */
export function flowParameter(frequencyHz: number, flowResistivity: number, air: AirProperties = DEFAULT_AIR): number {
	return (air.density * frequencyHz) / flowResistivity;
}

/** Frequencies (Hz) where a material of this σ lies inside the fitted range 0.01 < X < 1. */
export function validFrequencyRangeHz(flowResistivity: number, air: AirProperties = DEFAULT_AIR): { loHz: number; hiHz: number } {
	return {
		loHz: (DELANY_BAZLEY_RANGE.min * flowResistivity) / air.density,
		hiHz: (DELANY_BAZLEY_RANGE.max * flowResistivity) / air.density
	};
}

function checkPositive(value: number, what: string): void {
	if (!(typeof value === 'number' && Number.isFinite(value) && value > 0)) {
		throw new Error(`${what} must be a positive number, got ${String(value)}`);
	}
}

/** Characteristic impedance and wavenumber of the porous material at one frequency. */
export function porousMedium(
	model: PorousModel,
	frequencyHz: number,
	flowResistivity: number,
	air: AirProperties = DEFAULT_AIR
): PorousMedium {
	checkPositive(frequencyHz, 'frequency (Hz)');
	checkPositive(flowResistivity, 'flow resistivity (Pa·s/m²)');
	checkAir(air);
	const z0 = air.density * air.speedOfSound;
	const k0 = (2 * Math.PI * frequencyHz) / air.speedOfSound;
	if (model === 'delany-bazley') {
		const X = flowParameter(frequencyHz, flowResistivity, air);
		// Zc/ρ0c0 = 1 + 0.0571 X^−0.754 − j 0.087 X^−0.732; k c0/ω = 1 + 0.0978 X^−0.700 − j 0.189 X^−0.595 (Delany & Bazley 1970)
		return {
			characteristicImpedance: C.complex(z0 * (1 + 0.0571 * X ** -0.754), -z0 * 0.087 * X ** -0.732),
			wavenumber: C.complex(k0 * (1 + 0.0978 * X ** -0.7), -k0 * 0.189 * X ** -0.595)
		};
	}
	if (model === 'miki') {
		const r = frequencyHz / flowResistivity;
		// Zc/ρ0c0 = 1 + 0.0699 (f/σ)^−0.632 − j 0.107 (f/σ)^−0.632; k c0/ω = 1 + 0.109 (f/σ)^−0.618 − j 0.160 (f/σ)^−0.618 (Miki, JASJ(E) 11:19, 1990)
		return {
			characteristicImpedance: C.complex(z0 * (1 + 0.0699 * r ** -0.632), -z0 * 0.107 * r ** -0.632),
			wavenumber: C.complex(k0 * (1 + 0.109 * r ** -0.618), -k0 * 0.16 * r ** -0.618)
		};
	}
	throw new Error(`unknown porous model "${String(model)}"; use "delany-bazley" or "miki"`);
}

/**
 * Impedance seen at the front of a layer (Zc, k, thickness d) whose back sees Zback — the
 * transfer-matrix [[cos kd, j Zc sin kd], [j sin kd / Zc, cos kd]] applied to (p, v):
 * Zfront = Zc·(Zback cos kd + j Zc sin kd) / (Zc cos kd + j Zback sin kd).
 */
export function translateImpedance(zBack: C.Complex | 'rigid', medium: PorousMedium, thicknessM: number): C.Complex {
	const zc = medium.characteristicImpedance;
	const kd = C.scale(medium.wavenumber, thicknessM);
	const cos = C.cos(kd);
	const sin = C.sin(kd);
	if (zBack === 'rigid') {
		// Zback → ∞: Zfront = −j Zc cot kd
		return C.mul(C.complex(0, -1), C.div(C.mul(zc, cos), sin));
	}
	const num = C.add(C.mul(zBack, cos), C.mul(C.J, C.mul(zc, sin)));
	const den = C.add(C.mul(zc, cos), C.mul(C.J, C.mul(zBack, sin)));
	return C.mul(zc, C.div(num, den));
}

function checkLayer(layer: PorousLayer): void {
	checkPositive(layer.flowResistivity, 'flow resistivity (Pa·s/m²)');
	checkPositive(layer.thicknessM, 'layer thickness (m)');
	const gap = layer.airGapM ?? 0;
	if (!(Number.isFinite(gap) && gap >= 0)) throw new Error(`air gap must be zero or a positive number of metres, got ${gap}`);
}

/** Normal-incidence surface impedance Zs (Pa·s/m) of the layer + air gap on a rigid wall. */
export function surfaceImpedance(layer: PorousLayer, frequencyHz: number, air: AirProperties = DEFAULT_AIR): C.Complex {
	checkLayer(layer);
	const medium = porousMedium(layer.model ?? 'miki', frequencyHz, layer.flowResistivity, air);
	const gap = layer.airGapM ?? 0;
	if (gap === 0) return translateImpedance('rigid', medium, layer.thicknessM);
	const airMedium: PorousMedium = {
		characteristicImpedance: C.complex(air.density * air.speedOfSound),
		wavenumber: C.complex((2 * Math.PI * frequencyHz) / air.speedOfSound)
	};
	// Top of the air gap: −j ρ0c0 cot(k0·dgap), then through the porous layer.
	const zGap = translateImpedance('rigid', airMedium, gap);
	return translateImpedance(zGap, medium, layer.thicknessM);
}

/** α = 1 − |(Zs cosθ − ρ0c0)/(Zs cosθ + ρ0c0)|² for a locally reacting surface (θ = 0: normal incidence). */
export function absorptionFromImpedance(zs: C.Complex, air: AirProperties = DEFAULT_AIR, cosTheta = 1): number {
	const z0 = C.complex(air.density * air.speedOfSound);
	const zt = C.scale(zs, cosTheta);
	const r = C.div(C.sub(zt, z0), C.add(zt, z0));
	const mag = C.abs(r);
	return 1 - mag * mag;
}

/**
 * Random-incidence (diffuse-field) absorption by Paris' formula α = ∫0^{π/2} α(θ) sin 2θ dθ,
 * with α(θ) of a locally reacting surface (its impedance independent of the angle; London,
 * JASA 22:263, 1950; Cox & D'Antonio, Acoustic Absorbers and Diffusers, porous chapter — from
 * memory). With u = cos θ the integral is ∫0^1 α(u)·2u du, evaluated by Gauss–Legendre.
 */
export function parisRandomIncidence(zs: C.Complex, air: AirProperties = DEFAULT_AIR): number {
	return integrateUnit((u) => 2 * u * absorptionFromImpedance(zs, air, u), 64);
}

export function normalIncidenceAbsorption(layer: PorousLayer, frequencyHz: number, air: AirProperties = DEFAULT_AIR): number {
	return absorptionFromImpedance(surfaceImpedance(layer, frequencyHz, air), air, 1);
}

export function randomIncidenceAbsorption(layer: PorousLayer, frequencyHz: number, air: AirProperties = DEFAULT_AIR): number {
	return parisRandomIncidence(surfaceImpedance(layer, frequencyHz, air), air);
}

export type Incidence = 'normal' | 'random';
/** 'centre': the value at the band's nominal centre; 'band-average': mean over 9 log-spaced points across the octave. */
export type BandEvaluation = 'centre' | 'band-average';

export interface PorousBandResult {
	/** One coefficient per planning band (PLANNING_BANDS_HZ). */
	coefficients: number[];
	/** Bands where the material lies outside the models' fitted range. */
	warnings: string[];
}

/** Absorption of the layer per planning band, with a warning for bands outside 0.01 < X < 1. */
export function porousBandAbsorption(
	layer: PorousLayer,
	options: { incidence?: Incidence; evaluation?: BandEvaluation; air?: AirProperties } = {}
): PorousBandResult {
	const air = options.air ?? DEFAULT_AIR;
	const incidence = options.incidence ?? 'random';
	const evaluation = options.evaluation ?? 'centre';
	const at = (f: number) =>
		incidence === 'random' ? randomIncidenceAbsorption(layer, f, air) : normalIncidenceAbsorption(layer, f, air);
	const warnings: string[] = [];
	const coefficients = PLANNING_BANDS_HZ.map((fc) => {
		const X = flowParameter(fc, layer.flowResistivity, air);
		if (X < DELANY_BAZLEY_RANGE.min || X > DELANY_BAZLEY_RANGE.max) {
			warnings.push(
				`${fc} Hz: X = ρ0·f/σ = ${X.toPrecision(3)} lies outside the fitted range 0.01…1; treat the value as an estimate`
			);
		}
		if (evaluation === 'centre') return at(fc);
		const { loHz, hiHz } = octaveEdgesHz(fc);
		const points = 9;
		let sum = 0;
		for (let i = 0; i < points; i++) sum += at(loHz * (hiHz / loHz) ** (i / (points - 1)));
		return sum / points;
	});
	return { coefficients, warnings };
}

export interface PorousPreset {
	id: string;
	name: string;
	/** Flow resistivity σ, Pa·s/m². */
	flowResistivity: number;
	source: string;
	confidence: 'from memory';
}

const PRESET_SOURCE = "typical ranges, Cox & D'Antonio, Acoustic Absorbers and Diffusers, porous absorbers chapter";

/** Typical flow resistivities; real products vary by a factor of two — use a datasheet when there is one. */
export const POROUS_PRESETS: readonly PorousPreset[] = [
	{ id: 'glass-wool-light', name: 'Glass wool, light (≈ 16–24 kg/m³)', flowResistivity: 10_000, source: PRESET_SOURCE, confidence: 'from memory' },
	{ id: 'glass-wool-dense', name: 'Glass wool, dense (≈ 32–48 kg/m³)', flowResistivity: 20_000, source: PRESET_SOURCE, confidence: 'from memory' },
	{ id: 'rock-wool-40', name: 'Rock wool ≈ 40 kg/m³', flowResistivity: 15_000, source: PRESET_SOURCE, confidence: 'from memory' },
	{ id: 'rock-wool-60', name: 'Rock wool ≈ 60 kg/m³', flowResistivity: 22_000, source: PRESET_SOURCE, confidence: 'from memory' },
	{ id: 'rock-wool-80', name: 'Rock wool ≈ 80 kg/m³', flowResistivity: 30_000, source: PRESET_SOURCE, confidence: 'from memory' },
	{ id: 'polyester-fibre', name: 'Polyester fibre panel (≈ 30 kg/m³)', flowResistivity: 8_000, source: PRESET_SOURCE, confidence: 'from memory' },
	{ id: 'melamine-foam', name: 'Melamine foam', flowResistivity: 10_000, source: PRESET_SOURCE, confidence: 'from memory' }
];

export function porousPresetById(id: string): PorousPreset {
	const p = POROUS_PRESETS.find((x) => x.id === id);
	if (!p) throw new Error(`unknown porous preset "${id}"; known: ${POROUS_PRESETS.map((x) => x.id).join(', ')}`);
	return p;
}
