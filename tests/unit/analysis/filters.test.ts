import { describe, expect, it } from 'vitest';
import { analysisBands, bandAt, OCTAVE_RATIO } from '../../../src/lib/analysis/bands';
import {
	BAND_FILTER_ORDER,
	createBandFilterBank,
	designButterworthBandpass,
	filterBackwardInPlace,
	filterForwardInPlace,
	sectionsPowerGain,
	zeroPhasePassEdges
} from '../../../src/lib/analysis/filters';
import { runReference } from './helpers/python-reference';

const G = OCTAVE_RATIO;

describe('Butterworth band-pass design against scipy.signal.butter(N, [f1, f2], btype="band", fs=fs, output="sos")', () => {
	const designs = [
		{ order: 3, lowHz: 707.946, highHz: 1412.538, sampleRate: 48000 },
		{ order: 3, lowHz: 44.668, highHz: 89.125, sampleRate: 96000 },
		{ order: 3, lowHz: 8912.5, highHz: 11220.2, sampleRate: 44100 },
		{ order: 1, lowHz: 300, highHz: 600, sampleRate: 48000 },
		{ order: 2, lowHz: 100, highHz: 5000, sampleRate: 192000 },
		{ order: 4, lowHz: 891.251, highHz: 1122.018, sampleRate: 48000 },
		// Wide bands, whose middle poles fall on the real axis (the broadband span of the analysis bands).
		{ order: 3, lowHz: 40, highHz: 12000, sampleRate: 44100 },
		{ order: 3, lowHz: 37.9, highHz: 13200, sampleRate: 48000 }
	];
	const reference = runReference<{ sos: number[][][] }>('filters.py', { designs }).sos;

	it.each(designs.map((design, i) => ({ ...design, i })))(
		'order $order, $lowHz–$highHz Hz at $sampleRate Hz: coefficients agree to 1e-9 relative',
		({ order, lowHz, highHz, sampleRate, i }) => {
			const mine = designButterworthBandpass(order, lowHz, highHz, sampleRate);
			const expected = reference[i];
			expect(mine.length).toBe(expected.length * 6);
			expected.forEach((row, section) => {
				// Zero coefficients (b1 = 0) are compared against the row's scale instead.
				const rowScale = Math.max(...row.map(Math.abs));
				row.forEach((value, j) => {
					expect(Math.abs(mine[section * 6 + j] - value)).toBeLessThanOrEqual(1e-9 * Math.abs(value) + 1e-15 * rowScale);
				});
			});
		}
	);

	it.each([
		{ order: 3, lowHz: 1000, highHz: 900, sampleRate: 48000 },
		{ order: 3, lowHz: 1000, highHz: 24000, sampleRate: 48000 },
		{ order: 0, lowHz: 100, highHz: 200, sampleRate: 48000 },
		{ order: 3, lowHz: 0, highHz: 200, sampleRate: 48000 }
	])('rejects order $order, $lowHz–$highHz Hz at $sampleRate Hz', ({ order, lowHz, highHz, sampleRate }) => {
		expect(() => designButterworthBandpass(order, lowHz, highHz, sampleRate)).toThrow(RangeError);
	});
});

/** Attenuation, dB, of the forward-backward (squared) response re the mid-band. */
function zeroPhaseAttenuationDb(sos: Float64Array, frequencyHz: number, midHz: number, sampleRate: number): number {
	return -20 * Math.log10(sectionsPowerGain(sos, frequencyHz, sampleRate) / sectionsPowerGain(sos, midHz, sampleRate));
}

/**
 * IEC 61260-1:2014 class 1 limits for octave filters at Ω = G^e, Table 1 (from memory).
 * min/max relative attenuation in dB; max = Infinity where only a minimum applies.
 */
const CLASS_1_OCTAVE = [
	{ e: 0, min: -0.4, max: 0.4 },
	{ e: 1 / 8, min: -0.4, max: 0.5 },
	{ e: 1 / 4, min: -0.4, max: 0.7 },
	{ e: 3 / 8, min: -0.4, max: 1.4 },
	{ e: 1 / 2, min: 1.2, max: 5.3 },
	{ e: 1, min: 16.6, max: Infinity },
	{ e: 2, min: 40.5, max: Infinity },
	{ e: 3, min: 60, max: Infinity },
	{ e: 4, min: 70, max: Infinity }
];

/**
 * Normalised frequencies of the mask for a 1/b-octave filter: the octave breakpoints moved by
 * Ω_b = 1 + (G^(1/2b) − 1)/(G^(1/2) − 1)·(G^e − 1) above mid-band, 1/Ω_b below
 * (IEC 61260-1:2014 fractional-octave breakpoints, from memory).
 */
function maskFrequencies(e: number, b: number): number[] {
	const above = b === 1 ? G ** e : 1 + ((G ** (1 / (2 * b)) - 1) / (G ** 0.5 - 1)) * (G ** e - 1);
	return e === 0 ? [1] : [above, 1 / above];
}

