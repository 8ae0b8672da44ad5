// Plain numbers as tables and sentences show them: fixed decimals, a typographic minus, a dash
// for a missing value, and no sign on a value that rounds to zero.

/** Typographic minus, so negative numbers line up and read as numbers. */
export const MINUS = '\u2212';

/** Shown for a value that is missing. */
export const MISSING = '—';

function checkDecimals(decimals: number): void {
	if (!Number.isInteger(decimals) || decimals < 0 || decimals > 10) throw new RangeError(`decimals must be an integer 0…10, got ${decimals}`);
}

/** Fixed decimals, typographic minus, "—" for null or non-finite; a value that rounds to zero shows as 0. */
export function formatNumber(value: number | null | undefined, decimals: number): string {
	checkDecimals(decimals);
	if (value === null || value === undefined || !Number.isFinite(value)) return MISSING;
	const text = value.toFixed(decimals);
	if (Number(text) === 0) return text.replace('-', '');
	return text.startsWith('-') ? MINUS + text.slice(1) : text;
}

/** A change: "+0.12", "−0.32", and "0.00" for one that rounds to nothing (no sign suggests no direction). */
export function formatSigned(value: number | null | undefined, decimals: number): string {
	const text = formatNumber(value, decimals);
	return value !== null && value !== undefined && Number.isFinite(value) && Number(value.toFixed(decimals)) > 0 ? `+${text}` : text;
}

/** A fraction as whole percent: 0.333 → "33". */
export function formatPercent(fraction: number | null | undefined): string {
	return formatNumber(fraction === null || fraction === undefined ? fraction : 100 * fraction, 0);
}

/** A count or an average count: whole numbers as such, others to one decimal ("5", "4.5"). */
export function formatCount(value: number | null | undefined): string {
	if (value === null || value === undefined || !Number.isFinite(value)) return MISSING;
	const rounded = Math.round(value * 10) / 10;
	return formatNumber(rounded, Number.isInteger(rounded) ? 0 : 1);
}

/** x rounded to `digits` significant figures (0 stays 0). */
export function roundSignificant(value: number, digits = 3): number {
	if (!Number.isInteger(digits) || digits < 1 || digits > 15) throw new RangeError(`digits must be an integer 1…15, got ${digits}`);
	if (!Number.isFinite(value)) throw new RangeError(`cannot round ${value}`);
	if (value === 0) return 0;
	return Number(value.toPrecision(digits));
}
