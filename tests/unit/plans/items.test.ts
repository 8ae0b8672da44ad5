import { describe, expect, it } from 'vitest';
import { diffuserDesignOf, itemAcoustics, paramsAcoustics, porousLayerOf, unitWidthMm } from '../../../src/lib/plans/items';
import { PLANNING_BANDS_HZ } from '../../../src/lib/treatment/bands';
import { porousBandAbsorption, randomIncidenceAbsorption } from '../../../src/lib/treatment/porous';
import { C, item, MEMBRANE, POROUS, QRD7 } from './fixtures';

// Air of the membrane formula: ρ0 = 1.21 kg/m³, c0 = 343 m/s, γ = 1.4 (common handbook values for air at about 20 °C, from memory).
const RHO0 = 1.21;
const GAMMA = 1.4;

describe('panel trap: 6 mm plywood over a 276 mm fibre-filled cavity', () => {
	// m′ = ρ·t = 600 kg/m³ · 0.006 m = 3.6 kg/m² (plywood density from memory, typical).
	const mass = 600 * 0.006;
	// Fibre in the cavity makes the compression isothermal: K = ρ0c0²/γ (Cox & D'Antonio — from memory).
	const f0 = Math.sqrt((RHO0 * C * C) / (GAMMA * mass * 0.276)) / (2 * Math.PI);
	const a = itemAcoustics(item({ quantity: 2, widthMm: 600, heightMm: 1200, params: MEMBRANE }));

	it('resonates at f0 = (1/2π)·√(ρ0c0²/(γ·m′·d)) ≈ 50.9 Hz: the action range is f0/√2 … f0·√2', () => {
		expect(f0).toBeCloseTo(50.9, 1); // arithmetic check of the formula itself
		const range = a.actionRangeHz!;
		// Geometric centre of the range is f0; its edges are half an octave either side (1e-9: float arithmetic only).
		expect(Math.sqrt(range.loHz * range.hiHz) / f0 - 1).toBeCloseTo(0, 9);
		expect(range.hiHz / range.loHz).toBeCloseTo(2, 9);
	});

	it('agrees within 3 % with the handbook rule of thumb f0 ≈ 50/√(m′·d) (Everest & Pohlmann — from memory)', () => {
		const ruleOfThumb = 50 / Math.sqrt(mass * 0.276);
		expect(Math.abs(f0 / ruleOfThumb - 1)).toBeLessThan(0.03);
	});

	it('an empty cavity (adiabatic air) resonates √γ higher than a filled one (ρ0c0² against ρ0c0²/γ)', () => {
		const empty = paramsAcoustics({ ...MEMBRANE, cavityFill: 'empty' }).actionRangeHz!;
		const filled = a.actionRangeHz!;
		expect(empty.loHz / filled.loHz).toBeCloseTo(Math.sqrt(GAMMA), 9);
	});

	it('absorbs most in the 63 Hz band (nearest f0), at most the planning peak 0.4 (common practice, no source)', () => {
		const peak = Math.max(...a.coefficients);
		expect(a.coefficients[0]).toBe(peak);
		expect(peak).toBeLessThanOrEqual(0.4);
		expect(peak).toBeGreaterThan(0.2);
		// Planning curve 0.4/(1 + 2·(f/f0 − f0/f)²), band average of 9 log-spaced points (common practice, no source):
		// two octaves above f0 it is far down the skirt.
		const curve = (f: number) => 0.4 / (1 + 2 * (f / f0 - f0 / f) ** 2);
		const band = (fc: number) => Array.from({ length: 9 }, (_, k) => curve((fc / Math.SQRT2) * 2 ** (k / 8))).reduce((s, v) => s + v, 0) / 9;
		PLANNING_BANDS_HZ.forEach((fc, i) => expect(a.coefficients[i]).toBeCloseTo(band(fc), 12));
	});

	it('states the key figures in its method line', () => {
		expect(a.method).toContain('m′ = 3.6 kg/m²');
		expect(a.method).toContain('276 mm fibre-filled cavity');
		expect(a.method).toContain('≈ 50.9 Hz');
		expect(a.diffuser).toBeNull();
	});

	it('face area = quantity × width × height (2 × 0.6 × 1.2 = 1.44 m²)', () => {
		expect(a.totalAreaM2).toBeCloseTo(1.44, 12);
	});

	it('uses the stock’s own density: MDF at 750 kg/m³ gives m′ = 4.5 kg/m² and f0 lower by √(600/750)', () => {
		const mdf = paramsAcoustics({ ...MEMBRANE, panelStockId: 'mdf' });
		expect(mdf.method).toContain('m′ = 4.5 kg/m²');
		expect(mdf.actionRangeHz!.loHz / a.actionRangeHz!.loHz).toBeCloseTo(Math.sqrt(600 / 750), 9);
	});

	it('refuses an unknown panel stock, naming the known ones', () => {
		expect(() => paramsAcoustics({ ...MEMBRANE, panelStockId: 'oak' })).toThrow(/unknown panel stock "oak"; known: plywood, mdf, hardboard/);
	});
});

