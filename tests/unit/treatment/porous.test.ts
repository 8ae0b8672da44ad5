import { describe, expect, it } from 'vitest';
import { DEFAULT_AIR } from '../../../src/lib/treatment/air';
import { PLANNING_BANDS_HZ, TABLE_BANDS_HZ } from '../../../src/lib/treatment/bands';
import { complex } from '../../../src/lib/treatment/complex';
import {
	absorptionFromImpedance,
	normalIncidenceAbsorption,
	parisRandomIncidence,
	porousBandAbsorption,
	porousMedium,
	randomIncidenceAbsorption,
	surfaceImpedance,
	validFrequencyRangeHz,
	type PorousModel
} from '../../../src/lib/treatment/porous';
import { gaussLegendreUnit, integrateUnit } from '../../../src/lib/treatment/quadrature';

const SIGMA = 10_000; // 10 kPa·s/m²
const D = 0.05;

describe('normal-incidence absorption of a 50 mm layer on a rigid wall', () => {
	// Values computed from the published models
	// (Delany & Bazley, Appl. Acoust. 3:105, 1970; Miki, J. Acoust. Soc. Jpn (E) 11:19, 1990) with
	// Zs = −j Zc cot(kd); ±0.005 because the table is rounded to three decimals.
	const table: [PorousModel, number[]][] = [
		['delany-bazley', [0.034, 0.172, 0.496, 0.885, 0.986, 0.973]],
		['miki', [0.066, 0.192, 0.485, 0.883, 0.982, 0.971]]
	];
	for (const [model, expected] of table) {
		it.each(TABLE_BANDS_HZ.map((f, i) => [f, expected[i]] as const))(`${model} at %i Hz → %f`, (f, alpha) => {
			expect(Math.abs(normalIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D, model }, f) - alpha)).toBeLessThanOrEqual(0.005);
		});
	}

	it('matches the scipy/numpy oracle to 1e-6 (tests/reference/treatment_porous.py)', () => {
		// Same formulas evaluated independently in numpy; 1e-6 covers the printed 6 decimals.
		const oracle = [0.034141, 0.172472, 0.496065, 0.884901, 0.986155, 0.973356];
		TABLE_BANDS_HZ.forEach((f, i) => {
			expect(normalIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D, model: 'delany-bazley' }, f)).toBeCloseTo(oracle[i], 5);
		});
	});
});

describe('sign convention e^{+jωt}', () => {
	it.each(['delany-bazley', 'miki'] as const)('%s: lossy wavenumber has Im k < 0, Re Zc > ρ0c0, rigid-backed layer is stiff (Im Zs < 0) at 125 Hz', (model) => {
		// Physical check: a wave e^{j(ωt−kx)} decays into the material only when Im k < 0; a thin
		// layer on a wall is a compliance, reactance −1/(ωC) < 0 (Kuttruff, Room Acoustics — from memory).
		const m = porousMedium(model, 125, SIGMA);
		expect(m.wavenumber.im).toBeLessThan(0);
		expect(m.characteristicImpedance.re).toBeGreaterThan(DEFAULT_AIR.density * DEFAULT_AIR.speedOfSound);
		expect(surfaceImpedance({ flowResistivity: SIGMA, thicknessM: D, model }, 125).im).toBeLessThan(0);
	});
});

