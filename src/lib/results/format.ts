// Numbers and lists as sentences and tables show them: seconds to 2 decimals, dB to 1,
// frequencies as people say them ("125 Hz", "1 kHz", "31.5 Hz", "1.25 kHz").

/** Fixed decimals without a minus sign on a value that rounds to zero. */
function fixed(value: number, decimals: number): string {
	const text = value.toFixed(decimals);
	return Number(text) === 0 ? (0).toFixed(decimals) : text;
}

export function formatSeconds(valueS: number): string {
	return fixed(valueS, 2);
}

export function formatDecibels(valueDb: number): string {
	return fixed(valueDb, 1);
}

export function formatPercent(fraction: number): string {
	return fixed(100 * fraction, 0);
}

/** A count or an average count: whole numbers as such, others to one decimal. */
export function formatCount(value: number): string {
	const rounded = Math.round(value * 10) / 10;
	return Number.isInteger(rounded) ? String(rounded) : rounded.toFixed(1);
}

/** Up to `decimals` decimals, trailing zeros dropped. */
function trimmed(value: number, decimals: number): string {
	return String(Number(value.toFixed(decimals)));
}

export function formatFrequency(hz: number): string {
	if (!Number.isFinite(hz) || hz <= 0) throw new RangeError(`a frequency must be a finite number > 0, got ${hz}`);
	return hz >= 1000 ? `${trimmed(hz / 1000, 2)} kHz` : `${trimmed(hz, 1)} Hz`;
}

/** "a", "a and b", "a, b and c". */
export function joinList(items: readonly string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
