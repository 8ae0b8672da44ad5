// Frequencies as people say them. One rule: three significant figures, the precision of the
// ISO 266 preferred frequencies (31.5 Hz, 1.25 kHz, 12.5 kHz), trailing zeros dropped, and kHz
// from 1 kHz on, decided after rounding (999.5 Hz reads "1 kHz").
import { roundSignificant } from './number';

function rounded(hz: number): number {
	if (!Number.isFinite(hz) || hz < 0) throw new RangeError(`a frequency must be a finite number ≥ 0 Hz, got ${hz}`);
	return roundSignificant(hz, 3);
}

/** The number and the unit it is written in. */
function parts(hz: number): { value: number; kilo: boolean } {
	const r = rounded(hz);
	return r >= 1000 ? { value: r / 1000, kilo: true } : { value: r, kilo: false };
}

/** "31.5 Hz", "126 Hz", "1 kHz", "1.41 kHz", "12.5 kHz". */
export function formatHz(hz: number): string {
	const { value, kilo } = parts(hz);
	return `${value} ${kilo ? 'kHz' : 'Hz'}`;
}

/** Short axis label, same rounding without the unit: "31.5", "63", "1k", "2.5k". */
export function formatHzAxis(hz: number): string {
	const { value, kilo } = parts(hz);
	return kilo ? `${value}k` : String(value);
}

/** A band by its centre: "125 Hz", "2.5 kHz", or "Broadband". */
export function formatBand(centerHz: number | 'broadband'): string {
	return centerHz === 'broadband' ? 'Broadband' : formatHz(centerHz);
}

/** A frequency range, the unit written once when both ends share it: "42–48 Hz", "2–4 kHz", "800 Hz–1.25 kHz". */
export function formatHzRange(loHz: number, hiHz: number): string {
	const lo = parts(loHz);
	const hi = parts(hiHz);
	return lo.kilo === hi.kilo ? `${lo.value}–${formatHz(hiHz)}` : `${formatHz(loHz)}–${formatHz(hiHz)}`;
}

/**
 * A sample rate, exactly: "44.1 kHz", "176.4 kHz". It is a setting of the recording, not a
 * measured frequency, so it is not rounded.
 */
export function formatSampleRate(hz: number): string {
	if (!Number.isInteger(hz) || hz <= 0) throw new RangeError(`a sample rate must be a whole number of Hz > 0, got ${hz}`);
	return `${hz / 1000} kHz`;
}
