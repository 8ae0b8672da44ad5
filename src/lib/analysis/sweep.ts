/** Exponential sine sweep (Farina, AES 108th Convention, preprint 5093, 2000). */

export interface ExponentialSweepOptions {
	f1Hz: number;
	f2Hz: number;
	/** Length of the sweep itself, fades included, silence excluded. */
	durationS: number;
	sampleRate: number;
	fadeInS: number;
	fadeOutS: number;
	/** Linear peak amplitude, 0 < amplitude ≤ 1. */
	amplitude: number;
	/** Silence appended after the sweep so the room's decay is recorded too. */
	silenceS?: number;
}

export interface ExponentialSweep {
	samples: Float64Array;
	sampleRate: number;
	f1Hz: number;
	f2Hz: number;
	durationS: number;
	/** Number of samples of the sweep before the appended silence. */
	sweepSamples: number;
}

function checkPositive(name: string, value: number): void {
	if (!Number.isFinite(value) || value <= 0) throw new RangeError(`${name} must be a positive number, got ${value}`);
}

/** Phase of the sweep at time t: (ω₁·T / ln(ω₂/ω₁))·(e^((t/T)·ln(ω₂/ω₁)) − 1) (Farina 2000, eq. for the log sweep). */
export function exponentialSweepPhase(t: number, f1Hz: number, f2Hz: number, durationS: number): number {
	const logRatio = Math.log(f2Hz / f1Hz);
	return ((2 * Math.PI * f1Hz * durationS) / logRatio) * (Math.exp((t / durationS) * logRatio) - 1);
}

/** Time by which the N-th harmonic's response precedes the linear one: Δt_N = T·ln N / ln(f₂/f₁) (Farina 2000). */
export function harmonicLeadS(order: number, f1Hz: number, f2Hz: number, durationS: number): number {
	if (!Number.isInteger(order) || order < 2) throw new RangeError(`harmonic order must be an integer ≥ 2, got ${order}`);
	return (durationS * Math.log(order)) / Math.log(f2Hz / f1Hz);
}

/** Half-Hann ramp value for sample i of a ramp n samples long: 0.5·(1 − cos(π·i/n)). */
function halfHann(i: number, n: number): number {
	return 0.5 * (1 - Math.cos((Math.PI * i) / n));
}

export function generateExponentialSweep(options: ExponentialSweepOptions): ExponentialSweep {
	const { f1Hz, f2Hz, durationS, sampleRate, fadeInS, fadeOutS, amplitude } = options;
	const silenceS = options.silenceS ?? 0;
	checkPositive('f1Hz', f1Hz);
	checkPositive('durationS', durationS);
	checkPositive('sampleRate', sampleRate);
	if (!(f2Hz > f1Hz)) throw new RangeError(`f2Hz (${f2Hz}) must be above f1Hz (${f1Hz})`);
	if (f2Hz > sampleRate / 2) throw new RangeError(`f2Hz (${f2Hz}) must not exceed half the sample rate (${sampleRate / 2})`);
	if (!(amplitude > 0 && amplitude <= 1)) throw new RangeError(`amplitude must be in (0, 1], got ${amplitude}`);
	if (!(fadeInS >= 0 && fadeOutS >= 0 && fadeInS + fadeOutS <= durationS)) {
		throw new RangeError(`fades (${fadeInS} s in, ${fadeOutS} s out) must be ≥ 0 and fit within the ${durationS} s sweep`);
	}
	if (!(silenceS >= 0)) throw new RangeError(`silenceS must be ≥ 0, got ${silenceS}`);

	const sweepSamples = Math.round(durationS * sampleRate);
	const total = sweepSamples + Math.round(silenceS * sampleRate);
	const samples = new Float64Array(total);
	const fadeIn = Math.round(fadeInS * sampleRate);
	const fadeOut = Math.round(fadeOutS * sampleRate);
	for (let i = 0; i < sweepSamples; i++) {
		let gain = amplitude;
		if (i < fadeIn) gain *= halfHann(i, fadeIn);
		const fromEnd = sweepSamples - 1 - i;
		if (fromEnd < fadeOut) gain *= halfHann(fromEnd, fadeOut);
		samples[i] = gain * Math.sin(exponentialSweepPhase(i / sampleRate, f1Hz, f2Hz, durationS));
	}
	return { samples, sampleRate, f1Hz, f2Hz, durationS, sweepSamples };
}
