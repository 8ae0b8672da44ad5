// From a problem band to treatment proposals, each with the formula that justifies it.
import { formatHz, formatHzRange } from '../format';
import { DEFAULT_AIR, type AirProperties } from './air';
import { geometricCentreHz, PLANNING_BANDS_HZ } from './bands';
import { designDiffuser, isPrime, type DiffuserDesign } from './diffuser';
import {
	cavityDepthForResonance,
	membraneActionRangeHz,
	membraneBandAbsorption,
	membraneModelWarnings,
	membraneResonanceHz,
	panelSurfaceMass,
	PANEL_THICKNESSES_MM,
	type MembraneTrap
} from './membrane';
import { porousBandAbsorption, randomIncidenceAbsorption, type PorousLayer } from './porous';

export interface ProblemBand {
	fLoHz: number;
	fHiHz: number;
	note?: string;
}

/** Where a band sits: below ≈ 200 Hz (centre) is modal, from 1 kHz (lower edge) up is flutter/echo territory (common practice, no source). */
export type BandRegion = 'low' | 'mid' | 'high';
export const LOW_REGION_CENTRE_HZ = 200;
export const HIGH_REGION_LOWER_EDGE_HZ = 1000;

/** A porous proposal must reach this random-incidence α at the band's lower edge (common practice, no source). */
export const POROUS_TARGET_ALPHA = 0.5;
export const POROUS_THICKNESSES_MM = [25, 50, 100, 150, 200] as const;
export const POROUS_GAPS_MM = [0, 50, 100, 150, 200, 250, 300] as const;
/** A membrane cavity between these depths is practical to build (common practice, no source). */
export const MEMBRANE_DEPTH_RANGE_MM = { min: 50, max: 300 } as const;

/** Random-incidence absorption of a wooden Schroeder diffuser, a planning value (Cox & D'Antonio, from memory: 0.1–0.2). */
export const DIFFUSER_ABSORPTION_ESTIMATE = 0.15;

export type Proposal =
	| (ProposalBase & { kind: 'membrane-trap'; trap: MembraneTrap & { panelThicknessMm: number; resonanceHz: number } })
	| (ProposalBase & { kind: 'porous-absorber'; layer: Required<PorousLayer>; alphaAtLowerEdge: number })
	| (ProposalBase & { kind: 'diffuser'; diffuser: DiffuserDesign });

interface ProposalBase {
	title: string;
	/** One plain sentence naming the formula the proposal rests on. */
	why: string;
	/** Frequencies the treatment acts on. */
	actionRangeHz: { loHz: number; hiHz: number };
	/** Whether the action range spans the whole problem band. */
	coversBand: boolean;
	/** Planning absorption per planning band, for the reverberation prediction. */
	coefficients: number[];
	warnings: string[];
}

export interface PlannerOptions {
	air?: AirProperties;
	/** Flow resistivity of the porous fill the planner assumes, Pa·s/m² (default: light glass wool). */
	flowResistivity?: number;
	/** Well fins of the diffuser, m. */
	diffuserFinThicknessM?: number;
	/** Deepest diffuser well the room allows, m. */
	diffuserMaxDepthM?: number;
}

export interface TreatmentPlan {
	band: ProblemBand;
	region: BandRegion;
	proposals: Proposal[];
	notes: string[];
}


export function bandRegion(band: ProblemBand): BandRegion {
	if (geometricCentreHz(band.fLoHz, band.fHiHz) < LOW_REGION_CENTRE_HZ) return 'low';
	if (band.fLoHz >= HIGH_REGION_LOWER_EDGE_HZ) return 'high';
	return 'mid';
}

function checkBand(band: ProblemBand): void {
	if (!(band.fLoHz > 0 && Number.isFinite(band.fLoHz))) throw new Error(`lower edge must be a positive frequency, got ${band.fLoHz} Hz`);
	if (!(band.fHiHz > band.fLoHz && Number.isFinite(band.fHiHz))) {
		throw new Error(`upper edge (${band.fHiHz} Hz) must lie above the lower edge (${band.fLoHz} Hz)`);
	}
}

/** Coverage allows 2 %: a cavity rounded to whole mm must not turn a one-octave match into a miss (common practice, no source). */
const COVERAGE_TOLERANCE = 1.02;
const covers = (range: { loHz: number; hiHz: number }, band: ProblemBand) =>
	range.loHz <= band.fLoHz * COVERAGE_TOLERANCE && range.hiHz * COVERAGE_TOLERANCE >= band.fHiHz;

