import { describe, expect, it } from 'vitest';
import { warmUpEngine } from '../../../src/lib/server/jobs/warm-up';

describe('worker warm-up', () => {
	// The warm-up must run the code a capture's analysis runs, both kinds: an impulse response and a
	// recorded sweep deconvolved with its reference, each in octaves with curves and in thirds.
	// The synthetic room decays with T = 0.5 s; its T30 is read within the 5 % JND of ISO 3382-1:2009,
	// Annex A (Table A.1), so a warm-up that analysed nothing, or garbage, fails.
	const warm = warmUpEngine(1);

	it.each(['impulse', 'sweep'] as const)('%s: T30 of the synthetic room within the JND, octaves with curves and thirds', (kind) => {
		const result = warm[kind];
		expect(Math.abs((result.broadband.t30S ?? 0) / 0.5 - 1)).toBeLessThan(0.05);
		expect(result.curves.waterfall.levelsDb.length).toBeGreaterThan(1);
		expect(result.curves.decay.length).toBeGreaterThan(1);
		expect(result.thirdOctaveBands).toHaveLength(24);
		expect(result.warnings.map((warning) => warning.code)).not.toContain('clipping');
		expect(result.warnings.map((warning) => warning.code)).not.toContain('no_decay_found');
	});

	it('the sweep went through the deconvolution', () => {
		expect(warm.impulse.deconvolution).toBeNull();
		expect(warm.sweep.deconvolution?.f1Hz).toBeCloseTo(40, 0);
		expect(warm.cpuMs).toBeGreaterThan(0);
	});
});
