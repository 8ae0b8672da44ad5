// The reverberation and calibration models' input limits, each at, just below and just above the
// edge, and the target verdicts at the band's bounds (product rules: a value outside its physical
// range is refused with the reason, never carried into a prediction).
import { describe, expect, it } from 'vitest';
import { calibrate, checkAgainstTarget, predictedVsMeasured, predictWithTreatment, type BandPrediction, type CalibrationInput } from '../../../src/lib/treatment/calibrate';
import { absorptionForTime, predictReverb, sabineTime } from '../../../src/lib/treatment/reverb';

const room = (over: object = {}) => ({ volumeM3: 100, areas: [{ areaM2: 100, alpha: 0.2 }], speedOfSound: 343, ...over });
const EIGHT = (v: number) => Array(8).fill(v);

describe('reverberation model input', () => {
	it('Sabine: T = 24·ln10·V/(c·A) (Kuttruff, Room Acoustics, chapter on reverberation, from memory): 100 m³, A = 20 m², c = 343 m/s → 0.8056 s', () => {
		expect(sabineTime(room())).toBeCloseTo((24 * Math.LN10 * 100) / (343 * 20), 12);
		expect(sabineTime(room())).toBeCloseTo(0.8056, 4);
	});

	it.each([
		{ over: { speedOfSound: 0 }, message: 'speed of sound must be positive, got 0 m/s' },
		{ over: { airAttenuationPerM: -1e-9 }, message: 'air attenuation must be zero or positive, got -1e-9 1/m' },
		{ over: { areas: [{ areaM2: -1e-9, alpha: 0.2 }, { areaM2: 10, alpha: 0.2 }] }, message: 'surface area must be zero or positive, got -1e-9 m²' },
		{ over: { areas: [{ areaM2: 10, alpha: 1 + 1e-9 }] }, message: 'absorption coefficient must lie in 0…1, got 1.000000001' },
		{ over: { areas: [{ areaM2: 10, alpha: -1e-9 }] }, message: 'absorption coefficient must lie in 0…1, got -1e-9' },
		{ over: { areas: [{ areaM2: 0, alpha: 0.2 }] }, message: 'the room needs a surface area above zero' }
	])('refuses: $message', ({ over, message }) => {
		expect(() => sabineTime(room(over))).toThrow(message);
	});

	it('accepts each value at its edge: no air attenuation, a surface of 0 m² beside others, α = 0 and α = 1', () => {
		expect(sabineTime(room({ airAttenuationPerM: 0 }))).toBeCloseTo(0.8056, 4);
		// The 0 m² surface adds nothing; α = 1 on 10 m² and α = 0 on 90 m²: A = 10 m², twice the 0.8056 s: 1.6111 s.
		expect(sabineTime(room({ areas: [{ areaM2: 0, alpha: 0.5 }, { areaM2: 10, alpha: 1 }, { areaM2: 90, alpha: 0 }] }))).toBeCloseTo(1.6111, 4);
	});

	it('absorption for a time is Sabine inverted, and a time of 0 s is refused', () => {
		expect(absorptionForTime(100, 0.8056, 343)).toBeCloseTo((24 * Math.LN10 * 100) / (343 * 0.8056), 12);
		expect(() => absorptionForTime(100, 0, 343)).toThrow('reverberation time must be positive, got 0 s');
		expect(absorptionForTime(100, 1e-3, 343)).toBeGreaterThan(0);
	});

	it('a surface with 7 coefficients instead of 8 is refused', () => {
		expect(() => predictReverb({ volumeM3: 100, surfaces: [{ areaM2: 100, coefficients: Array(7).fill(0.2) }] } as never)).toThrow(
			'each surface needs 8 coefficients (63, 125, 250, 500, 1000, 2000, 4000, 8000 Hz)'
		);
	});
});

