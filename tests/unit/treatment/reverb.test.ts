import { describe, expect, it } from 'vitest';
import { airAttenuationDbPerM, airIntensityAttenuationPerM } from '../../../src/lib/treatment/air';
import { PLANNING_BANDS_HZ } from '../../../src/lib/treatment/bands';
import {
	absorptionForTime,
	chooseFormula,
	eyringTime,
	millingtonTime,
	predictReverb,
	sabineTime,
	timeFromAbsorption
} from '../../../src/lib/treatment/reverb';

const WORKED = {
	volumeM3: 3000,
	speedOfSound: 343,
	areas: [
		{ areaM2: 240, alpha: 0.1 },
		{ areaM2: 600, alpha: 0.25 },
		{ areaM2: 500, alpha: 0.45 }
	]
};

describe('worked input S = [240, 600, 500] m², α = [0.10, 0.25, 0.45], V = 3000 m³, c = 343 m/s', () => {
	// Sabine 1.2114 s and Eyring 1.0204 s (python-acoustics test suite, tests/test_room.py),
	// Millington 0.9729 s (computed from the published formula; Kuttruff, Room Acoustics).
	// Tolerance 1e-3 s: the reference values carry four decimals.
	it.each([
		['Sabine', sabineTime, 1.2114],
		['Eyring', eyringTime, 1.0204],
		['Millington', millingtonTime, 0.9729]
	] as const)('%s → %f s', (_name, formula, expected) => {
		expect(Math.abs(formula(WORKED) - expected)).toBeLessThan(1e-3);
	});

	it('24·ln10/343 = 0.16111 (the Sabine constant 0.161 of the handbooks, e.g. Kuttruff, Room Acoustics, reverberation chapter)', () => {
		expect(timeFromAbsorption(1, 1, 0, 343)).toBeCloseTo(0.16111, 5);
		expect(absorptionForTime(3000, 1.2114, 343)).toBeCloseTo(24 + 150 + 225, 0);
	});
});

describe('relations between the formulas (Kuttruff, Room Acoustics, reverberation chapter)', () => {
	it('Eyring ≤ Sabine for every mean α, since −ln(1−ᾱ) ≥ ᾱ', () => {
		for (const alpha of [0.01, 0.1, 0.3, 0.6, 0.9]) {
			const room = { volumeM3: 100, areas: [{ areaM2: 130, alpha }] };
			expect(eyringTime(room)).toBeLessThan(sabineTime(room));
		}
	});

	it('Millington equals Eyring when every surface has the same α (identity of the two sums)', () => {
		const room = { volumeM3: 100, areas: [{ areaM2: 50, alpha: 0.3 }, { areaM2: 80, alpha: 0.3 }] };
		expect(millingtonTime(room)).toBeCloseTo(eyringTime(room), 12);
	});

	it('Eyring tends to Sabine for small α: relative gap ≈ ᾱ/2 (series of −ln(1−ᾱ))', () => {
		const room = { volumeM3: 100, areas: [{ areaM2: 130, alpha: 0.01 }] };
		const gap = 1 - eyringTime(room) / sabineTime(room);
		expect(gap).toBeGreaterThan(0.004);
		expect(gap).toBeLessThan(0.006);
	});

	it('air absorption 4mV adds to A: T = 0.16111·V/(A + 4mV)', () => {
		const m = 0.002;
		const room = { ...WORKED, airAttenuationPerM: m };
		const A = 24 + 150 + 225;
		expect(sabineTime(room)).toBeCloseTo(((24 * Math.LN10) / 343) * 3000 / (A + 4 * m * 3000), 10);
	});

	it.each([
		[{ volumeM3: 0, areas: [{ areaM2: 10, alpha: 0.1 }] }, /volume/],
		[{ volumeM3: 10, areas: [{ areaM2: 10, alpha: 1.2 }] }, /0…1/],
		[{ volumeM3: 10, areas: [{ areaM2: -1, alpha: 0.1 }] }, /area/],
		[{ volumeM3: 10, areas: [{ areaM2: 10, alpha: 0 }] }, /no absorption/]
	])('rejects %o', (room, message) => {
		expect(() => sabineTime(room)).toThrow(message);
	});
});

