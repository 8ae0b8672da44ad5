import { describe, expect, it } from 'vitest';
import { PLANNING_BANDS_HZ } from '../../../src/lib/treatment/bands';
import {
	cavityDepthForResonance,
	membraneAbsorptionEstimate,
	membraneActionRangeHz,
	membraneBandAbsorption,
	membraneModelWarnings,
	membraneResonanceHz,
	panelSurfaceMass
} from '../../../src/lib/treatment/membrane';

const RHO0 = 1.21;
const C0 = 343;

describe('panel resonance f0 = (1/2π)·√(ρ0c0²/(m′·d)) (mass on an air spring; Everest & Pohlmann, Cox & D’Antonio — from memory)', () => {
	it('6 mm plywood (600 kg/m³ from memory → m′ = 3.6 kg/m²) over 100 mm of empty cavity ≈ 100 Hz', () => {
		const m = panelSurfaceMass(0.006, 600);
		expect(m).toBeCloseTo(3.6, 12);
		const f0 = membraneResonanceHz({ surfaceMassKgM2: m, cavityDepthM: 0.1, cavityFill: 'empty' });
		const formula = Math.sqrt((RHO0 * C0 * C0) / (m * 0.1)) / (2 * Math.PI);
		expect(f0).toBeCloseTo(formula, 10);
		// The rule of thumb 60/√(m′d) with m′ in kg/m², d in m (handbooks, from memory): 100 Hz; ±0.5 %
		// because 60 rounds (1/2π)·√(1.21·343²) = 60.05.
		expect(Math.abs(f0 / (60 / Math.sqrt(m * 0.1)) - 1)).toBeLessThan(0.005);
	});

	it('a fibre-filled cavity lowers f0 by √γ = √1.4 (isothermal instead of adiabatic), the handbooks’ 50 instead of 60', () => {
		const trap = { surfaceMassKgM2: 3.6, cavityDepthM: 0.1 };
		const ratio = membraneResonanceHz({ ...trap, cavityFill: 'empty' }) / membraneResonanceHz({ ...trap, cavityFill: 'porous' });
		expect(ratio).toBeCloseTo(Math.sqrt(1.4), 12);
		expect(Math.abs(membraneResonanceHz({ ...trap, cavityFill: 'porous' }) / (50 / Math.sqrt(0.36)) - 1)).toBeLessThan(0.02);
	});

	it.each([
		[40, 3.6, 'porous'],
		[63, 5.4, 'empty'],
		[120, 1.8, 'porous']
	] as const)('inverse round trip: %i Hz with m′ = %f (%s) → depth → the same f0 (1e-9)', (f, m, fill) => {
		const d = cavityDepthForResonance(f, m, fill);
		expect(d).toBeGreaterThan(0);
		expect(membraneResonanceHz({ surfaceMassKgM2: m, cavityDepthM: d, cavityFill: fill })).toBeCloseTo(f, 9);
	});

	it('doubling mass or depth lowers f0 by √2 (the formula’s scaling)', () => {
		const f = membraneResonanceHz({ surfaceMassKgM2: 3, cavityDepthM: 0.1, cavityFill: 'empty' });
		expect(membraneResonanceHz({ surfaceMassKgM2: 6, cavityDepthM: 0.1, cavityFill: 'empty' })).toBeCloseTo(f / Math.SQRT2, 10);
		expect(membraneResonanceHz({ surfaceMassKgM2: 3, cavityDepthM: 0.2, cavityFill: 'empty' })).toBeCloseTo(f / Math.SQRT2, 10);
	});

	it.each([
		[() => panelSurfaceMass(0), /thickness/],
		[() => panelSurfaceMass(0.006, -1), /density/],
		[() => membraneResonanceHz({ surfaceMassKgM2: 0, cavityDepthM: 0.1, cavityFill: 'empty' }), /surface mass/],
		[() => membraneResonanceHz({ surfaceMassKgM2: 3, cavityDepthM: 0, cavityFill: 'empty' }), /cavity depth/],
		[() => membraneResonanceHz({ surfaceMassKgM2: 3, cavityDepthM: 0.1, cavityFill: 'sand' as 'empty' }), /cavity fill/],
		[() => cavityDepthForResonance(0, 3, 'empty'), /target/]
	])('rejects bad input %#', (fn, message) => expect(fn).toThrow(message));
});

describe('planning estimate of the absorption (common practice, no source)', () => {
	it('peaks at 0.4 at f0 and halves at f0/√2 and f0·√2 (the band of action)', () => {
		expect(membraneAbsorptionEstimate(50, 50)).toBeCloseTo(0.4, 12);
		const { loHz, hiHz } = membraneActionRangeHz(50);
		expect(membraneAbsorptionEstimate(loHz, 50)).toBeCloseTo(0.2, 12);
		expect(membraneAbsorptionEstimate(hiHz, 50)).toBeCloseTo(0.2, 12);
		expect(hiHz / loHz).toBeCloseTo(2, 12);
	});

	it('band values are largest in the band holding f0 and fall off both ways', () => {
		const trap = { surfaceMassKgM2: 3.6, cavityDepthM: cavityDepthForResonance(250, 3.6, 'porous'), cavityFill: 'porous' as const };
		const bands = membraneBandAbsorption(trap);
		const peak = PLANNING_BANDS_HZ.indexOf(250);
		bands.forEach((a, i) => {
			if (i !== peak) expect(a).toBeLessThan(bands[peak]);
			expect(a).toBeGreaterThanOrEqual(0);
			expect(a).toBeLessThanOrEqual(0.4);
		});
		expect(bands[peak - 2]).toBeLessThan(bands[peak - 1]);
		expect(bands[peak + 2]).toBeLessThan(bands[peak + 1]);
	});

	it('warns when the cavity is deep against the wavelength (d > λ/12), not otherwise', () => {
		expect(membraneModelWarnings({ surfaceMassKgM2: 0.5, cavityDepthM: 0.5, cavityFill: 'empty' })).toHaveLength(1);
		expect(membraneModelWarnings({ surfaceMassKgM2: 3.6, cavityDepthM: 0.1, cavityFill: 'empty' })).toEqual([]);
	});
});
