// Reading rendered PDFs back with Debian's poppler-utils, an independent PDF reader.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const POPPLER_TOOLS = ['/usr/bin/pdftotext', '/usr/bin/pdfinfo', '/usr/bin/pdffonts', '/usr/bin/pdftoppm'] as const;

/** Fails with a message that says what to install. */
export function requirePoppler(): void {
	const missing = POPPLER_TOOLS.filter((tool) => !existsSync(tool));
	if (missing.length > 0) {
		throw new Error(`${missing.join(', ')} not found: the report tests read PDFs with Debian's poppler-utils (apt-get install poppler-utils)`);
	}
}

function run(tool: string, args: string[]): { stdout: string; stderr: string } {
	const result = spawnSync(tool, args, { encoding: 'utf8', maxBuffer: 32 * 1024 * 1024 });
	if (result.error) throw result.error;
	if (result.status !== 0) throw new Error(`${tool} ${args.join(' ')} exited ${result.status}: ${result.stderr}`);
	return { stdout: result.stdout, stderr: result.stderr };
}

export interface InspectedPdf {
	bytes: Uint8Array;
	/** pdfinfo's fields, e.g. Title, Author, Pages, "Page size". */
	info: Record<string, string>;
	/** pdftotext in reading order. */
	text: string;
	/** pdftotext -layout: table rows stay on one line. */
	layoutText: string;
	/** pdffonts' table. */
	fonts: string;
	/** Everything the tools wrote to stderr (poppler reports damaged files there). */
	warnings: string;
	/** PNG files of the pages from pdftoppm. */
	pagePngs: Uint8Array[];
}

export function inspectPdf(bytes: Uint8Array, options: { rasterise?: boolean } = {}): InspectedPdf {
	const dir = mkdtempSync(join(tmpdir(), 'ringdown-report-'));
	try {
		const file = join(dir, 'report.pdf');
		writeFileSync(file, bytes);
		const info = run('/usr/bin/pdfinfo', ['-enc', 'UTF-8', file]);
		const text = run('/usr/bin/pdftotext', ['-enc', 'UTF-8', file, '-']);
		const layout = run('/usr/bin/pdftotext', ['-enc', 'UTF-8', '-layout', file, '-']);
		const fonts = run('/usr/bin/pdffonts', [file]);
		let warnings = info.stderr + text.stderr + layout.stderr + fonts.stderr;
		const pagePngs: Uint8Array[] = [];
		if (options.rasterise) {
			const png = run('/usr/bin/pdftoppm', ['-png', '-r', '60', file, join(dir, 'page')]);
			warnings += png.stderr;
			for (const name of readdirSync(dir).filter((n) => n.endsWith('.png')).sort()) pagePngs.push(readFileSync(join(dir, name)));
		}
		const fields: Record<string, string> = {};
		for (const line of info.stdout.split('\n')) {
			const match = /^([^:]+):\s*(.*)$/.exec(line);
			if (match) fields[match[1].trim()] = match[2].trim();
		}
		return { bytes, info: fields, text: text.stdout, layoutText: layout.stdout, fonts: fonts.stdout, warnings, pagePngs };
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

/** Runs of white space as one space, so wrapped lines read as the sentence they are. */
export function normaliseSpace(text: string): string {
	return text.replace(/\s+/g, ' ').trim();
}
