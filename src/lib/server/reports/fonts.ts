// Fonts of the report: JetBrains Mono (shipped with the app) for numbers, Helvetica for prose.
// pdfkit reads WOFF through fontkit; should the files be missing, Courier stands in for the mono.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { woffToSfnt } from './woff';

export type FontRole = 'prose' | 'proseBold' | 'mono' | 'monoBold';

export interface FontFace {
	/** Name given to pdfkit's `font()`. */
	name: string;
	/** Embedded font with a Unicode map; a standard font takes WinAnsi text only. */
	unicode: boolean;
}

export type ReportFonts = Record<FontRole, FontFace>;

const MONO_FILES = {
	regular: '@fontsource/jetbrains-mono/files/jetbrains-mono-latin-400-normal.woff',
	bold: '@fontsource/jetbrains-mono/files/jetbrains-mono-latin-700-normal.woff'
} as const;

const STANDARD_FACES: ReportFonts = {
	prose: { name: 'Helvetica', unicode: false },
	proseBold: { name: 'Helvetica-Bold', unicode: false },
	mono: { name: 'Courier', unicode: false },
	monoBold: { name: 'Courier-Bold', unicode: false }
};

/** The font files, read and unpacked once per process; null when they cannot be read. */
let monoFiles: { regular: Buffer; bold: Buffer } | null | undefined;

function readMonoFiles(): { regular: Buffer; bold: Buffer } | null {
	if (monoFiles !== undefined) return monoFiles;
	try {
		const require = createRequire(import.meta.url);
		monoFiles = {
			regular: woffToSfnt(readFileSync(require.resolve(MONO_FILES.regular))),
			bold: woffToSfnt(readFileSync(require.resolve(MONO_FILES.bold)))
		};
	} catch {
		monoFiles = null;
	}
	return monoFiles;
}

/** Registers the mono faces with the document and says which faces each role uses. */
export function registerReportFonts(doc: PDFKit.PDFDocument): ReportFonts {
	const files = readMonoFiles();
	if (files === null) return STANDARD_FACES;
	try {
		doc.registerFont('ReportMono', files.regular);
		doc.registerFont('ReportMonoBold', files.bold);
		// Opening the faces here makes an unreadable file fall back now, not mid-page.
		doc.font('ReportMono').font('ReportMonoBold').font(STANDARD_FACES.prose.name);
	} catch {
		return STANDARD_FACES;
	}
	return {
		...STANDARD_FACES,
		mono: { name: 'ReportMono', unicode: true },
		monoBold: { name: 'ReportMonoBold', unicode: true }
	};
}