describe('diffuser: QRD N = 7, f0 = 500 Hz, 50 mm wells, 6 mm fins (worked from the design formulas of Schroeder, JASA 65:958, 1979)', () => {
	const a = itemAcoustics(item({ quantity: 3, widthMm: 0, heightMm: 1200, params: QRD7 }));
	const design = a.diffuser!;

	it('well depths 0, 49, 196, 98, 98, 196, 49 mm (s_n = n² mod 7, d_n = s_n·λ0/(2N); ±0.5 mm)', () => {
		const expected = [0, 49, 196, 98, 98, 196, 49];
		design.wellDepthsM.forEach((d, i) => expect(Math.abs(d * 1000 - expected[i])).toBeLessThan(0.5));
		expect(design.sequence).toEqual([0, 1, 4, 2, 2, 4, 1]);
	});

	it('works from f0 up to c/(2w) = 343/(2·0.05) = 3430 Hz', () => {
		expect(a.actionRangeHz!.loHz).toBeCloseTo(500, 9);
		expect(a.actionRangeHz!.hiHz).toBeCloseTo(3430, 9);
	});

	it('flat-plate frequencies m·N·f0: 3.5 and 7 kHz first', () => {
		expect(design.flatPlateFrequenciesHz.slice(0, 2)).toEqual([3500, 7000]);
	});

	it('panel width 7·50 + 8·6 = 398 mm (seven wells, a fin on each side), the unit width whatever the stored width says', () => {
		expect(design.panelWidthM * 1000).toBeCloseTo(398, 9);
		expect(unitWidthMm(item({ widthMm: 0, params: QRD7 }))).toBeCloseTo(398, 9);
		expect(unitWidthMm(item({ widthMm: 1234, params: QRD7 }))).toBeCloseTo(398, 9);
	});

	it('face area = quantity × 0.398 m × height: 3 × 0.398 × 1.2 = 1.4328 m²', () => {
		expect(a.totalAreaM2).toBeCloseTo(1.4328, 12);
	});

	it('absorbs a flat planning value in the 0.1–0.2 recalled for wooden diffusers (Cox & D’Antonio — from memory)', () => {
		expect(new Set(a.coefficients).size).toBe(1);
		expect(a.coefficients[0]).toBeGreaterThanOrEqual(0.1);
		expect(a.coefficients[0]).toBeLessThanOrEqual(0.2);
		expect(a.coefficients).toHaveLength(PLANNING_BANDS_HZ.length);
	});

	it('primitive-root N = 7 (g = 3): wells 3, 2, 6, 4, 5, 1 and panel 6·50 + 7·6 = 342 mm', () => {
		const prd = diffuserDesignOf({ ...QRD7, sequence: 'primitive-root' });
		expect(prd.primitiveRoot).toBe(3);
		expect(prd.sequence).toEqual([3, 2, 6, 4, 5, 1]);
		expect(prd.panelWidthM * 1000).toBeCloseTo(342, 9);
	});

	it('a depth limit raises f0: deepest well 100 mm → f0 = s_max·c/(2N·d) = 4·343/(14·0.1) = 980 Hz', () => {
		const limited = paramsAcoustics({ ...QRD7, maxDepthMm: 100 });
		expect(limited.actionRangeHz!.loHz).toBeCloseTo(980, 9);
		expect(limited.diffuser!.deepestWellM).toBeCloseTo(0.1, 12);
		expect(limited.warnings.join(' ')).toMatch(/design frequency raised to 980 Hz/);
	});
});