describe('calibration input', () => {
	const input = (over: Partial<CalibrationInput> = {}): CalibrationInput => ({
		volumeM3: 100,
		patches: [{ areaM2: 100, coefficients: EIGHT(0.1), surface: 'floor' }],
		measuredS: EIGHT(0.8),
		speedOfSound: 343,
		...over
	});

	it.each([
		{ over: { patches: [] }, message: 'calibration needs the room surfaces' },
		{ over: { patches: [{ areaM2: -1e-9, coefficients: EIGHT(0.1) }] }, message: 'surface 1: area must be zero or positive, got -1e-9 m²' },
		{ over: { patches: [{ areaM2: 10, coefficients: EIGHT(0.1) }, { areaM2: 10, coefficients: Array(7).fill(0.1) }] }, message: 'surface 2 coefficients: expected 8 values' },
		{ over: { patches: [{ areaM2: 0, coefficients: EIGHT(0.1) }] }, message: 'the room surfaces add up to no area' },
		{ over: { speedOfSound: 0 }, message: 'speed of sound must be positive, got 0 m/s' },
		{ over: { formula: 'fitzroy' as 'sabine' }, message: 'unknown formula "fitzroy"' },
		{ over: { measuredS: EIGHT(0.8).slice(1) }, message: 'measured T needs 8 values (63, 125, 250, 500, 1000, 2000, 4000, 8000 Hz; null where not measured)' },
		{ over: { measuredS: [0, ...EIGHT(0.8).slice(1)] }, message: 'measured T at 63 Hz must be a positive number of seconds, got 0' }
	])('refuses: $message', ({ over, message }) => {
		expect(() => calibrate(input(over))).toThrow(message);
	});

	it('a surface of 0 m² beside others is accepted; the assumed absorption is Σ S·α per band', () => {
		const c = calibrate(input({ patches: [{ areaM2: 0, coefficients: EIGHT(0.5) }, { areaM2: 60, coefficients: EIGHT(0.1) }, { areaM2: 40, coefficients: EIGHT(0.2) }] }));
		// 60·0.1 + 40·0.2 = 14 m².
		expect(c.bands.map((b) => b.assumedAbsorptionM2)).toEqual(EIGHT(14));
	});

	it('the overstatement warning gives the excess in m²: 25 m² assumed where a measured T of 1 s needs 16.11 m²', () => {
		const c = calibrate(input({ patches: [{ areaM2: 100, coefficients: EIGHT(0.25) }], measuredS: [1, null, null, null, null, null, null, null] }));
		// Sabine inverted: 24·ln10·100/(343·1) = 16.11 m² needed, less 4mV of the air (under 0.05 m² at 63 Hz); 25 − 16.11 = 8.89 m² too much.
		const needed = (24 * Math.LN10 * 100) / 343;
		expect(c.bands[0].rawResidualM2!).toBeCloseTo(needed - 25, 1);
		expect(c.warnings[0]).toMatch(/^63 Hz: assumed finishes absorb more than measured \(8\.\d\d m² too much/);
		expect(c.bands[1]).toMatchObject({ measuredS: null, rawResidualM2: null, residualM2: 0, clamped: false });
	});
});

describe('treatment items on a calibrated room', () => {
	const calibration = calibrate({ volumeM3: 100, patches: [{ areaM2: 20, coefficients: EIGHT(0.1), surface: 'front' }, { areaM2: 80, coefficients: EIGHT(0.1) }], measuredS: EIGHT(0.8), speedOfSound: 343 });
	const item = (over: object) => ({ label: 'panel', areaM2: 5, coefficients: EIGHT(0.9), ...over });

	it.each([
		{ over: { areaM2: 0 }, message: 'treatment "panel": area must be positive, got 0 m²' },
		{ over: { coefficients: [1 + 1e-9, ...EIGHT(0.9).slice(1)] }, message: 'treatment "panel": coefficient at 63 Hz must lie in 0…1, got 1.000000001' },
		{ over: { coefficients: EIGHT(0.9).slice(1) }, message: 'treatment "panel" coefficients: expected 8 values' },
		{ over: { areaM2: 20 + 1e-6, covers: 'front' }, message: 'treatment on the front surface covers 20.00 m², more than its 20.00 m²' },
		{ over: { covers: 'ceiling' }, message: 'treatment covers the ceiling surface, which the calibration does not know' }
	])('refuses: $message', ({ over, message }) => {
		expect(() => predictWithTreatment(calibration, [item(over)])).toThrow(message);
	});

	it('a coefficient of exactly 1, and items covering exactly the whole surface, are accepted', () => {
		const predicted = predictWithTreatment(calibration, [item({ areaM2: 12, covers: 'front', coefficients: EIGHT(1) }), item({ areaM2: 8, covers: 'front' })]);
		// Covered finish 20·0.1 = 2 m² replaced by 12·1 + 8·0.9 = 19.2 m²: 17.2 m² added.
		expect(predicted[3].addedAbsorptionM2).toBeCloseTo(17.2, 9);
	});
});

describe('target verdicts at the bounds of the band (lower ≤ T ≤ upper is within)', () => {
	const at = (predictedS: number | null): BandPrediction[] => [{ bandHz: 500, baselineS: 1, predictedS, addedAbsorptionM2: 0 }];
	const band = { lowerS: 0.4, upperS: 0.6 };
	it.each([
		{ t: 0.4, verdict: 'within' },
		{ t: 0.4 - 1e-9, verdict: 'below' },
		{ t: 0.6, verdict: 'within' },
		{ t: 0.6 + 1e-9, verdict: 'above' },
		{ t: null, verdict: 'no prediction' }
	])('T = $t s against 0.4…0.6 s: $verdict', ({ t, verdict }) => {
		expect(checkAgainstTarget(at(t), [band])[0].verdict).toBe(verdict);
	});

	it('a target of 0…0 and a single-value target are valid; lower above upper or below 0 is refused', () => {
		expect(checkAgainstTarget(at(0), [{ lowerS: 0, upperS: 0 }])[0].verdict).toBe('within');
		expect(checkAgainstTarget(at(0.5), [{ lowerS: 0.5, upperS: 0.5 }])[0].verdict).toBe('within');
		expect(() => checkAgainstTarget(at(0.5), [{ lowerS: 0.6, upperS: 0.5 }])).toThrow('target at 500 Hz needs 0 ≤ lower ≤ upper, got 0.6…0.5');
		expect(() => checkAgainstTarget(at(0.5), [{ lowerS: -0.1, upperS: 0.5 }])).toThrow('target at 500 Hz needs 0 ≤ lower ≤ upper');
		expect(() => checkAgainstTarget(at(0.5), [])).toThrow('target needs 1 bands, got 0');
		expect(checkAgainstTarget(at(0.5), [null])[0].verdict).toBe('no target');
	});
});

describe('prediction against the room measured after treatment', () => {
	it('difference and percentage: predicted 0.55 s, measured 0.5 s → +0.05 s, +10 %', () => {
		const rows = predictedVsMeasured([0.55, ...EIGHT(null as never).slice(1)], [0.5, ...EIGHT(null as never).slice(1)]);
		expect(rows[0].differenceS).toBeCloseTo(0.05, 12);
		expect(rows[0].differencePct).toBeCloseTo(10, 9);
		expect(rows[1]).toEqual({ bandHz: 125, predictedS: null, measuredS: null, differenceS: null, differencePct: null });
	});

	it.each([
		{ predicted: EIGHT(0.5).slice(1), measured: EIGHT(0.5) },
		{ predicted: EIGHT(0.5), measured: EIGHT(0.5).slice(1) }
	])('refuses lists that are not 8 bands long', ({ predicted, measured }) => {
		expect(() => predictedVsMeasured(predicted, measured)).toThrow('predicted and measured need 8 values each (63, 125, 250, 500, 1000, 2000, 4000, 8000 Hz)');
	});

	it('a measured T of 0 s is refused', () => {
		expect(() => predictedVsMeasured(EIGHT(0.5), [0, ...EIGHT(0.5).slice(1)])).toThrow('measured T at 63 Hz must be positive, got 0');
	});
});
