import { describe, expect, it } from 'vitest';
import { analysisBands, bandAt, bandEdgesHz, exactMidbandHz, nominalFrequencyHz } from '../../../src/lib/analysis/bands';

// Values given to 3 decimals in the source; compare to half a unit of the last digit.
const HALF_MILLIHERTZ = 5e-4;

describe('exact band frequencies (IEC 61260-1:2014, examples computed from its midband and band-edge formulas)', () => {
	it.each([
		{ kind: 'octave', nominal: 125, exact: 125.893, lower: 89.125, upper: 177.828 },
		{ kind: 'octave', nominal: 1000, exact: 1000, lower: 707.946, upper: 1412.538 },
		{ kind: 'third', nominal: 1000, exact: 1000, lower: 891.251, upper: 1122.018 },
		{ kind: 'third', nominal: 100, exact: 100, lower: 89.125, upper: 112.202 },
		{ kind: 'third', nominal: 63, exact: 63.096, lower: null, upper: null }
	] as const)('$kind $nominal Hz', ({ kind, nominal, exact, lower, upper }) => {
		const band = analysisBands(kind).find((b) => b.nominalHz === nominal);
		expect(band).toBeDefined();
		expect(Math.abs(band!.exactHz - exact)).toBeLessThan(HALF_MILLIHERTZ);
		if (lower !== null) expect(Math.abs(band!.lowerHz - lower)).toBeLessThan(HALF_MILLIHERTZ);
		if (upper !== null) expect(Math.abs(band!.upperHz - upper)).toBeLessThan(HALF_MILLIHERTZ);
	});

	it('even-b mid-bands straddle 1 kHz: the two nearest are geometric mirrors (IEC 61260-1:2014, even b formula)', () => {
		const above = exactMidbandHz(0, 2);
		const below = exactMidbandHz(-1, 2);
		expect(Math.abs(above * below - 1e6) / 1e6).toBeLessThan(1e-12);
		expect(above).toBeGreaterThan(1000);
	});

	it('adjacent bands share their edges and edges multiply to f_m² (IEC 61260-1:2014)', () => {
		for (const kind of ['octave', 'third'] as const) {
			const bands = analysisBands(kind);
			for (let i = 1; i < bands.length; i++) {
				expect(Math.abs(bands[i].lowerHz - bands[i - 1].upperHz) / bands[i].lowerHz).toBeLessThan(1e-12);
			}
			for (const band of bands) expect(Math.abs(band.lowerHz * band.upperHz - band.exactHz ** 2) / band.exactHz ** 2).toBeLessThan(1e-12);
		}
		const edges = bandEdgesHz(1000, 1);
		expect(edges.upperHz / edges.lowerHz).toBeCloseTo(10 ** 0.3, 12);
	});
});

describe('nominal labels (ISO 266:1997 preferred frequencies)', () => {
	it('octaves 63 Hz – 8 kHz', () => {
		expect(analysisBands('octave').map((b) => b.nominalHz)).toEqual([63, 125, 250, 500, 1000, 2000, 4000, 8000]);
	});

	it('thirds 50 Hz – 10 kHz', () => {
		expect(analysisBands('third').map((b) => b.nominalHz)).toEqual([
			50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500, 3150, 4000, 5000, 6300,
			8000, 10000
		]);
	});

	it('every nominal value lies within 3 % of its exact frequency (ISO 266 rounds to preferred numbers)', () => {
		for (const band of [...analysisBands('octave'), ...analysisBands('third')]) {
			expect(Math.abs(band.nominalHz / band.exactHz - 1)).toBeLessThan(0.03);
		}
	});

	it.each([
		{ kind: 'third', index: 14 },
		{ kind: 'third', index: -18 },
		{ kind: 'octave', index: 5 }
	] as const)('has no label outside 20 Hz – 20 kHz: $kind band $index', ({ kind, index }) => {
		expect(() => nominalFrequencyHz(kind, index)).toThrow(/nominal/);
		expect(() => bandAt(kind, index)).toThrow();
	});

	it('rejects a fractional band number', () => {
		expect(() => exactMidbandHz(0.5, 3)).toThrow(/integer/);
	});
});