/** Membrane trap tuned to the band's geometric centre, on the thinnest plywood giving a practical cavity. */
export function proposeMembraneTrap(band: ProblemBand, air: AirProperties = DEFAULT_AIR): Proposal {
	checkBand(band);
	const target = geometricCentreHz(band.fLoHz, band.fHiHz);
	const candidates = PANEL_THICKNESSES_MM.map((t) => {
		const mass = panelSurfaceMass(t / 1000);
		return { t, mass, depthMm: Math.round(cavityDepthForResonance(target, mass, 'porous', air) * 1000) };
	});
	const warnings: string[] = [];
	let chosen = candidates.find((c) => c.depthMm >= MEMBRANE_DEPTH_RANGE_MM.min && c.depthMm <= MEMBRANE_DEPTH_RANGE_MM.max);
	if (!chosen) {
		chosen = target < 100 ? candidates[candidates.length - 1] : candidates[0];
		warnings.push(`no standard panel gives a cavity of ${MEMBRANE_DEPTH_RANGE_MM.min}–${MEMBRANE_DEPTH_RANGE_MM.max} mm at ${formatHz(target)}; the cavity is ${chosen.depthMm} mm`);
	}
	const trap: MembraneTrap = { surfaceMassKgM2: chosen.mass, cavityDepthM: chosen.depthMm / 1000, cavityFill: 'porous' };
	const f0 = membraneResonanceHz(trap, air);
	warnings.push(...membraneModelWarnings(trap, air));
	const range = membraneActionRangeHz(f0);
	const coversBand = covers(range, band);
	if (!coversBand) {
		warnings.push(`the trap acts on ${formatHzRange(range.loHz, range.hiHz)}, not the whole ${formatHzRange(band.fLoHz, band.fHiHz)}; add a second trap tuned to the uncovered part`);
	}
	return {
		kind: 'membrane-trap',
		title: `Panel trap, ${chosen.t} mm plywood over a ${chosen.depthMm} mm fibre-filled cavity`,
		why: `A ${chosen.t} mm plywood panel (m′ = ${chosen.mass.toFixed(1)} kg/m²) on a ${chosen.depthMm} mm cavity filled with fibre resonates at f0 = (1/2π)·√(ρ0c0²/(γ·m′·d)) ≈ ${formatHz(f0)} and absorbs about an octave around it, ${formatHzRange(range.loHz, range.hiHz)}.`,
		actionRangeHz: range,
		coversBand,
		coefficients: membraneBandAbsorption(trap, air),
		warnings,
		trap: { ...trap, panelThicknessMm: chosen.t, resonanceHz: f0 }
	};
}

/** Range around `fromHz` over which α stays ≥ threshold, scanned in 1/24-octave steps within 10 Hz … `topHz`. */
function rangeAboveThreshold(
	layer: PorousLayer,
	threshold: number,
	fromHz: number,
	topHz: number,
	air: AirProperties
): { loHz: number; hiHz: number } {
	const step = 2 ** (1 / 24);
	let lo = fromHz;
	while (lo / step > 10 && randomIncidenceAbsorption(layer, lo / step, air) >= threshold) lo /= step;
	let hi = fromHz;
	while (hi * step <= topHz && randomIncidenceAbsorption(layer, hi * step, air) >= threshold) hi *= step;
	return { loHz: lo, hiHz: hi >= topHz / step ? topHz : hi };
}

