import { analysisBands, type Band, type BandKind } from './bands';

/**
 * Second-order sections, n × [b0, b1, b2, a0 = 1, a1, a2] (the layout scipy.signal uses), the
 * overall gain folded into the first section.
 */
export type SecondOrderSections = Float64Array;

interface Complex {
	re: number;
	im: number;
}

const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
const sub = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });
const mul = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const scale = (a: Complex, s: number): Complex => ({ re: a.re * s, im: a.im * s });
function div(a: Complex, b: Complex): Complex {
	const d = b.re * b.re + b.im * b.im;
	return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}
/** Principal square root. */
function sqrt(a: Complex): Complex {
	const r = Math.hypot(a.re, a.im);
	const re = Math.sqrt((r + a.re) / 2);
	const im = Math.sqrt(Math.max(0, (r - a.re) / 2));
	return { re, im: a.im < 0 ? -im : im };
}
const abs = (a: Complex): number => Math.hypot(a.re, a.im);

/**
 * Digital Butterworth band-pass of the given order on [lowHz, highHz] as second-order sections:
 * analog prototype poles −e^(jπm/2N) (Butterworth), low-pass → band-pass substitution
 * s → (s² + ω₀²)/(B·s), bilinear transform with the edges pre-warped, ω = 2·fs·tan(πf/fs)
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, bilinear transformation; from memory), then poles paired with their
 * nearest zeros, the poles nearest the unit circle last — the construction of
 * scipy.signal.butter(order, [low, high], btype='band', fs=fs, output='sos').
 */
export function designButterworthBandpass(order: number, lowHz: number, highHz: number, sampleRate: number): SecondOrderSections {
	if (!Number.isInteger(order) || order < 1 || order > 10) throw new RangeError(`filter order must be an integer 1…10, got ${order}`);
	if (!(lowHz > 0 && highHz > lowHz && highHz < sampleRate / 2)) {
		throw new RangeError(`band edges must satisfy 0 < low < high < fs/2: got ${lowHz}, ${highHz} Hz at ${sampleRate} Hz`);
	}
	// Work at a normalised sampling rate of 2 (the bilinear constant 2·fs = 4), as scipy does.
	const bilinear = 4;
	const warpedLow = bilinear * Math.tan((Math.PI * lowHz) / sampleRate);
	const warpedHigh = bilinear * Math.tan((Math.PI * highHz) / sampleRate);
	const bandwidth = warpedHigh - warpedLow;
	const centreSquared = warpedLow * warpedHigh;

	const analogPoles: Complex[] = [];
	for (let m = -order + 1; m < order; m += 2) {
		const angle = (Math.PI * m) / (2 * order);
		const p = scale({ re: -Math.cos(angle), im: -Math.sin(angle) }, bandwidth / 2);
		const root = sqrt(sub(mul(p, p), { re: centreSquared, im: 0 }));
		analogPoles.push(add(p, root), sub(p, root));
	}
	const b = { re: bilinear, im: 0 };
	const poles = analogPoles.map((p) => div(add(b, p), sub(b, p)));
	// Gain: B^N from the substitution, times prod(2fs − z)/prod(2fs − p) from the bilinear transform (zeros at s = 0).
	let gain: Complex = { re: bandwidth ** order * bilinear ** order, im: 0 };
	for (const p of analogPoles) gain = div(gain, sub(b, p));

	// N zeros at z = +1 (from s = 0) and N at z = −1 (from s = ∞).
	const zeros: number[] = [...Array(order).fill(-1), ...Array(order).fill(1)];
	// One pole of each conjugate pair, and the real poles a wide band puts on the axis (scipy's _cplxreal).
	const isReal = (p: Complex) => Math.abs(p.im) <= 1e-12 * Math.max(1, abs(p));
	const remaining = poles.filter((p) => p.im > 0 || isReal(p)).map((p) => (isReal(p) ? { re: p.re, im: 0 } : p));
	const closestToUnitCircle = (candidates: Complex[]): number => {
		let worst = -1;
		for (let i = 0; i < candidates.length; i++) {
			if (worst < 0 || Math.abs(1 - abs(candidates[i])) < Math.abs(1 - abs(candidates[worst]))) worst = i;
		}
		return worst;
	};
	const sections = new Float64Array(order * 6);
	for (let section = order - 1; section >= 0; section--) {
		const [pole] = remaining.splice(closestToUnitCircle(remaining), 1);
		// A complex pole goes with its conjugate; a real one with the real pole next closest to the unit circle.
		let second: Complex = { re: pole.re, im: -pole.im };
		if (isReal(pole)) {
			const reals = remaining.filter(isReal);
			if (reals.length === 0) throw new RangeError('unpaired real pole in a band-pass design');
			second = reals[closestToUnitCircle(reals)];
			remaining.splice(remaining.indexOf(second), 1);
		}
		const takeNearestZero = (): number => {
			let best = 0;
			for (let i = 1; i < zeros.length; i++) {
				if (abs(sub({ re: zeros[i], im: 0 }, pole)) < abs(sub({ re: zeros[best], im: 0 }, pole))) best = i;
			}
			return zeros.splice(best, 1)[0];
		};
		const z1 = takeNearestZero();
		const z2 = takeNearestZero();
		const row = section * 6;
		sections[row] = 1;
		sections[row + 1] = -(z1 + z2);
		sections[row + 2] = z1 * z2;
		sections[row + 3] = 1;
		// (z − p)(z − q) = z² − (p + q)z + pq, real for a conjugate pair and for two real poles.
		sections[row + 4] = -(pole.re + second.re);
		sections[row + 5] = pole.re * second.re - pole.im * second.im;
	}
	for (let i = 0; i < 3; i++) sections[i] *= gain.re;
	return sections;
}

