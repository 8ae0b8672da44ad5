// Wording of the report: verdicts, dates, paragraphs. Numbers are written by $lib/format.
import { MISSING } from '../../format';
import type { BandVerdict } from '../../analysis/targets';

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

/** The consultant's text as paragraphs: split at blank lines, single line breaks kept. */
export function splitParagraphs(text: string): string[] {
	return text
		.replace(/\r\n?/g, '\n')
		.split(/\n[ \t]*\n/)
		.map((paragraph) => paragraph.trim())
		.filter((paragraph) => paragraph.length > 0);
}