function maskViolations(sos: Float64Array, midHz: number, b: number, sampleRate: number): { checked: number; failures: string[] } {
	const failures: string[] = [];
	let checked = 0;
	for (const { e, min, max } of CLASS_1_OCTAVE) {
		for (const omega of maskFrequencies(e, b)) {
			const f = omega * midHz;
			if (f >= 0.5 * sampleRate) continue; // no response to check above Nyquist
			checked++;
			const attenuation = zeroPhaseAttenuationDb(sos, f, midHz, sampleRate);
			if (attenuation < min || attenuation > max) failures.push(`Ω=${omega.toFixed(4)}: ${attenuation.toFixed(2)} dB not in ${min}…${max}`);
		}
	}
	return { checked, failures };
}

describe('band filters of the bank: forward-backward response', () => {
	it('is −3.01 dB at the exact band edges and 0 dB at mid-band (design goal of the widened passes, Butterworth |H|² = 1/(1 + x^2N))', () => {
		for (const sampleRate of [44100, 48000, 96000]) {
			for (const kind of ['octave', 'third'] as const) {
				for (const { band, sections } of createBandFilterBank(sampleRate, kind).filters) {
					const combinedDb = (f: number) => 20 * Math.log10(sectionsPowerGain(sections, f, sampleRate));
					// 1e-6 dB: only rounding of the design arithmetic is expected.
					expect(Math.abs(combinedDb(band.lowerHz) + 10 * Math.log10(2))).toBeLessThan(1e-6);
					expect(Math.abs(combinedDb(band.upperHz) + 10 * Math.log10(2))).toBeLessThan(1e-6);
					expect(Math.abs(combinedDb(Math.sqrt(band.lowerHz * band.upperHz)))).toBeLessThan(0.1);
				}
			}
		}
	});

	it.each([
		{ kind: 'octave', b: 1 },
		{ kind: 'third', b: 3 }
	] as const)('1 kHz $kind at 48 kHz meets the class 1 mask at every listed Ω (IEC 61260-1:2014)', ({ kind, b }) => {
		const band = bandAt(kind, 0);
		const edges = zeroPhasePassEdges(band.lowerHz, band.upperHz, 48000, BAND_FILTER_ORDER);
		const sos = designButterworthBandpass(BAND_FILTER_ORDER, edges.lowHz, edges.highHz, 48000);
		const { checked, failures } = maskViolations(sos, band.exactHz, b, 48000);
		expect(failures).toEqual([]);
		expect(checked).toBe(17);
	});

	it.each([44100, 48000, 96000])('every analysed band meets the class 1 mask at %i Hz (IEC 61260-1:2014)', (sampleRate) => {
		for (const [kind, b] of [
			['octave', 1],
			['third', 3]
		] as const) {
			for (const { band, sections } of createBandFilterBank(sampleRate, kind).filters) {
				const { checked, failures } = maskViolations(sections, band.exactHz, b, sampleRate);
				expect(failures, `${kind} ${band.nominalHz} Hz`).toEqual([]);
				expect(checked).toBeGreaterThanOrEqual(10);
			}
		}
	});

	it('the mask check rejects a filter that is too shallow: a 1st-order pair on the same edges fails at Ω = G^±1', () => {
		const band = bandAt('octave', 0);
		const sos = designButterworthBandpass(1, band.lowerHz, band.upperHz, 48000);
		expect(maskViolations(sos, band.exactHz, 1, 48000).failures.length).toBeGreaterThan(0);
	});

	it('single pass on the exact edges also meets class 1 (a 3rd-order Butterworth on the exact edges passes, as a scipy design shows)', () => {
		for (const kind of ['octave', 'third'] as const) {
			const band = bandAt(kind, 0);
			const sos = designButterworthBandpass(3, band.lowerHz, band.upperHz, 48000);
			// Compare a single pass: halve the squared-response attenuation.
			for (const { e, min, max } of CLASS_1_OCTAVE) {
				for (const omega of maskFrequencies(e, kind === 'octave' ? 1 : 3)) {
					const attenuation = zeroPhaseAttenuationDb(sos, omega * band.exactHz, band.exactHz, 48000) / 2;
					expect(attenuation).toBeGreaterThanOrEqual(min);
					expect(attenuation).toBeLessThanOrEqual(max);
				}
			}
		}
	});
});