describe('air gap', () => {
	it.each(TABLE_BANDS_HZ)('a gap of 0 equals no gap at %i Hz (exactly the same path)', (f) => {
		const without = normalIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D }, f);
		const zero = normalIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D, airGapM: 0 }, f);
		expect(zero).toBe(without);
	});

	it('a tiny gap tends to the no-gap value (continuity of the impedance translation)', () => {
		// 1 µm of air changes α by far less than 1e-4: the translated impedance is continuous in the gap.
		for (const f of TABLE_BANDS_HZ) {
			const a = normalIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D, airGapM: 1e-6 }, f);
			expect(Math.abs(a - normalIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D }, f))).toBeLessThan(1e-4);
		}
	});

	it('a 100 mm gap raises the 125 and 250 Hz absorption (physical check: the layer sits nearer the velocity maximum)', () => {
		for (const f of [125, 250]) {
			const onWall = randomIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D }, f);
			const spaced = randomIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D, airGapM: 0.1 }, f);
			expect(spaced).toBeGreaterThan(onWall + 0.1);
		}
	});

	it('layer + gap matches the scipy oracle at random incidence (tests/reference/treatment_porous.py)', () => {
		// Oracle integrates over θ with scipy.integrate.quad; ours uses Gauss–Legendre in cos θ.
		// 1e-5: quadrature and printing both well below that.
		const oracle: Record<PorousModel, number[]> = {
			'delany-bazley': [0.408164, 0.740586, 0.919788, 0.885694, 0.950241, 0.915681],
			miki: [0.393748, 0.723117, 0.921582, 0.872665, 0.945461, 0.927943]
		};
		for (const model of ['delany-bazley', 'miki'] as const) {
			TABLE_BANDS_HZ.forEach((f, i) => {
				const a = randomIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D, airGapM: 0.1, model }, f);
				expect(Math.abs(a - oracle[model][i])).toBeLessThan(1e-5);
			});
		}
	});
});

describe('random incidence by the Paris integral', () => {
	// For a real normalised impedance ζ the integral ∫0^{π/2} 4ζcosθ/(ζcosθ+1)²·sin2θ dθ has the
	// closed form 8/ζ·[1 + 1/(1+ζ) − (2/ζ)·ln(1+ζ)] (substitute u = cosθ, then v = ζu + 1; London,
	// JASA 22:263, 1950, and Kuttruff, Room Acoustics — from memory; derived again here).
	const closedForm = (zeta: number) => (8 / zeta) * (1 + 1 / (1 + zeta) - (2 / zeta) * Math.log(1 + zeta));
	const z0 = DEFAULT_AIR.density * DEFAULT_AIR.speedOfSound;

	it.each([0.3, 1, 1.567, 3, 10, 40])('ζ = %f matches the closed form to 1e-10', (zeta) => {
		// Integrand is a smooth rational function of cos θ: 64-point Gauss–Legendre is exact to rounding.
		expect(Math.abs(parisRandomIncidence(complex(zeta * z0), DEFAULT_AIR) - closedForm(zeta))).toBeLessThan(1e-10);
	});

	it('a ρ0c0-matched surface (ζ = 1) absorbs 8·(1.5 − 2 ln 2) ≈ 0.9096 in a diffuse field, not 1', () => {
		expect(parisRandomIncidence(complex(z0))).toBeCloseTo(8 * (1.5 - 2 * Math.LN2), 10);
		expect(absorptionFromImpedance(complex(z0))).toBeCloseTo(1, 12);
	});

	it('the maximum over real ζ is ≈ 0.951 near ζ ≈ 1.57 (Kuttruff, Room Acoustics — from memory; scipy quad 0.951222 at 1.567)', () => {
		let best = { zeta: 0, alpha: 0 };
		for (let zeta = 0.5; zeta <= 4; zeta += 0.001) {
			const a = closedForm(zeta);
			if (a > best.alpha) best = { zeta, alpha: a };
		}
		expect(best.alpha).toBeCloseTo(0.9512, 3);
		expect(best.zeta).toBeGreaterThan(1.5);
		expect(best.zeta).toBeLessThan(1.65);
		expect(parisRandomIncidence(complex(1.567 * z0))).toBeCloseTo(0.951222, 5);
	});

	it('50 mm Delany–Bazley layer matches the scipy quad oracle (tests/reference/treatment_porous.py)', () => {
		const oracle = [0.054801, 0.226043, 0.505795, 0.764679, 0.923385, 0.876391];
		TABLE_BANDS_HZ.forEach((f, i) => {
			const a = randomIncidenceAbsorption({ flowResistivity: SIGMA, thicknessM: D, model: 'delany-bazley' }, f);
			expect(Math.abs(a - oracle[i])).toBeLessThan(1e-5);
		});
	});
});

