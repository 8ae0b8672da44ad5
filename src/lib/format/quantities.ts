// Seconds, decibels and milliseconds. Their unit never changes, so they come bare: tables put
// the unit in the column header, sentences write it after the number.
import { formatNumber, MISSING } from './number';

/** Reverberation and decay times to 10 ms, two decimals: "0.48" (common practice, no source). */
export const SECONDS_DECIMALS = 2;
/** Levels and clarity to 0.1 dB, one decimal: "−3.1". */
export const DB_DECIMALS = 1;

export function formatSeconds(valueS: number | null | undefined): string {
	return formatNumber(valueS, SECONDS_DECIMALS);
}

export function formatDb(valueDb: number | null | undefined): string {
	return formatNumber(valueDb, DB_DECIMALS);
}

/** Whole milliseconds: "35". */
export function formatMs(valueMs: number | null | undefined): string {
	return formatNumber(valueMs, 0);
}

/** A time window in whole milliseconds: "20–120 ms", "from 35 ms", "up to 80 ms", or "—" without one. */
export function formatMsRange(loMs: number | null, hiMs: number | null): string {
	if (loMs === null && hiMs === null) return MISSING;
	if (hiMs === null) return `from ${formatMs(loMs)} ms`;
	if (loMs === null) return `up to ${formatMs(hiMs)} ms`;
	return `${formatMs(loMs)}–${formatMs(hiMs)} ms`;
}

/** A wait for people, rounded up to whole minutes (at least one): "1 minute", "15 minutes", "2 hours 5 minutes". */
export function formatWait(ms: number): string {
	const minutes = Math.max(1, Math.ceil(ms / 60_000));
	const plural = (n: number, unit: string) => `${n} ${unit}${n === 1 ? '' : 's'}`;
	if (minutes < 60) return plural(minutes, 'minute');
	const h = Math.floor(minutes / 60), m = minutes % 60;
	return m ? `${plural(h, 'hour')} ${plural(m, 'minute')}` : plural(h, 'hour');
}
