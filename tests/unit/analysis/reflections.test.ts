import { describe, expect, it } from 'vitest';
import {
	attributeReflections,
	detectReflections,
	firstOrderImages,
	speedOfSound,
	type DetectedReflection,
	type Point3,
	type PredictedReflection
} from '../../../src/lib/analysis/reflections';

const SAMPLE_RATE = 48000;

/** Direct unit impulse at `direct` plus copies delayed by `delay` samples and scaled by 10^(dB/20). */
function syntheticIr(direct: number, copies: { delay: number; levelDb: number; sign?: number }[], length = 6000) {
	const ir = new Float64Array(length);
	ir[direct] = 1;
	for (const { delay, levelDb, sign = 1 } of copies) ir[direct + delay] += sign * 10 ** (levelDb / 20);
	return ir;
}

describe('speedOfSound', () => {
	// c = 331.3·√(1 + θ/273.15) m/s: ideal gas with 331.3 m/s at 0 °C (Kinsler et al.,
	// Fundamentals of Acoustics, from memory); 343.2 m/s at 20 °C follows from it.
	// Tolerance 0.05 m/s: the reference values are given to 0.1 m/s.
	it.each([
		{ temperatureC: 0, expected: 331.3 },
		{ temperatureC: 20, expected: 343.2 },
		{ temperatureC: -20, expected: 331.3 * Math.sqrt(1 - 20 / 273.15) },
		{ temperatureC: 35, expected: 331.3 * Math.sqrt(1 + 35 / 273.15) }
	])('$temperatureC °C → $expected m/s', ({ temperatureC, expected }) => {
		expect(Math.abs(speedOfSound(temperatureC) - expected)).toBeLessThan(0.05);
	});

	it('defaults to 20 °C and rejects impossible temperatures', () => {
		expect(speedOfSound()).toBe(speedOfSound(20));
		expect(() => speedOfSound(-300)).toThrow(/above −273.15/);
		expect(() => speedOfSound(Number.NaN)).toThrow(/finite/);
	});
});

describe('detectReflections on a synthetic impulse response', () => {
	// The test chooses delays and levels; detection must return them within ±1 sample and
	// ±0.5 dB (common practice, no source; the Hilbert tails of the other impulses change a peak by
	// < 0.01 dB here).
	const direct = 1000;
	const copies = [
		{ delay: 150, levelDb: -6 }, // 3.125 ms
		{ delay: 437, levelDb: -12, sign: -1 }, // 9.10 ms, polarity inverted
		{ delay: 1210, levelDb: -18 }, // 25.2 ms
		{ delay: 2000, levelDb: -26 } // 41.7 ms, below the default threshold
	];
	const ir = syntheticIr(direct, copies);

	const cases = [
		{ name: 'default threshold −20 dB keeps three', thresholdDb: undefined, expected: copies.slice(0, 3) },
		{ name: 'threshold −30 dB keeps all four', thresholdDb: -30, expected: copies },
		{ name: 'threshold −10 dB keeps only the first', thresholdDb: -10, expected: copies.slice(0, 1) }
	];
	it.each(cases)('$name', ({ thresholdDb, expected }) => {
		const found = detectReflections(ir, SAMPLE_RATE, direct, { thresholdDb });
		expect(found).toHaveLength(expected.length);
		found.forEach((reflection, i) => {
			expect(Math.abs(reflection.delayMs - (expected[i].delay / SAMPLE_RATE) * 1000)).toBeLessThanOrEqual(
				1000 / SAMPLE_RATE + 1e-9
			);
			expect(Math.abs(reflection.levelDb - expected[i].levelDb)).toBeLessThan(0.5);
			// extra path = c·delay at 20 °C (definition); 1e-9 m for round-off.
			expect(reflection.extraPathM).toBeCloseTo((reflection.delayMs / 1000) * speedOfSound(20), 9);
			expect(reflection.surface).toBeNull();
		});
	});

	it('measures delays from the direct peak even when given an earlier onset index', () => {
		const found = detectReflections(ir, SAMPLE_RATE, direct - 20);
		expect(found.map((r) => Math.round((r.delayMs * SAMPLE_RATE) / 1000))).toEqual([150, 437, 1210]);
	});

	it('finds a late direct peak only within directSearchMs of the onset index', () => {
		// Onset given 1.5 ms (72 samples) before the peak: with the default 1 ms search the direct
		// peak is missed and the true direct sound shows up as a "reflection" above 0 dB; 2 ms finds it.
		const early = detectReflections(ir, SAMPLE_RATE, direct - 72);
		expect(early[0].levelDb).toBeGreaterThan(-0.5);
		const found = detectReflections(ir, SAMPLE_RATE, direct - 72, { directSearchMs: 2 });
		expect(found.map((r) => Math.round((r.delayMs * SAMPLE_RATE) / 1000))).toEqual([150, 437, 1210]);
	});

	it('ignores peaks beyond windowMs', () => {
		const found = detectReflections(ir, SAMPLE_RATE, direct, { windowMs: 20, thresholdDb: -30 });
		expect(found.map((r) => Math.round((r.delayMs * SAMPLE_RATE) / 1000))).toEqual([150, 437]);
	});

	it.each([
		{ name: 'default 0.5 ms keeps the stronger of two 10-sample-apart copies', minSeparationMs: undefined, delays: [300] },
		{ name: '0.1 ms keeps both', minSeparationMs: 0.1, delays: [300, 310] }
	])('$name', ({ minSeparationMs, delays }) => {
		const close = syntheticIr(direct, [
			{ delay: 300, levelDb: -6 },
			{ delay: 310, levelDb: -9 }
		]);
		const found = detectReflections(close, SAMPLE_RATE, direct, { minSeparationMs });
		expect(found.map((r) => Math.round((r.delayMs * SAMPLE_RATE) / 1000))).toEqual(delays);
	});

	it.each([
		{ name: 'empty IR', call: () => detectReflections(new Float64Array(0), SAMPLE_RATE, 0), message: /empty/ },
		{ name: 'direct index outside', call: () => detectReflections(ir, SAMPLE_RATE, ir.length), message: /directIndex/ },
		{ name: 'zero sample rate', call: () => detectReflections(ir, 0, direct), message: /sampleRate/ },
		{ name: 'positive threshold', call: () => detectReflections(ir, SAMPLE_RATE, direct, { thresholdDb: 3 }), message: /thresholdDb/ },
		{ name: 'silence', call: () => detectReflections(new Float64Array(100), SAMPLE_RATE, 10), message: /no direct sound/ }
	])('rejects $name', ({ call, message }) => {
		expect(call).toThrow(message);
	});
});

