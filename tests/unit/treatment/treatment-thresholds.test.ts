// The treatment modules' thresholds, each tested exactly at, just below and just above its value.
import { describe, expect, it } from 'vitest';
import { calibrate } from '../../../src/lib/treatment/calibrate';
import { membraneModelWarnings, membraneResonanceHz } from '../../../src/lib/treatment/membrane';
import { porousBandAbsorption } from '../../../src/lib/treatment/porous';
import { chooseFormula } from '../../../src/lib/treatment/reverb';

describe('which reverberation formula heads the prediction (common practice, no source)', () => {
	// Sabine for a live room, mean α up to 0.2; above it Eyring, or Millington when the surfaces'
	// coefficients differ more than fivefold.
	it.each([
		{ alpha: 0.2, formula: 'sabine', case: 'mean α exactly 0.2' },
		{ alpha: 0.2 - 1e-9, formula: 'sabine', case: 'just below 0.2' },
		{ alpha: 0.2 + 1e-9, formula: 'eyring', case: 'just above 0.2' }
	])('one surface, $case: $formula', ({ alpha, formula }) => {
		expect(chooseFormula([{ areaM2: 1, alpha }]).formula).toBe(formula);
	});

	it.each([
		{ high: 0.5, formula: 'eyring', case: 'exactly 5 ×' },
		{ high: 0.5 - 1e-9, formula: 'eyring', case: 'just under 5 ×' },
		{ high: 0.5 + 1e-9, formula: 'millington', case: 'just over 5 ×' }
	])('coefficients 0.1 and $high on equal areas ($case): $formula', ({ high, formula }) => {
		expect(chooseFormula([{ areaM2: 1, alpha: 0.1 }, { areaM2: 1, alpha: high }]).formula).toBe(formula);
	});

	it('a bare surface (α = 0) counts as 0.01 in the spread, so the ratio stays finite: 0.5 against it is 50 ×', () => {
		const choice = chooseFormula([{ areaM2: 1, alpha: 0.5 }, { areaM2: 1, alpha: 0 }]);
		expect(choice).toEqual({ formula: 'millington', reason: 'coefficients differ by 50.0× between surfaces: Millington weights each surface' });
	});
});

describe('Delany–Bazley’s fitted range 0.01 ≤ X = ρ0·f/σ ≤ 1 (Delany & Bazley, Appl. Acoust. 3:105, 1970)', () => {
	// ρ0 = 1.25 kg/m³ makes X exact in binary: 1.25 · 125 / 15 625 = 0.01 and 1.25 · 8000 / 10 000 = 1.
	const air = { density: 1.25, speedOfSound: 343 };
	const warned = (flowResistivity: number, band: string) =>
		porousBandAbsorption({ flowResistivity, thicknessM: 0.05, model: 'delany-bazley' }, { air }).warnings.some((w) => w.startsWith(`${band} Hz:`));

	it.each([
		{ sigma: 15_625, warns: false, case: 'X exactly 0.01' },
		{ sigma: 15_625 * (1 + 1e-9), warns: true, case: 'X just below 0.01' },
		{ sigma: 15_625 * (1 - 1e-9), warns: false, case: 'X just above 0.01' }
	])('125 Hz, σ = $sigma ($case): warns $warns', ({ sigma, warns }) => {
		expect(warned(sigma, '125')).toBe(warns);
	});

	it.each([
		{ sigma: 10_000, warns: false, case: 'X exactly 1' },
		{ sigma: 10_000 * (1 + 1e-9), warns: false, case: 'X just below 1' },
		{ sigma: 10_000 * (1 - 1e-9), warns: true, case: 'X just above 1' }
	])('8 kHz, σ = $sigma ($case): warns $warns', ({ sigma, warns }) => {
		expect(warned(sigma, '8000')).toBe(warns);
	});
});

describe('a membrane cavity deeper than λ/12 at resonance is flagged (common practice, no source)', () => {
	// f0 = √(ρ0c0²/(m'·d))/2π and λ = c0/f0 make d = λ/12 at d* = (π/6)²·m'/ρ0 for an empty cavity:
	// 0.27416 · 1 kg/m² / 1.21 kg/m³ = 0.2266 m.
	const surfaceMassKgM2 = 1;
	const critical = (Math.PI / 6) ** 2 * (surfaceMassKgM2 / 1.21);

	it('the critical depth is λ/12 at its own resonance', () => {
		const f0 = membraneResonanceHz({ surfaceMassKgM2, cavityDepthM: critical, cavityFill: 'empty' });
		expect(critical / (343 / f0)).toBeCloseTo(1 / 12, 12);
	});

	it.each([
		{ factor: 1 - 1e-6, warns: false, case: 'just shallower' },
		{ factor: 1 + 1e-6, warns: true, case: 'just deeper' }
	])('a cavity $case than λ/12: warns $warns', ({ factor, warns }) => {
		const warnings = membraneModelWarnings({ surfaceMassKgM2, cavityDepthM: critical * factor, cavityFill: 'empty' });
		expect(warnings.length > 0).toBe(warns);
		if (warns) expect(warnings[0]).toMatch(/^cavity depth 227 mm exceeds λ\/12 at \d+ Hz/);
	});
});

describe('calibration keeps the measurement when the finishes overstate the absorption (product rule)', () => {
	// 100 m² of α = 0.25 in 100 m³: A = 25 m², so Sabine's T = 24·ln10·V/(c·A) = 0.6445 s with c = 343 m/s.
	// Measured exactly that, the residual is zero: nothing is overstated.
	const volumeM3 = 100;
	const exactS = (24 * Math.LN10 * volumeM3) / (343 * 25);
	const run = (measured: number) =>
		calibrate({ volumeM3, patches: [{ areaM2: 100, coefficients: Array(8).fill(0.25) }], measuredS: Array(8).fill(measured), speedOfSound: 343 });

	it('measured exactly as the finishes predict: residual 0, not clamped, no warning', () => {
		const c = run(exactS);
		expect(c.bands.map((b) => b.rawResidualM2)).toEqual(Array(8).fill(0));
		expect(c.bands.some((b) => b.clamped)).toBe(false);
		expect(c.warnings).toEqual([]);
	});

	it('measured a little longer (less absorption than assumed): negative residual, clamped, one warning per band', () => {
		const c = run(exactS * (1 + 1e-9));
		expect(c.bands.every((b) => b.rawResidualM2! < 0 && b.clamped)).toBe(true);
		expect(c.warnings).toHaveLength(8);
		expect(c.warnings[0]).toMatch(/^63 Hz: assumed finishes absorb more than measured/);
	});

	it('measured a little shorter (more absorption than assumed): positive residual, not clamped', () => {
		const c = run(exactS * (1 - 1e-9));
		expect(c.bands.every((b) => b.rawResidualM2! > 0 && !b.clamped)).toBe(true);
		expect(c.warnings).toEqual([]);
	});
});
