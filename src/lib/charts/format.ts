// Number formatting for chart tables and labels.

/** Typographic minus, so negative numbers line up and read as numbers in tables. */
const MINUS = '\u2212';

/** Shown for a value that is missing. */
export const MISSING = '—';

/** Fixed decimals, typographic minus, "—" for null or non-finite; −0 shows as 0. */
export function formatNumber(value: number | null | undefined, decimals: number): string {
	if (!Number.isInteger(decimals) || decimals < 0 || decimals > 10) throw new RangeError(`decimals must be an integer 0…10, got ${decimals}`);
	if (value === null || value === undefined || !Number.isFinite(value)) return MISSING;
	const text = value.toFixed(decimals);
	if (/^-0(\.0+)?$/.test(text)) return text.slice(1);
	return text.startsWith('-') ? MINUS + text.slice(1) : text;
}

/** x rounded to `digits` significant figures (0 stays 0). */
export function roundSignificant(value: number, digits = 3): number {
	if (!Number.isInteger(digits) || digits < 1 || digits > 15) throw new RangeError(`digits must be an integer 1…15, got ${digits}`);
	if (!Number.isFinite(value)) throw new RangeError(`cannot round ${value}`);
	if (value === 0) return 0;
	return Number(value.toPrecision(digits));
}