/**
 * Edges for each pass of a forward-backward filter so that the combined response, |H|², is 3.01 dB
 * down at the exact band edges: the same pre-warped centre, the bandwidth widened by
 * 1/(√2 − 1)^(1/2N) (a Butterworth pass is 1/(1 + x^2N) in power, and (1 + x^2N)² = 2 there).
 */
export function zeroPhasePassEdges(lowHz: number, highHz: number, sampleRate: number, order: number): { lowHz: number; highHz: number } {
	const warp = (f: number) => Math.tan((Math.PI * f) / sampleRate);
	const unwarp = (w: number) => (sampleRate / Math.PI) * Math.atan(w);
	const wLow = warp(lowHz);
	const wHigh = warp(highHz);
	const centreSquared = wLow * wHigh;
	const widened = (wHigh - wLow) / (Math.SQRT2 - 1) ** (1 / (2 * order));
	const newHigh = (widened + Math.sqrt(widened * widened + 4 * centreSquared)) / 2;
	return { lowHz: unwarp(centreSquared / newHigh), highHz: unwarp(newHigh) };
}

/** |H(e^jω)|² of the sections at one frequency. */
export function sectionsPowerGain(sos: SecondOrderSections, frequencyHz: number, sampleRate: number): number {
	const w = (2 * Math.PI * frequencyHz) / sampleRate;
	const c1 = Math.cos(w);
	const s1 = Math.sin(w);
	const c2 = Math.cos(2 * w);
	const s2 = Math.sin(2 * w);
	let gain = 1;
	for (let row = 0; row < sos.length; row += 6) {
		const nr = sos[row] + sos[row + 1] * c1 + sos[row + 2] * c2;
		const ni = -(sos[row + 1] * s1 + sos[row + 2] * s2);
		const dr = sos[row + 3] + sos[row + 4] * c1 + sos[row + 5] * c2;
		const di = -(sos[row + 4] * s1 + sos[row + 5] * s2);
		gain *= (nr * nr + ni * ni) / (dr * dr + di * di);
	}
	return gain;
}

/**
 * Runs the cascade over data[start…end) in place, forward (step 1) or backward (step −1) in time,
 * transposed direct form II, zero initial state. Three sections — the band filters — run in one
 * sweep over the data with the state in locals; other counts section by section. `square`: each
 * output is written squared (the decay analysis's input, without a pass of its own).
 */
