import { describe, expect, it } from 'vitest';
import { MIN_DECAY_AFTER_SWEEP_S, sweepMismatch } from '../../../src/lib/captures/sweep-fit';
import { deconvolveSweep } from '../../../src/lib/analysis/deconvolve';
import { AnalysisInputError } from '../../../src/lib/analysis/errors';

// The pick-time check must refuse exactly what the engine would refuse after the upload.
const sweep = { name: 'Practice sweep 10 s', durationS: 10 };

describe('a recording against the sweep it is said to hold', () => {
	it('refuses a recording shorter than the sweep, with both lengths and what to do', () => {
		const message = sweepMismatch(1.6, sweep);
		expect(message).toContain('1.60 s long, shorter than the 10.00 s sweep "Practice sweep 10 s"');
		expect(message).toContain('impulse response');
	});

	it('accepts the sweep plus the shortest decay the engine analyses, and refuses just less', () => {
		expect(sweepMismatch(10 + MIN_DECAY_AFTER_SWEEP_S, sweep)).toBeNull();
		expect(sweepMismatch(10 + MIN_DECAY_AFTER_SWEEP_S - 0.001, sweep)).not.toBeNull();
		expect(sweepMismatch(12.5, sweep)).toBeNull();
	});

	it('draws the line where the engine does', () => {
		// An exponential sweep of 0.5 s (20 Hz – 20 kHz) at 8 kHz sampling, recorded with a given tail.
		const fs = 8000;
		const T = 0.5;
		const L = T / Math.log(20000 / 20);
		const reference = Float64Array.from({ length: T * fs }, (_, n) => Math.sin(2 * Math.PI * 20 * L * (Math.exp(n / fs / L) - 1))); // Farina 2000, eq. for the ESS
		const recordedWithTail = (tailS: number) => {
			const r = new Float64Array(Math.round((T + tailS) * fs));
			r.set(reference);
			return r;
		};
		const engineRefuses = (tailS: number) => {
			try {
				deconvolveSweep(recordedWithTail(tailS), reference, fs);
				return false;
			} catch (e) {
				if (e instanceof AnalysisInputError && e.code === 'sweep_not_recorded') return true;
				throw e;
			}
		};
		const short = { name: 'short', durationS: T };
		expect(engineRefuses(0.01)).toBe(true);
		expect(sweepMismatch(T + 0.01, short)).not.toBeNull();
		expect(engineRefuses(0.2)).toBe(false);
		expect(sweepMismatch(T + 0.2, short)).toBeNull();
	});
});