/** Porous layer (with air gap) of least total depth reaching POROUS_TARGET_ALPHA at the band's lower edge, or null. */
export function proposePorousAbsorber(band: ProblemBand, options: PlannerOptions = {}): Proposal | null {
	checkBand(band);
	const air = options.air ?? DEFAULT_AIR;
	const sigma = options.flowResistivity ?? 10_000;
	let best: { layer: Required<PorousLayer>; alpha: number; depth: number } | null = null;
	for (const t of POROUS_THICKNESSES_MM) {
		for (const g of POROUS_GAPS_MM) {
			const layer: Required<PorousLayer> = { flowResistivity: sigma, thicknessM: t / 1000, airGapM: g / 1000, model: 'miki' };
			const alpha = randomIncidenceAbsorption(layer, band.fLoHz, air);
			if (alpha < POROUS_TARGET_ALPHA) continue;
			if (!best || t + g < best.depth || (t + g === best.depth && t < best.layer.thicknessM * 1000)) {
				best = { layer, alpha, depth: t + g };
			}
		}
	}
	if (!best) return null;
	const { layer, alpha } = best;
	const bands = porousBandAbsorption(layer, { air });
	const topHz = PLANNING_BANDS_HZ[PLANNING_BANDS_HZ.length - 1] * Math.SQRT2;
	const range = rangeAboveThreshold(layer, POROUS_TARGET_ALPHA, band.fLoHz, topHz, air);
	const tMm = layer.thicknessM * 1000;
	const gMm = layer.airGapM * 1000;
	const mount = gMm > 0 ? `with a ${gMm} mm air gap behind it` : 'mounted on the wall';
	return {
		kind: 'porous-absorber',
		title: `Porous absorber, ${tMm} mm fibre ${mount}`,
		why: `A ${tMm} mm layer of fibre (σ = ${(sigma / 1000).toFixed(0)} kPa·s/m²) ${mount} absorbs α ≈ ${alpha.toFixed(2)} at ${formatHz(band.fLoHz)} and more above it (Miki's model, layer and gap by the transfer matrix, random incidence by Paris' formula).`,
		actionRangeHz: range,
		coversBand: covers(range, band),
		coefficients: bands.coefficients,
		warnings: bands.warnings,
		layer,
		alphaAtLowerEdge: alpha
	};
}

/** Quadratic-residue diffuser designed at the band's lower edge with wells narrow enough for its upper edge. */
export function proposeDiffuser(band: ProblemBand, options: PlannerOptions = {}): Proposal {
	checkBand(band);
	const c = (options.air ?? DEFAULT_AIR).speedOfSound;
	// f_max = c/(2w) ≥ fHi → w ≤ c/(2·fHi); rounded down to 5 mm, at least 20 mm.
	const wellWidthM = Math.max(0.02, Math.floor((c / (2 * band.fHiHz)) * 200) / 200);
	// Smallest prime ≥ 7 whose first flat plate N·f0 lies above the working range.
	let prime = 7;
	while (!(isPrime(prime) && prime * band.fLoHz > c / (2 * wellWidthM))) prime++;
	const diffuser = designDiffuser({
		kind: 'quadratic-residue',
		prime,
		designFrequencyHz: band.fLoHz,
		wellWidthM,
		finThicknessM: options.diffuserFinThicknessM ?? 0.006,
		maxDepthM: options.diffuserMaxDepthM,
		speedOfSound: c
	});
	const range = diffuser.workingRangeHz;
	return {
		kind: 'diffuser',
		title: `Quadratic-residue diffuser, N = ${prime}, ${(wellWidthM * 1000).toFixed(0)} mm wells`,
		why: `A quadratic-residue diffuser (wells s_n = n² mod ${prime}, depths s_n·λ0/(2N)) designed at ${formatHz(diffuser.designFrequencyHz)} with ${(wellWidthM * 1000).toFixed(0)} mm wells scatters from f0 up to c/(2w) = ${formatHz(range.hiHz)}, breaking up the reflection instead of deadening the room.`,
		actionRangeHz: range,
		coversBand: covers(range, band),
		coefficients: PLANNING_BANDS_HZ.map(() => DIFFUSER_ABSORPTION_ESTIMATE),
		warnings: diffuser.warnings,
		diffuser
	};
}

/** Proposals for one problem band: traps and deep absorbers low, porous panels mid, diffusers and thin absorbers high. */
export function planTreatment(band: ProblemBand, options: PlannerOptions = {}): TreatmentPlan {
	checkBand(band);
	const region = bandRegion(band);
	const proposals: Proposal[] = [];
	const notes: string[] = [];
	const porous = proposePorousAbsorber(band, options);
	if (region === 'low') {
		proposals.push(proposeMembraneTrap(band, options.air));
		if (porous) proposals.push(porous);
		else notes.push(`no porous absorber up to ${Math.max(...POROUS_THICKNESSES_MM) + Math.max(...POROUS_GAPS_MM)} mm deep reaches α ${POROUS_TARGET_ALPHA} at ${formatHz(band.fLoHz)}; a panel trap is the practical choice`);
	} else if (region === 'mid') {
		if (porous) proposals.push(porous);
		else notes.push(`no porous absorber in the searched sizes reaches α ${POROUS_TARGET_ALPHA} at ${formatHz(band.fLoHz)}`);
	} else {
		proposals.push(proposeDiffuser(band, options));
		if (porous) proposals.push(porous);
	}
	return { band, region, proposals, notes };
}
