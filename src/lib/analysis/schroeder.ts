/**
 * Schroeder backward integration (Schroeder, "New method of measuring reverberation time",
 * JASA 37(3):409–412, 1965): E(t) = ∫ₜ^∞ p²(τ) dτ, here summed from the truncation point back,
 * plus the energy of the missing tail beyond it (Lundeby et al., Acustica 81:344, 1995).
 */

/** Missing tail of an exponential decay of power P₁ at t₁: ∫ P₁·e^(−k(t−t₁)) dt = P₁/k, in samples (× fs). */
export function exponentialTailEnergy(powerAtTruncation: number, decayDbPerS: number, sampleRate: number): number {
	if (!(decayDbPerS < 0)) throw new RangeError(`a decay slope must be negative, got ${decayDbPerS} dB/s`);
	// k = |slope|·ln10/10 turns a dB/s slope into the energy decay rate (equivalently T_late/(6·ln10) = 1/k).
	const k = (-decayDbPerS * Math.LN10) / 10;
	return (powerAtTruncation * sampleRate) / k;
}

/**
 * Backward-integrated decay over [0, end), normalised to 1 at index 0 (linear energy, not dB:
 * the fits take logarithms only where they need them); `tailEnergy` is added to every value.
 * Written into the first `end` values of `into` when it is given (and long enough), else into a new array.
 */
export function schroederDecay(squared: Float64Array, end: number, tailEnergy = 0, into?: Float64Array): Float64Array {
	if (!(end >= 1 && end <= squared.length)) throw new RangeError(`truncation index ${end} outside 1…${squared.length}`);
	if (!(tailEnergy >= 0)) throw new RangeError(`tail energy must be ≥ 0, got ${tailEnergy}`);
	const curve = into && into.length >= end ? into.subarray(0, end) : new Float64Array(end);
	let sum = tailEnergy;
	for (let i = end - 1; i >= 0; i--) {
		sum += squared[i];
		curve[i] = sum;
	}
	const total = curve[0];
	if (!(total > 0)) throw new RangeError('the decay holds no energy');
	const inverse = 1 / total;
	for (let i = 0; i < end; i++) curve[i] *= inverse;
	return curve;
}

/** The decay in dB re its start, 10·lg(E(t)/E(0)). */
export function decayLevelDb(normalisedEnergy: number): number {
	return 10 * Math.log10(normalisedEnergy);
}