describe('firstOrderImages in a 5 × 4 × 3 m room', () => {
	// Image-source method (Allen & Berkley, JASA 65:943, 1979): the image in the wall at
	// coordinate w is 2w − s on that axis. Path lengths below are worked out by hand from the
	// geometry; tolerance 1e-9 m / 1e-9 ms (round-off only).
	const room = { lengthM: 5, widthM: 4, heightM: 3 };
	const source: Point3 = { x: 1, y: 2, z: 1.2 };
	const mic: Point3 = { x: 3.5, y: 1.5, z: 1.2 };
	const c = speedOfSound(20);
	// Direct: Δ = (2.5, −0.5, 0) → √6.5
	const directM = Math.sqrt(2.5 ** 2 + 0.5 ** 2);
	const expectedPaths: Record<string, number> = {
		front: Math.sqrt((3.5 + 1) ** 2 + 0.5 ** 2), // image x = −1
		back: Math.sqrt((9 - 3.5) ** 2 + 0.5 ** 2), // image x = 2·5 − 1 = 9
		left: Math.sqrt(2.5 ** 2 + (1.5 + 2) ** 2), // image y = −2
		right: Math.sqrt(2.5 ** 2 + (6 - 1.5) ** 2), // image y = 2·4 − 2 = 6
		floor: Math.sqrt(2.5 ** 2 + 0.5 ** 2 + (1.2 + 1.2) ** 2), // image z = −1.2
		ceiling: Math.sqrt(2.5 ** 2 + 0.5 ** 2 + (4.8 - 1.2) ** 2) // image z = 2·3 − 1.2 = 4.8
	};
	const images = firstOrderImages(room, source, mic);

	it.each(Object.entries(expectedPaths))('%s: path, delay and spreading level from the geometry', (surface, pathM) => {
		const image = images.find((i) => i.surface === surface);
		expect(image).toBeDefined();
		expect(Math.abs(image!.pathM - pathM)).toBeLessThan(1e-9);
		expect(Math.abs(image!.extraPathM - (pathM - directM))).toBeLessThan(1e-9);
		expect(Math.abs(image!.delayMs - ((pathM - directM) / c) * 1000)).toBeLessThan(1e-9);
		expect(Math.abs(image!.levelDb - 20 * Math.log10(directM / pathM))).toBeLessThan(1e-9);
	});

	it('returns the six surfaces once each, sorted by delay', () => {
		expect(images.map((i) => i.surface).sort()).toEqual(['back', 'ceiling', 'floor', 'front', 'left', 'right']);
		for (let i = 1; i < images.length; i++) expect(images[i].delayMs).toBeGreaterThanOrEqual(images[i - 1].delayMs);
	});

	it('uses the given temperature', () => {
		const cold = firstOrderImages(room, source, mic, 0).find((i) => i.surface === 'floor')!;
		expect(Math.abs(cold.delayMs - ((expectedPaths.floor - directM) / 331.3) * 1000)).toBeLessThan(1e-3);
	});

	it.each([
		{ name: 'mic beyond the back wall', mic: { x: 5.2, y: 1, z: 1 }, message: /mic x = 5.2 m lies outside the room/ },
		{ name: 'mic below the floor', mic: { x: 1, y: 1, z: -0.1 }, message: /mic z/ },
		{ name: 'mic on the left wall', mic: { x: 1, y: 0, z: 1 }, message: /mic y/ },
		{ name: 'mic at the source', mic: source, message: /same point/ },
		{ name: 'mic coordinate NaN', mic: { x: Number.NaN, y: 1, z: 1 }, message: /finite/ }
	])('throws for $name', ({ mic: badMic, message }) => {
		expect(() => firstOrderImages(room, source, badMic)).toThrow(message);
	});

	it('throws for a source outside and for an invalid room', () => {
		expect(() => firstOrderImages(room, { x: 1, y: 4.5, z: 1 }, mic)).toThrow(/source y/);
		expect(() => firstOrderImages({ ...room, heightM: 0 }, source, mic)).toThrow(/heightM/);
	});
});

