/** Decimation of long curves into chart-sized arrays. */

export function roundTo(value: number, decimals: number): number {
	const factor = 10 ** decimals;
	// + 0 turns −0 into 0, so stored JSON reads back equal.
	return Math.round(value * factor) / factor + 0;
}

/** Evenly spaced samples of a smooth curve (first and last kept), times from `sampleRate`. */
export function decimateEvenly(
	values: Float64Array,
	sampleRate: number,
	maxPoints: number
): { timesS: number[]; values: number[] } {
	if (!(Number.isInteger(maxPoints) && maxPoints >= 2)) throw new RangeError(`maxPoints must be an integer ≥ 2, got ${maxPoints}`);
	const count = Math.min(values.length, maxPoints);
	const timesS: number[] = new Array(count);
	const out: number[] = new Array(count);
	for (let j = 0; j < count; j++) {
		const index = count === 1 ? 0 : Math.round((j * (values.length - 1)) / (count - 1));
		timesS[j] = index / sampleRate;
		out[j] = values[index];
	}
	return { timesS, values: out };
}

/**
 * Max-decimation: the range is cut into at most `maxPoints` equal buckets and each keeps its
 * largest value at that value's own position, so no peak is lost or moved.
 */
export function decimateKeepingPeaks(values: Float64Array, maxPoints: number): { indices: number[]; values: number[] } {
	if (!(Number.isInteger(maxPoints) && maxPoints >= 1)) throw new RangeError(`maxPoints must be a positive integer, got ${maxPoints}`);
	const buckets = Math.min(values.length, maxPoints);
	const indices: number[] = [];
	const out: number[] = [];
	for (let b = 0; b < buckets; b++) {
		const start = Math.floor((b * values.length) / buckets);
		const end = Math.floor(((b + 1) * values.length) / buckets);
		let best = start;
		for (let i = start + 1; i < end; i++) if (values[i] > values[best]) best = i;
		indices.push(best);
		out.push(values[best]);
	}
	return { indices, values: out };
}