function runCascade(sos: SecondOrderSections, data: Float64Array, start: number, end: number, step: 1 | -1, square = false): void {
	if (!(start >= 0 && end <= data.length && start <= end)) throw new RangeError(`bad range ${start}…${end} of ${data.length} samples`);
	const first = step === 1 ? start : end - 1;
	const stop = step === 1 ? end : start - 1;
	if (sos.length === 18) {
		const [b00, b01, b02, , a01, a02, b10, b11, b12, , a11, a12, b20, b21, b22, , a21, a22] = sos;
		let s01 = 0, s02 = 0, s11 = 0, s12 = 0, s21 = 0, s22 = 0;
		for (let i = first; i !== stop; i += step) {
			const x = data[i];
			const y0 = b00 * x + s01;
			s01 = b01 * x - a01 * y0 + s02;
			s02 = b02 * x - a02 * y0;
			const y1 = b10 * y0 + s11;
			s11 = b11 * y0 - a11 * y1 + s12;
			s12 = b12 * y0 - a12 * y1;
			const y2 = b20 * y1 + s21;
			s21 = b21 * y1 - a21 * y2 + s22;
			s22 = b22 * y1 - a22 * y2;
			data[i] = square ? y2 * y2 : y2;
		}
		return;
	}
	for (let row = 0; row < sos.length; row += 6) {
		const b0 = sos[row];
		const b1 = sos[row + 1];
		const b2 = sos[row + 2];
		const a1 = sos[row + 4];
		const a2 = sos[row + 5];
		let z1 = 0;
		let z2 = 0;
		for (let i = first; i !== stop; i += step) {
			const x = data[i];
			const y = b0 * x + z1;
			z1 = b1 * x - a1 * y + z2;
			z2 = b2 * x - a2 * y;
			data[i] = y;
		}
	}
	if (square) for (let i = start; i < end; i++) data[i] *= data[i];
}

/** Filters data[start…end) in place, forward in time (causal), zero initial state. */
export function filterForwardInPlace(sos: SecondOrderSections, data: Float64Array, start = 0, end = data.length): void {
	runCascade(sos, data, start, end, 1);
}

/** The same, running from the end to the start (time-reversed filtering); `square`: outputs written squared. */
export function filterBackwardInPlace(sos: SecondOrderSections, data: Float64Array, start = 0, end = data.length, square = false): void {
	runCascade(sos, data, start, end, -1, square);
}

/** Butterworth order of each pass: 3 (6th-order band-pass) for octaves and thirds. */
export const BAND_FILTER_ORDER = 3;

export interface BandFilter {
	band: Band;
	/** Coefficients of one pass (applied forward, then backward). */
	sections: SecondOrderSections;
	/** Exact bandwidth f₂ − f₁, the B of the B·T bias criterion. */
	bandwidthHz: number;
	/** Samples of mirrored signal added after the end so the backward pass starts from a settled state. */
	padding: number;
}

export interface BandFilterBank {
	sampleRate: number;
	kind: BandKind;
	filters: BandFilter[];
	/**
	 * One band-pass over the span of all the bands (lowest lower edge to highest upper edge), for
	 * the broadband values: its energies are the bands' energies together, and what lies outside
	 * every band (drift and rumble below the lowest, hiss above the highest) is left out of them too.
	 */
	span: BandFilter;
	/**
	 * Zero-phase band signal of input[start…end): forward then backward through the band's sections.
	 * The end is extended by its even mirror image (the background goes on), so the backward pass's
	 * start-up transient falls outside; the start is not mirrored, which would echo the direct
	 * sound before itself — start the range a little before the onset instead.
	 * `leadingZeros` silent samples are put before the range (the silence before a file that starts
	 * at its direct sound) so the backward pass's ringing ahead of it is kept; the result then
	 * starts with them. It is a view of `scratch` when one of scratchLength(…) samples is given.
	 * `squared`: the band signal's squares (what the decay analysis reads), the same values as
	 * squaring it afterwards.
	 */
	filterZeroPhase(
		bandIndex: number,
		input: Float64Array,
		start?: number,
		end?: number,
		scratch?: Float64Array,
		leadingZeros?: number,
		squared?: boolean
	): Float64Array;
	/** The same through the span filter. */
	filterSpanZeroPhase(input: Float64Array, start?: number, end?: number, scratch?: Float64Array, leadingZeros?: number, squared?: boolean): Float64Array;
	/** Scratch length filterZeroPhase needs for `length` input samples (and leading zeros) in any band. */
	scratchLength(length: number, leadingZeros?: number): number;
}

/**
 * Precomputes the band filters. Zero-phase (forward-backward) filtering keeps the direct sound in
 * place, so C50/C80 windows and the start point apply unchanged in every band; it squares the
 * magnitude, so each pass is designed on widened edges and the combined response meets the class 1
 * mask with −3.01 dB at the exact edges.
 */
