// Wording and number formats of the report: values, changes, ranges, dates, verdicts.
import { formatNumber, MISSING } from '../../charts/format';
import { bandName, frequencyLabel } from '../../charts/ticks';
import type { BandVerdict } from '../../analysis/targets';

export { MISSING };

/** Fixed decimals with an explicit "+" for a rise, "—" for a missing value: "+0.12", "−0.32", "0.00". */
export function formatSigned(value: number | null, decimals: number): string {
	const text = formatNumber(value, decimals);
	return value !== null && Number.isFinite(value) && Number(value.toFixed(decimals)) > 0 ? `+${text}` : text;
}

/** Target tolerance as "0.20–0.25". */
export function formatTargetRange(lowerS: number, upperS: number): string {
	return `${formatNumber(lowerS, 2)}–${formatNumber(upperS, 2)}`;
}

/** "42–48 Hz", "2–4 kHz", "800 Hz–1.2 kHz". */
export function formatFrequencyRange(loHz: number, hiHz: number): string {
	const lo = bandName(loHz);
	const hi = bandName(hiHz);
	const loUnit = lo.split(' ')[1];
	const hiUnit = hi.split(' ')[1];
	return loUnit === hiUnit ? `${frequencyLabel(loHz).replace(/k$/, '')}–${hi}` : `${lo}–${hi}`;
}

/** "20–120 ms", "from 35 ms", "up to 80 ms", or "—" without a time range. */
export function formatTimeRange(loMs: number | null, hiMs: number | null): string {
	if (loMs === null && hiMs === null) return MISSING;
	if (hiMs === null) return `from ${formatNumber(loMs, 0)} ms`;
	if (loMs === null) return `up to ${formatNumber(hiMs, 0)} ms`;
	return `${formatNumber(loMs, 0)}–${formatNumber(hiMs, 0)} ms`;
}

const VERDICT_WORDS: Record<BandVerdict['verdict'], string> = {
	inside: 'within target',
	above: 'above target',
	below: 'below target',
	unknown: 'not measured'
};

export function verdictWords(verdict: BandVerdict['verdict'] | null): string {
	return verdict === null ? MISSING : VERDICT_WORDS[verdict];
}

/** "3 March 2025", read in UTC so the date does not move with the server's zone. */
export function formatPublishedDate(date: Date): string {
	return date.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
}

export function capitalise(word: string): string {
	return word.length === 0 ? word : word[0].toUpperCase() + word.slice(1);
}

/** The consultant's text as paragraphs: split at blank lines, single line breaks kept. */
export function splitParagraphs(text: string): string[] {
	return text
		.replace(/\r\n?/g, '\n')
		.split(/\n[ \t]*\n/)
		.map((paragraph) => paragraph.trim())
		.filter((paragraph) => paragraph.length > 0);
}