describe('zero-phase filtering', () => {
	it.each([0, 3, 7])('a filtered impulse keeps its peak in place and is symmetric (octave band %i at 48 kHz)', (bandIndex) => {
		// A forward-backward filter has the real, even impulse response of |H|² (zero-phase systems: Oppenheim & Schafer, Discrete-Time Signal Processing; from memory).
		const bank = createBandFilterBank(48000, 'octave');
		const n = 48000;
		const at = n / 2;
		const impulse = new Float64Array(n);
		impulse[at] = 1;
		const y = bank.filterZeroPhase(bandIndex, impulse);
		let peak = 0;
		for (let i = 1; i < n; i++) if (Math.abs(y[i]) > Math.abs(y[peak])) peak = i;
		expect(peak).toBe(at);
		let asymmetry = 0;
		for (let k = 1; k < 4000; k++) asymmetry = Math.max(asymmetry, Math.abs(y[at + k] - y[at - k]));
		// Round-off only: both passes run in double precision over ~50k samples.
		expect(asymmetry).toBeLessThan(1e-9 * Math.abs(y[at]));
	});

	it('a steady sine comes out scaled by the combined |H|² of the coefficients (time-domain filtering vs frequency response)', () => {
		const sampleRate = 48000;
		const bank = createBandFilterBank(sampleRate, 'octave');
		const bandIndex = 4; // 1 kHz
		for (const f of [1000, 1600, 2000, 600]) {
			const n = sampleRate;
			const x = new Float64Array(n).map((_, i) => Math.sin((2 * Math.PI * f * i) / sampleRate));
			const y = bank.filterZeroPhase(bandIndex, x);
			// Amplitude from the middle, away from both ends' transients.
			let sumSquares = 0;
			for (let i = n / 4; i < (3 * n) / 4; i++) sumSquares += y[i] * y[i];
			const amplitude = Math.sqrt((2 * sumSquares) / (n / 2));
			const expected = sectionsPowerGain(bank.filters[bandIndex].sections, f, sampleRate);
			// 0.1 % tolerance: the mean over a whole number of half periods is exact to ~1/n.
			expect(Math.abs(amplitude - expected)).toBeLessThan(1e-3 * Math.max(expected, 1e-3));
		}
	});

	it('forward then backward filtering equals the zero-phase result of the bank (same passes, no padding effect mid-signal)', () => {
		const bank = createBandFilterBank(44100, 'third');
		const x = new Float64Array(20000).map((_, i) => Math.sin(i * 0.37) * Math.exp(-i / 5000));
		const viaBank = bank.filterZeroPhase(10, x);
		const manual = x.slice();
		filterForwardInPlace(bank.filters[10].sections, manual);
		filterBackwardInPlace(bank.filters[10].sections, manual);
		// Early samples do not depend on the end padding once the backward pass has run far enough.
		for (let i = 0; i < 5000; i++) expect(Math.abs(viaBank[i] - manual[i])).toBeLessThan(1e-9);
	});

	it('bank layout: 8 octave and 24 third bands, 3 sections each, B = f₂ − f₁', () => {
		for (const [kind, count] of [
			['octave', 8],
			['third', 24]
		] as const) {
			const bank = createBandFilterBank(48000, kind);
			expect(bank.filters).toHaveLength(count);
			expect(bank.filters.map((f) => f.band.nominalHz)).toEqual(analysisBands(kind).map((b) => b.nominalHz));
			for (const filter of bank.filters) {
				expect(filter.sections).toHaveLength(18);
				expect(filter.bandwidthHz).toBeCloseTo(filter.band.upperHz - filter.band.lowerHz, 9);
			}
		}
	});

	it.each([
		{ start: -1, end: 10 },
		{ start: 5, end: 5 },
		{ start: 0, end: 101 }
	])('rejects the range $start…$end of a 100-sample input', ({ start, end }) => {
		const bank = createBandFilterBank(48000, 'octave');
		expect(() => bank.filterZeroPhase(0, new Float64Array(100), start, end)).toThrow(RangeError);
	});
});

describe('zero-phase band signals written squared', () => {
	// The decay analysis reads the squared band signal: squaring it in the backward pass must give
	// the very values of squaring it afterwards, in every band and the span, with leading zeros.
	it('equals the band signal squared, bit for bit', () => {
		const sampleRate = 48000;
		const x = Float64Array.from({ length: 20000 }, (_, i) => Math.sin(0.05 * i) * Math.exp(-i / 6000) + ((i * 7919) % 997) / 997 - 0.5);
		const bank = createBandFilterBank(sampleRate, 'octave');
		const check = (plain: Float64Array, squared: Float64Array) => {
			expect(squared.length).toBe(plain.length);
			let mismatches = 0;
			for (let i = 0; i < plain.length; i++) if (squared[i] !== plain[i] * plain[i]) mismatches++;
			expect(mismatches).toBe(0);
		};
		bank.filters.forEach((_, band) => check(bank.filterZeroPhase(band, x, 100, 19000, undefined, 37), bank.filterZeroPhase(band, x, 100, 19000, undefined, 37, true)));
		check(bank.filterSpanZeroPhase(x, 0, x.length), bank.filterSpanZeroPhase(x, 0, x.length, undefined, 0, true));
		// A non-zero signal, so the check compares something.
		expect(Math.max(...bank.filterZeroPhase(5, x, 0, x.length, undefined, 0, true))).toBeGreaterThan(0);
	});
});