export function createBandFilterBank(sampleRate: number, kind: BandKind, options: { extraBands?: readonly Band[] } = {}): BandFilterBank {
	if (!(sampleRate > 0)) throw new RangeError(`sample rate must be positive, got ${sampleRate}`);
	const standard = analysisBands(kind);
	// Extra bands (octaves beyond the standard range) get filters of their own but stay out of the span,
	// so the broadband values are the same with or without them.
	const filters = [...standard, ...(options.extraBands ?? [])].sort((a, b) => a.exactHz - b.exactHz).map((band): BandFilter => {
		const edges = zeroPhasePassEdges(band.lowerHz, band.upperHz, sampleRate, BAND_FILTER_ORDER);
		if (edges.highHz >= sampleRate / 2) throw new RangeError(`the ${band.nominalHz} Hz band does not fit below half of ${sampleRate} Hz`);
		const bandwidthHz = band.upperHz - band.lowerHz;
		return {
			band,
			sections: designButterworthBandpass(BAND_FILTER_ORDER, edges.lowHz, edges.highHz, sampleRate),
			bandwidthHz,
			// The pass's impulse response has decayed by > 60 dB after about 4/B.
			padding: Math.ceil((4 * sampleRate) / bandwidthHz)
		};
	});

	const lowest = standard[0];
	const highest = standard[standard.length - 1];
	const spanEdges = zeroPhasePassEdges(lowest.lowerHz, highest.upperHz, sampleRate, BAND_FILTER_ORDER);
	if (spanEdges.highHz >= sampleRate / 2) throw new RangeError(`the bands' span does not fit below half of ${sampleRate} Hz`);
	const span: BandFilter = {
		band: { ...lowest, nominalHz: 0, exactHz: Math.sqrt(lowest.lowerHz * highest.upperHz), upperHz: highest.upperHz },
		sections: designButterworthBandpass(BAND_FILTER_ORDER, spanEdges.lowHz, spanEdges.highHz, sampleRate),
		bandwidthHz: highest.upperHz - lowest.lowerHz,
		// A wide band rings at its lower edge: settled after about 4 periods of it.
		padding: Math.ceil((4 * sampleRate) / lowest.lowerHz)
	};

	const maxPadding = Math.max(span.padding, ...filters.map((filter) => filter.padding));
	const scratchLength = (length: number, leadingZeros = 0) => leadingZeros + length + Math.min(maxPadding, Math.max(0, length - 1));

	function zeroPhase(
		filter: BandFilter,
		input: Float64Array,
		start: number,
		end: number,
		scratch: Float64Array | undefined,
		leadingZeros: number,
		squared: boolean
	): Float64Array {
		if (!(start >= 0 && end <= input.length && end > start)) throw new RangeError(`bad range ${start}…${end} of ${input.length} samples`);
		if (!(Number.isInteger(leadingZeros) && leadingZeros >= 0)) throw new RangeError(`leading zeros must be a whole number, got ${leadingZeros}`);
		const length = end - start;
		const pad = Math.min(filter.padding, length - 1);
		const total = leadingZeros + length + pad;
		const work = scratch && scratch.length >= total ? scratch.subarray(0, total) : new Float64Array(total);
		work.fill(0, 0, leadingZeros);
		work.set(input.subarray(start, end), leadingZeros);
		const last = leadingZeros + length - 1;
		for (let i = 1; i <= pad; i++) work[last + i] = input[end - 1 - i];
		filterForwardInPlace(filter.sections, work);
		filterBackwardInPlace(filter.sections, work, 0, work.length, squared);
		return work.subarray(0, leadingZeros + length);
	}

	function filterZeroPhase(
		bandIndex: number,
		input: Float64Array,
		start = 0,
		end = input.length,
		scratch?: Float64Array,
		leadingZeros = 0,
		squared = false
	): Float64Array {
		const filter = filters[bandIndex];
		if (!filter) throw new RangeError(`no band ${bandIndex}: the bank has ${filters.length} bands`);
		return zeroPhase(filter, input, start, end, scratch, leadingZeros, squared);
	}

	const filterSpanZeroPhase = (input: Float64Array, start = 0, end = input.length, scratch?: Float64Array, leadingZeros = 0, squared = false) =>
		zeroPhase(span, input, start, end, scratch, leadingZeros, squared);

	return { sampleRate, kind, filters, span, filterZeroPhase, filterSpanZeroPhase, scratchLength };
}