describe('which formula to headline (rule: common practice, no source)', () => {
	it.each([
		[[{ areaM2: 100, alpha: 0.05 }, { areaM2: 50, alpha: 0.3 }], 'sabine'],
		[[{ areaM2: 100, alpha: 0.3 }, { areaM2: 50, alpha: 0.4 }], 'eyring'],
		[[{ areaM2: 100, alpha: 0.05 }, { areaM2: 100, alpha: 0.9 }], 'millington']
	] as const)('%o → %s', (areas, formula) => {
		expect(chooseFormula(areas).formula).toBe(formula);
	});

	it('predictReverb always reports all three per planning band', () => {
		const bands = predictReverb({
			volumeM3: 3000,
			speedOfSound: 343,
			surfaces: WORKED.areas.map((a) => ({ areaM2: a.areaM2, coefficients: PLANNING_BANDS_HZ.map(() => a.alpha) }))
		});
		expect(bands.map((b) => b.bandHz)).toEqual([...PLANNING_BANDS_HZ]);
		for (const b of bands) {
			expect(Math.abs(b.sabineS - 1.2114)).toBeLessThan(1e-3);
			expect(Math.abs(b.eyringS - 1.0204)).toBeLessThan(1e-3);
			expect(Math.abs(b.millingtonS - 0.9729)).toBeLessThan(1e-3);
		}
	});
});

describe('air absorption, ISO 9613-1:1993', () => {
	// ISO 9613-1:1993 Table 1 (dB/km at 101.325 kPa, computed by the standard at the exact
	// midband frequencies 1000·10^(k/10) Hz), as copied from the standard in a public test
	// suite (not re-checked against the standard's own text here). Tolerance 0.5 %: the table has
	// three significant figures. That suite's row 20 °C / 50 % / 50 Hz = 0.0794 dB/km is left out:
	// the formula gives 0.0784 (1.2 % off) while every neighbour agrees to 0.3 %, so it looks like
	// a copying slip. Note: at 20 °C, 50 % the formula gives ≈ 29.7 dB/km at 4 kHz and
	// ≈ 105 dB/km at 8 kHz; values near 23 and 78 dB/km belong to 70 % RH.
	const exact = (nominal: number) => {
		const k: Record<number, number> = { 50: -13, 100: -10, 125: -9, 1000: 0, 4000: 6, 8000: 9 };
		return 1000 * 10 ** (k[nominal] / 10);
	};
	it.each([
		[20, 10, 50, 0.27],
		[20, 50, 100, 0.294],
		[20, 50, 125, 0.445],
		[20, 70, 125, 0.339],
		[20, 10, 1000, 14.1],
		[20, 70, 1000, 4.98],
		[20, 100, 1000, 5.42],
		[20, 10, 4000, 109],
		[20, 100, 4000, 19.4],
		[0, 50, 1000, 6.83],
		[10, 50, 1000, 4.26],
		[30, 50, 1000, 7.03],
		[-20, 50, 4000, 13.2],
		[50, 70, 8000, 80.3]
	])('%i °C, RH %i percent, %i Hz → %f dB/km', (t, rh, f, dbPerKm) => {
		const value = airAttenuationDbPerM(exact(f), { temperatureC: t, relativeHumidityPct: rh }) * 1000;
		expect(Math.abs(value / dbPerKm - 1)).toBeLessThan(0.005);
	});

	it('attenuation rises with frequency at 20 °C, 50 % RH (physical check)', () => {
		const values = PLANNING_BANDS_HZ.map((f) => airAttenuationDbPerM(f));
		for (let i = 1; i < values.length; i++) expect(values[i]).toBeGreaterThan(values[i - 1]);
	});

	it('m = α_dB / (10·lg e): 10 dB/km is 2.3026e-3 per metre of intensity', () => {
		const f = 1000;
		expect(airIntensityAttenuationPerM(f) / airAttenuationDbPerM(f)).toBeCloseTo(1 / (10 * Math.LOG10E), 12);
	});

	it.each([
		[{ temperatureC: 60, relativeHumidityPct: 50 }, /temperature/],
		[{ temperatureC: 20, relativeHumidityPct: 0 }, /humidity/],
		[{ temperatureC: 20, relativeHumidityPct: 50, pressureKPa: -1 }, /pressure/]
	])('rejects %o', (c, message) => {
		expect(() => airAttenuationDbPerM(1000, c)).toThrow(message);
	});
});
