/**
 * Energy parameters of an impulse response (ISO 3382-1:2009 definitions): clarity C50, C80,
 * definition D50 and centre time Ts. The squared response starts at the start point; it is used
 * up to the truncation point, and the decay beyond is the exponential tail of the late decay line
 * (Lundeby et al. 1995) rather than the noise (which would inflate the late energy).
 */

export interface EnergyParameters {
	c50Db: number;
	c80Db: number;
	d50: number;
	centreTimeMs: number;
	/** ∫ p² over the whole response (pre-ringing, samples up to the truncation and the tail), in squared-sample units. */
	totalEnergy: number;
}

/** Exponential continuation P₁·e^(−k(t − t₁)) past the truncation point t₁. */
export interface DecayTail {
	powerAtTruncation: number;
	/** Energy decay rate k, 1/s (k = |slope dB/s|·ln10/10). */
	decayRatePerS: number;
}

/**
 * C50, C80, D50 and Ts of squared[…end) (plus the tail past `end`), with time measured from
 * `origin`, the start point. Samples before the origin — the pre-ringing a zero-phase band filter
 * spreads ahead of the direct sound — count as early energy, where the filter took them from.
 */
export function energyParameters(squared: Float64Array, sampleRate: number, end: number, tail: DecayTail | null, origin = 0): EnergyParameters {
	if (!(end >= 1 && end <= squared.length)) throw new RangeError(`truncation index ${end} outside 1…${squared.length}`);
	if (!(Number.isInteger(origin) && origin >= 0 && origin < end)) throw new RangeError(`start point ${origin} outside 0…${end - 1}`);
	if (tail && !(tail.decayRatePerS > 0 && tail.powerAtTruncation >= 0)) {
		throw new RangeError('the tail needs a positive decay rate and a non-negative power');
	}
	const t1 = (end - origin) / sampleRate;
	let total = 0;
	let moment = 0;
	for (let i = 0; i < end; i++) {
		total += squared[i];
		moment += ((i - origin) / sampleRate) * squared[i];
	}
	const tailEnergy = tail ? (tail.powerAtTruncation * sampleRate) / tail.decayRatePerS : 0;
	if (tail) {
		// ∫ P₁e^(−k(t−t₁)) dt = P₁/k and ∫ t·P₁e^(−k(t−t₁)) dt = P₁(t₁/k + 1/k²), t from t₁ to ∞ (× fs for sample units).
		const { powerAtTruncation: p1, decayRatePerS: k } = tail;
		moment += p1 * sampleRate * (t1 / k + 1 / (k * k));
	}
	total += tailEnergy;
	if (!(total > 0)) throw new RangeError('the impulse response holds no energy after its start point');

	/** Energy before time t after the origin: samples up to the truncation, the tail's share beyond. */
	const energyBefore = (tS: number): number => {
		const index = origin + Math.round(tS * sampleRate);
		let sum = 0;
		for (let i = 0; i < Math.min(index, end); i++) sum += squared[i];
		if (index > end && tail) sum += tailEnergy * (1 - Math.exp(-tail.decayRatePerS * (tS - t1)));
		return sum;
	};
	const early50 = energyBefore(0.05);
	const early80 = energyBefore(0.08);
	// C_te = 10·lg(∫₀^te p² / ∫te^∞ p²), D50 = ∫₀^50ms p² / ∫₀^∞ p², Ts = ∫ t·p² / ∫ p² (ISO 3382-1:2009, Annex A).
	return {
		c50Db: 10 * Math.log10(early50 / (total - early50)),
		c80Db: 10 * Math.log10(early80 / (total - early80)),
		d50: early50 / total,
		centreTimeMs: (1000 * moment) / total,
		totalEnergy: total
	};
}
