// The PDF standard fonts (Helvetica, Courier) are set in WinAnsiEncoding (ISO 32000-1 Annex D):
// characters outside it print as garbage, so text for them is mapped to the nearest look-alike.

/** The code points WinAnsiEncoding places in 0x80–0x9F (Windows-1252), ISO 32000-1 Annex D.2. */
const WIN_ANSI_HIGH = new Set(
	[0x20ac, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021, 0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0x017d,
		0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x02dc, 0x2122, 0x0161, 0x203a, 0x0153, 0x017e, 0x0178]
);

/** Look-alikes for characters product text uses that WinAnsi lacks. */
const LOOK_ALIKES: Record<string, string> = {
	'\u2212': '-', // minus sign
	'\u2010': '-',
	'\u2011': '-',
	'\u2012': '-',
	'\u2248': '~',
	'\u2264': '<=',
	'\u2265': '>=',
	'\u2192': '->',
	'\u2190': '<-',
	'\u0394': 'delta ',
	'\u2032': "'",
	'\u2033': '"',
	'\u2009': ' ',
	'\u200a': ' ',
	'\u202f': ' ',
	'\u2007': ' ',
	'\t': ' '
};

function isWinAnsi(codePoint: number): boolean {
	return codePoint === 0x0a || (codePoint >= 0x20 && codePoint <= 0x7e) || (codePoint >= 0xa0 && codePoint <= 0xff) || WIN_ANSI_HIGH.has(codePoint);
}

/** Text that a standard font can show: look-alikes where known, "?" for anything else. */
export function toWinAnsi(text: string): string {
	let out = '';
	for (const char of text.normalize('NFC').replace(/\r\n?/g, '\n')) {
		const codePoint = char.codePointAt(0) as number;
		if (isWinAnsi(codePoint)) out += char;
		else out += LOOK_ALIKES[char] ?? '?';
	}
	return out;
}

/**
 * Whether a standard font shows `char` as itself, or a symbol by its look-alike. A letter it
 * lacks (Δ in a Greek name) is not shown: it is better set in a face that has it.
 */
export function standardFontShows(char: string): boolean {
	return isWinAnsi(char.codePointAt(0) as number) || (char in LOOK_ALIKES && !/\p{L}/u.test(char));
}