describe('porous absorber: 100 mm fibre, σ = 15 kPa·s/m²', () => {
	const onWall = { ...POROUS, airGapMm: 0 };
	const layer = { flowResistivity: 15_000, thicknessM: 0.1, airGapM: 0, model: 'miki' as const };

	it('coefficients are porousBandAbsorption of the same Miki layer (model checked in tests/unit/treatment/porous.test.ts)', () => {
		const a = paramsAcoustics(onWall);
		expect(porousLayerOf(onWall)).toEqual(layer);
		const expected = porousBandAbsorption(layer).coefficients;
		a.coefficients.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 12));
		expect(a.warnings).toEqual(porousBandAbsorption(layer).warnings);
	});

	it('an air gap goes into the layer in metres (100 mm + 50 mm gap)', () => {
		const a = paramsAcoustics(POROUS);
		const expected = porousBandAbsorption({ ...layer, airGapM: 0.05 }).coefficients;
		a.coefficients.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 12));
		expect(a.method).toContain('100 mm + 50 mm air gap');
	});

	it('the action range starts where α first reaches 0.5 (within the 1/12-octave scan step)', () => {
		const range = paramsAcoustics(onWall).actionRangeHz!;
		// Crossing found here by bisection on the same random-incidence α (independent of the scan).
		let lo = 20;
		let hi = 2000;
		expect(randomIncidenceAbsorption(layer, lo)).toBeLessThan(0.5);
		expect(randomIncidenceAbsorption(layer, hi)).toBeGreaterThan(0.5);
		for (let k = 0; k < 60; k++) {
			const mid = Math.sqrt(lo * hi);
			if (randomIncidenceAbsorption(layer, mid) >= 0.5) hi = mid;
			else lo = mid;
		}
		expect(range.loHz).toBeGreaterThanOrEqual(hi * (1 - 1e-9));
		expect(range.loHz).toBeLessThan(hi * 2 ** (1 / 12));
		expect(randomIncidenceAbsorption(layer, range.loHz)).toBeGreaterThanOrEqual(0.5);
	});

	it('a 100 mm layer on the wall stays above 0.5 to the top band’s upper edge 8000·√2 Hz', () => {
		const range = paramsAcoustics(onWall).actionRangeHz!;
		expect(range.hiHz).toBeCloseTo(8000 * Math.SQRT2, 6);
		for (const f of [range.loHz * 1.5, 1000, 4000, 10_000]) expect(randomIncidenceAbsorption(layer, f)).toBeGreaterThanOrEqual(0.5);
	});

	it('face area uses the stored width: 4 × 0.6 × 1.2 = 2.88 m²', () => {
		expect(itemAcoustics(item({ quantity: 4, widthMm: 600, heightMm: 1200, params: POROUS })).totalAreaM2).toBeCloseTo(2.88, 12);
		expect(unitWidthMm(item({ widthMm: 600, params: POROUS }))).toBe(600);
	});

	it('names the preset, or σ when there is none', () => {
		expect(paramsAcoustics(POROUS).method).toMatch(/^Rock wool ≈ 40 kg\/m³, 100 mm/);
		expect(paramsAcoustics({ ...POROUS, presetId: null, flowResistivity: 12_500 }).method).toMatch(/^fibre σ = 12\.5 kPa·s\/m²/);
	});
});