describe('Gauss–Legendre rule', () => {
	it.each([1, 2, 5, 16, 64])('%i points: weights sum to 1 and nodes lie in (0, 1)', (n) => {
		const { nodes, weights } = gaussLegendreUnit(n);
		expect(weights.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 13);
		for (const x of nodes) {
			expect(x).toBeGreaterThan(0);
			expect(x).toBeLessThan(1);
		}
	});

	it('an n-point rule integrates u^(2n−1) exactly and not u^(2n) (degree of exactness 2n − 1)', () => {
		const n = 4;
		expect(integrateUnit((u) => u ** 7, n)).toBeCloseTo(1 / 8, 14);
		expect(Math.abs(integrateUnit((u) => u ** 8, n) - 1 / 9)).toBeGreaterThan(1e-7);
	});

	it.each([0, 1.5, 1000])('rejects order %f', (n) => {
		expect(() => gaussLegendreUnit(n)).toThrow(/order/);
	});
});

describe('band values and validity range', () => {
	it('reports the Delany–Bazley range 0.01 < ρ0f/σ < 1 in Hz for σ = 10 kPa·s/m²', () => {
		// X = ρ0 f/σ → f = Xσ/ρ0: 82.6 Hz … 8264 Hz with ρ0 = 1.21 kg/m³.
		const r = validFrequencyRangeHz(SIGMA);
		expect(r.loHz).toBeCloseTo((0.01 * SIGMA) / 1.21, 6);
		expect(r.hiHz).toBeCloseTo(SIGMA / 1.21, 6);
	});

	it('warns for the 63 Hz band (X < 0.01) and not for 125 Hz … 4 kHz', () => {
		const { coefficients, warnings } = porousBandAbsorption({ flowResistivity: SIGMA, thicknessM: D });
		expect(coefficients).toHaveLength(PLANNING_BANDS_HZ.length);
		expect(warnings.some((w) => w.startsWith('63 Hz'))).toBe(true);
		expect(warnings.some((w) => /^(125|250|500|1000|2000|4000) Hz/.test(w))).toBe(false);
	});

	it('band-average differs from the centre value but stays within the band’s extremes', () => {
		const layer = { flowResistivity: SIGMA, thicknessM: D };
		const centre = porousBandAbsorption(layer, { evaluation: 'centre' }).coefficients;
		const average = porousBandAbsorption(layer, { evaluation: 'band-average' }).coefficients;
		const i = PLANNING_BANDS_HZ.indexOf(250);
		expect(average[i]).not.toBeCloseTo(centre[i], 3);
		const lo = randomIncidenceAbsorption(layer, 250 / Math.SQRT2);
		const hi = randomIncidenceAbsorption(layer, 250 * Math.SQRT2);
		expect(average[i]).toBeGreaterThan(Math.min(lo, hi));
		expect(average[i]).toBeLessThan(Math.max(lo, hi));
	});

	it('band-average is the mean of nine points spaced evenly in log frequency from f/√2 to f·√2, for either incidence (product rule, common practice, no source)', () => {
		const layer = { flowResistivity: SIGMA, thicknessM: D };
		const points = (fc: number) => Array.from({ length: 9 }, (_, k) => (fc / Math.SQRT2) * 2 ** (k / 8));
		const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;
		const random = porousBandAbsorption(layer, { evaluation: 'band-average' }).coefficients;
		const normal = porousBandAbsorption(layer, { evaluation: 'band-average', incidence: 'normal' }).coefficients;
		PLANNING_BANDS_HZ.forEach((fc, i) => {
			expect(random[i]).toBeCloseTo(mean(points(fc).map((f) => randomIncidenceAbsorption(layer, f))), 12);
			expect(normal[i]).toBeCloseTo(mean(points(fc).map((f) => normalIncidenceAbsorption(layer, f))), 12);
		});
	});

	it.each([
		[{ flowResistivity: 0, thicknessM: D }, /flow resistivity/],
		[{ flowResistivity: SIGMA, thicknessM: -0.01 }, /thickness/],
		[{ flowResistivity: SIGMA, thicknessM: D, airGapM: -1 }, /air gap/]
	])('rejects a bad layer %o', (layer, message) => {
		expect(() => normalIncidenceAbsorption(layer, 500)).toThrow(message);
	});

	it('rejects an unknown model', () => {
		expect(() => porousMedium('foam' as PorousModel, 500, SIGMA)).toThrow(/unknown porous model/);
	});
});