describe('attributeReflections', () => {
	const detectedAt = (delayMs: number): DetectedReflection => ({
		delayMs,
		levelDb: -10,
		extraPathM: delayMs * 0.3432,
		surface: null,
		predictedDelayMs: null
	});
	const predictedAt = (surface: PredictedReflection['surface'], delayMs: number): PredictedReflection => ({
		surface,
		delayMs,
		extraPathM: delayMs * 0.3432,
		pathM: 3 + delayMs * 0.3432,
		levelDb: -6
	});

	it('picks the nearest prediction within the tolerance, each prediction once', () => {
		const predicted = [predictedAt('floor', 2.0), predictedAt('ceiling', 6.1), predictedAt('back', 6.5)];
		const detected = [detectedAt(2.2), detectedAt(6.3), detectedAt(6.45), detectedAt(12)];
		const result = attributeReflections(detected, predicted);
		// 6.45 is closest to back (0.05) and claims it first; 6.3 then takes ceiling (0.2).
		expect(result.map((r) => r.surface)).toEqual(['floor', 'ceiling', 'back', null]);
		expect(result.map((r) => r.predictedDelayMs)).toEqual([2.0, 6.1, 6.5, null]);
		expect(detected[0].surface).toBeNull(); // input left untouched
	});

	it.each([
		{ toleranceMs: 0.1, expected: [null] },
		{ toleranceMs: 0.3, expected: ['floor'] }
	])('tolerance $toleranceMs ms on a 0.2 ms gap → $expected', ({ toleranceMs, expected }) => {
		const result = attributeReflections([detectedAt(2.2)], [predictedAt('floor', 2.0)], toleranceMs);
		expect(result.map((r) => r.surface)).toEqual(expected);
	});

	it('names detected peaks in a synthetic IR built from the predicted delays', () => {
		const room = { lengthM: 5, widthM: 4, heightM: 3 };
		const predicted = firstOrderImages(room, { x: 1, y: 2, z: 1.2 }, { x: 3.5, y: 1.5, z: 1.2 });
		const copies = predicted.map((p) => ({ delay: Math.round((p.delayMs * SAMPLE_RATE) / 1000), levelDb: p.levelDb }));
		const ir = syntheticIr(500, copies, 4000);
		// Left (5.10 ms) and ceiling (5.43 ms) arrive 0.32 ms apart: resolved with a 0.2 ms
		// separation, merged into the stronger (left) with the default 0.5 ms.
		const resolved = attributeReflections(detectReflections(ir, SAMPLE_RATE, 500, { minSeparationMs: 0.2 }), predicted);
		expect(resolved.map((r) => r.surface)).toEqual(['floor', 'left', 'ceiling', 'front', 'right', 'back']);
		const merged = attributeReflections(detectReflections(ir, SAMPLE_RATE, 500), predicted);
		expect(merged.map((r) => r.surface)).toEqual(['floor', 'left', 'front', 'right', 'back']);
	});

	it('rejects a negative tolerance', () => {
		expect(() => attributeReflections([], [], -1)).toThrow(/toleranceMs/);
	});
});
