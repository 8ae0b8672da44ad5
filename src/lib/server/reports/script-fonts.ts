// Faces for text beyond the report's own fonts — names and notes in Greek, Cyrillic, Hebrew,
// Chinese or Japanese. Noto Sans, Noto Sans Hebrew and Noto Sans SC ship with the app (fontsource
// packages, split into subsets by Unicode range); the subset that holds a character is read when
// a report first needs it, and pdfkit embeds only the glyphs used (a subset font per face).
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { woffToSfnt } from './woff';

interface Family {
	pkg: string;
	prefix: string;
	/** Right-to-left script: its runs are laid out in reverse (pdfkit draws left to right). */
	rtl?: boolean;
	/** Subsets taken from this family; every subset when absent. */
	only?: readonly string[];
}

/** First family holding a character wins. */
const FAMILIES: readonly Family[] = [
	{ pkg: '@fontsource/noto-sans', prefix: 'noto-sans', only: ['latin', 'latin-ext', 'greek', 'greek-ext', 'cyrillic', 'cyrillic-ext', 'vietnamese'] },
	{ pkg: '@fontsource/noto-sans-hebrew', prefix: 'noto-sans-hebrew', rtl: true, only: ['hebrew'] },
	{ pkg: '@fontsource/noto-sans-sc', prefix: 'noto-sans-sc' }
];

export interface ScriptFace {
	/** Name given to pdfkit's `registerFont()` and `font()`. */
	name: string;
	/** Path of the WOFF file. */
	file: string;
	rtl: boolean;
}

interface Subset {
	family: Family;
	key: string;
	ranges: [number, number][];
}

/** "U+0370-0377,U+038C" → [[0x370, 0x377], [0x38c, 0x38c]]. */
export function parseUnicodeRanges(text: string): [number, number][] {
	return text.split(',').map((part) => {
		const [lo, hi] = part.trim().replace(/^U\+/i, '').split('-');
		return [parseInt(lo, 16), parseInt(hi ?? lo, 16)];
	});
}

const inRanges = (ranges: readonly [number, number][], cp: number) => ranges.some(([lo, hi]) => cp >= lo && cp <= hi);

const require = createRequire(import.meta.url);
let subsets: Subset[] | null | undefined;

function loadSubsets(): Subset[] | null {
	if (subsets !== undefined) return subsets;
	try {
		subsets = FAMILIES.flatMap((family) => {
			const table = JSON.parse(readFileSync(require.resolve(`${family.pkg}/unicode.json`), 'utf8')) as Record<string, string>;
			return Object.entries(table)
				.filter(([key]) => !family.only || family.only.includes(key))
				.map(([key, ranges]) => ({ family, key, ranges: parseUnicodeRanges(ranges) }));
		});
	} catch {
		subsets = null; // packages missing: text falls back to "?" as before
	}
	return subsets;
}

/** The shipped face that holds `codePoint`, regular or bold; null when none does. */
export function scriptFaceFor(codePoint: number, bold: boolean): ScriptFace | null {
	const subset = loadSubsets()?.find((s) => inRanges(s.ranges, codePoint));
	if (!subset) return null;
	const key = subset.key.replace(/^\[(\d+)\]$/, '$1');
	const weight = bold ? 700 : 400;
	return {
		name: `${subset.family.prefix}-${key}-${weight}`,
		file: `${subset.family.pkg}/files/${subset.family.prefix}-${key}-${weight}-normal.woff`,
		rtl: subset.family.rtl === true
	};
}

const fontBytes = new Map<string, Buffer>();

/** The face's font as sfnt, read once per process. */
export function scriptFontBytes(face: ScriptFace): Buffer {
	let bytes = fontBytes.get(face.file);
	if (!bytes) {
		bytes = woffToSfnt(readFileSync(require.resolve(face.file)));
		fontBytes.set(face.file, bytes);
	}
	return bytes;
}

/** The characters JetBrains Mono's shipped (Latin) subset holds. */
let monoRanges: [number, number][] | undefined;
export function monoCovers(codePoint: number): boolean {
	monoRanges ??= parseUnicodeRanges((JSON.parse(readFileSync(require.resolve('@fontsource/jetbrains-mono/unicode.json'), 'utf8')) as Record<string, string>).latin);
	return inRanges(monoRanges, codePoint);
}
