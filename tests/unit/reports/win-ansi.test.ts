import { describe, expect, it } from 'vitest';
import { toWinAnsi } from '../../../src/lib/server/reports/win-ansi';

describe('toWinAnsi', () => {
	// Kept: ASCII, Latin-1 (0xA0–0xFF) and the Windows-1252 additions in 0x80–0x9F
	// (WinAnsiEncoding, ISO 32000-1:2008 Annex D.2).
	const kept = ['T30 = 0.42 s (63 Hz)', 'Zürich façade, 57.6 m³, 5 × 4 m, ±0.05 s, 90°', '42–48 Hz — flutter … “quoted” ‘single’ • € ‰ ™'];
	it.each(kept)('keeps %s', (text) => {
		expect(toWinAnsi(text)).toBe(text);
	});

	// Replaced: characters WinAnsi has no code for.
	const replaced: [string, string][] = [
		['\u22123 dB', '-3 dB'], // minus sign U+2212
		['T ≈ 0.3 s', 'T ~ 0.3 s'],
		['α ≥ 0.8, ≤ 1', '? >= 0.8, <= 1'],
		['before → after', 'before -> after'],
		['ΔT30', 'delta T30'],
		['100\u202fHz', '100 Hz'],
		['Ω', '?'],
		['😀', '?'] // one code point outside the BMP is one "?", not two
	];
	it.each(replaced)('maps %s to %s', (text, expected) => {
		expect(toWinAnsi(text)).toBe(expected);
	});

	it('composes decomposed accents first (Unicode NFC) so they stay in Latin-1', () => {
		expect(toWinAnsi('e\u0301')).toBe('é');
	});

	it('keeps line breaks as \\n and turns tabs into spaces', () => {
		expect(toWinAnsi('a\r\nb\rc\td')).toBe('a\nb\nc d');
	});
});
