import { describe, expect, it } from 'vitest';
import { midFrequencyReverberation, reverberationFrom, type BandTimes } from '../../../src/lib/results/reverberation';

// T_mid is the mean of the 500 Hz and 1 kHz octave values (ISO 3382-1:2009, Annex A, Table A.1,
// single-number frequency averaging; from memory). Expected values are worked by hand.
const band = (centerHz: number | 'broadband', t30S: number | null, t20S: number | null = null): BandTimes => ({ centerHz, t30S, t20S });

describe('reverberationFrom: T30, else T20', () => {
	it.each([
		[0.5, 0.4, { valueS: 0.5, metric: 't30S' }],
		[null, 0.4, { valueS: 0.4, metric: 't20S' }],
		[Number.NaN, 0.4, { valueS: 0.4, metric: 't20S' }],
		[null, null, { valueS: null, metric: null }]
	] as const)('T30 %s, T20 %s → %o', (t30, t20, expected) => {
		expect(reverberationFrom(t30, t20)).toEqual(expected);
	});
});

describe('midFrequencyReverberation', () => {
	it('averages the 500 Hz and 1 kHz T30 and ignores every other band', () => {
		const mid = midFrequencyReverberation([band(250, 0.9), band(500, 0.62), band(1000, 0.5), band(2000, 0.1), band('broadband', 3)]);
		// (0.62 + 0.50) / 2 = 0.56; 1e-12: one addition and one division in floating point.
		expect(mid?.valueS).toBeCloseTo(0.56, 12);
		expect(mid?.metrics).toEqual(['t30S', 't30S']);
	});

	it('takes T20 per band where T30 is missing, and says so', () => {
		const mid = midFrequencyReverberation([band(500, null, 0.7), band(1000, 0.5)]);
		expect(mid?.valueS).toBeCloseTo(0.6, 12); // (0.70 + 0.50) / 2
		expect(mid?.metrics).toEqual(['t20S', 't30S']);
	});

	it('finds the bands by exact IEC 61260-1 centres too (10^2.7 and 10^3 Hz)', () => {
		const mid = midFrequencyReverberation([band(10 ** 2.7, 0.4), band(1000, 0.6)]);
		expect(mid?.valueS).toBeCloseTo(0.5, 12);
	});

	it.each([
		['the 1 kHz band is missing', [band(500, 0.6)]],
		['the 500 Hz band has neither T30 nor T20', [band(500, null, null), band(1000, 0.6)]],
		['no bands at all', []]
	])('is null when %s: one band alone is not T_mid', (_what, bands) => {
		expect(midFrequencyReverberation(bands)).toBeNull();
	});
});
