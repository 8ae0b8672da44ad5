import { beforeAll, describe, expect, it } from 'vitest';
import { renderReportPdf } from '../../../src/lib/server/reports/pdf';
import { typicalComparison, typicalProblemBands, typicalReport } from './helpers/comparison-factory';
import { inspectPdf, normaliseSpace, requirePoppler, type InspectedPdf } from './helpers/poppler';

// Names and notes in Greek, Cyrillic, Hebrew, Chinese and Japanese are printed in the shipped
// Noto faces, subset into the file, and read back by an independent reader (poppler's pdftotext)
// as the same characters — not "?".
const GREEK = 'Δωμάτιο Συναυλιών'; // Δ is a letter: set in the Greek face, not as the look-alike "delta"
const CYRILLIC = 'Студия звукозаписи';
const HEBREW = 'אולפן הקלטות';
const CHINESE = '录音室混音';
const JAPANESE = 'ろくおんスタジオ';
const POLISH = 'Łódź — Żółć';

describe('a report with names and notes beyond Latin', () => {
	let pdf: InspectedPdf;
	let text: string;

	beforeAll(async () => {
		requirePoppler();
		const comparison = typicalComparison();
		comparison.room.name = `${GREEK} 2`;
		const bands = typicalProblemBands();
		bands[0].note = `${CYRILLIC}: флаттер-эхо между стенами.`;
		bands[1].note = `${CHINESE}，${JAPANESE}。`;
		pdf = inspectPdf(
			await renderReportPdf(
				typicalReport({ comparison, problemBands: bands, clientName: HEBREW, projectName: POLISH, advice: `${GREEK}. ${CYRILLIC}. ${CHINESE}.\n\nLatin text stays in Helvetica.` })
			),
			{ rasterise: true }
		);
		text = normaliseSpace(pdf.text);
	}, 60_000);

	it('is read without complaint by poppler', () => {
		expect(pdf.warnings).toBe('');
		expect(pdf.pagePngs.length).toBeGreaterThanOrEqual(2);
	});

	it.each([
		['Greek', GREEK],
		['Cyrillic', CYRILLIC],
		['Chinese', CHINESE],
		['Japanese kana', JAPANESE],
		['Polish (Latin Extended-A)', POLISH]
	])('prints %s text that extracts back as the same characters', (_, sample) => {
		expect(text).toContain(sample);
	});

	it('prints Hebrew right to left, its letters extracted back (none as "?")', () => {
		// pdftotext gives glyphs in the order drawn; a right-to-left word is drawn reversed.
		const letters = (s: string) => [...s].filter((c) => c !== ' ').sort().join('');
		const hebrewRun = [...text.matchAll(/[\u0590-\u05ff][\u0590-\u05ff ]*[\u0590-\u05ff]/g)].map((m) => m[0]);
		expect(hebrewRun.map(letters)).toContain(letters(HEBREW));
		// Drawn right to left, each word reads back whole: poppler gives the words either as drawn or
		// in reading order, but a word's letters stay together in one order or the other.
		const reverse = (s: string) => [...s].reverse().join('');
		const words = HEBREW.split(' ');
		const forms = [HEBREW, reverse(HEBREW), words.map(reverse).join(' '), [...words].reverse().join(' ')];
		expect(hebrewRun.some((run) => forms.includes(run)), JSON.stringify(hebrewRun)).toBe(true);
	});

	it('prints no "?" in place of a character', () => {
		// The report's own text has no question marks; any would be a character the fonts lacked.
		expect(text).not.toContain('?');
	});

	it('embeds subsets of the Noto faces, beside the standard and mono fonts', () => {
		for (const family of ['NotoSans-', 'NotoSansHebrew', 'NotoSansSC']) {
			const lines = pdf.fonts.split('\n').filter((line) => line.includes(family));
			expect(lines.length, `${family} in\n${pdf.fonts}`).toBeGreaterThan(0);
			// pdffonts: a subset's name has a six-letter tag, "ABCDEF+Name", and "yes" under emb and sub.
			expect(lines.every((line) => /^[A-Z]{6}\+/.test(line) && /\byes\s+yes\s+yes\b/.test(line)), lines.join('\n')).toBe(true);
		}
		expect(pdf.fonts).toContain('Helvetica');
	});

	it('stays small: only the glyphs used are embedded', () => {
		// The Noto Sans SC subsets alone are several MB; a subset of a dozen glyphs is a few kB.
		expect(pdf.bytes.length).toBeLessThan(400_000);
	});
});
