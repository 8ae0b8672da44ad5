// A thin layer over the pdfkit document: fonts by role (with text made safe for standard
// fonts), colours, and the flow of content down the page with page breaks. Characters the
// role's face lacks (Greek, Cyrillic, Hebrew, CJK names and notes) are set in runs of a shipped
// face that holds them (`script-fonts.ts`).
import type { FontRole, ReportFonts } from './fonts';
import { monoCovers, scriptFaceFor, scriptFontBytes, type ScriptFace } from './script-fonts';
import { standardFontShows, toWinAnsi } from './win-ansi';
import { CONTENT_WIDTH, PAGE } from './theme';

/** A stretch of text in one face. */
interface Run {
	text: string;
	font: string;
	rtl: boolean;
}

/**
 * Right-to-left runs in display order: a stretch of RTL runs (with the spaces between them) is
 * drawn in reverse order; within a run, fontkit's layout already sets an RTL script's glyphs
 * right to left. Enough for names and notes in Hebrew (a simplification of the Unicode
 * Bidirectional Algorithm, UAX #9, without nesting or numbers).
 */
function displayOrder(runs: Run[]): Run[] {
	const out: Run[] = [];
	for (let i = 0; i < runs.length; ) {
		if (!runs[i].rtl) {
			out.push(runs[i++]);
			continue;
		}
		let j = i;
		while (j + 1 < runs.length) {
			let k = j + 1;
			while (k < runs.length && !runs[k].rtl && /^\s+$/.test(runs[k].text)) k++;
			if (k < runs.length && runs[k].rtl) j = k;
			else break;
		}
		for (let m = j; m >= i; m--) out.push(runs[m]);
		i = j + 1;
	}
	return out;
}

export class ReportPen {
	private role: FontRole = 'prose';
	private size = 12;

	constructor(
		readonly doc: PDFKit.PDFDocument,
		private readonly fonts: ReportFonts
	) {}

	get left(): number {
		return PAGE.marginLeft;
	}

	get width(): number {
		return CONTENT_WIDTH;
	}

	get y(): number {
		return this.doc.y;
	}

	set y(value: number) {
		this.doc.y = value;
	}

	/** Lowest y content may reach on a page. */
	get bottom(): number {
		return PAGE.height - PAGE.marginBottom;
	}

	use(role: FontRole, size: number, colour: string): this {
		this.role = role;
		this.size = size;
		this.doc.font(this.fonts[role].name).fontSize(size).fillColor(colour);
		return this;
	}

	/** Text in the current face alone; characters the face cannot show are replaced first. */
	safe(text: string): string {
		return this.fonts[this.role].unicode ? text : toWinAnsi(text);
	}

	private registered = new Set<string>();

	private register(face: ScriptFace): void {
		if (this.registered.has(face.name)) return;
		this.doc.registerFont(face.name, scriptFontBytes(face));
		this.registered.add(face.name);
	}

	/** Whether the role's own face shows `char`: a standard face its WinAnsi set, the embedded mono its Latin subset. */
	private covers(char: string): boolean {
		if (char === '\n') return true;
		return this.fonts[this.role].unicode ? monoCovers(char.codePointAt(0) as number) : standardFontShows(char);
	}

	/** The text cut into runs of one face each, in display order. */
	runs(text: string): Run[] {
		const primary = this.fonts[this.role].name;
		const bold = this.role === 'proseBold' || this.role === 'monoBold';
		const runs: Run[] = [];
		for (const char of text.normalize('NFC').replace(/\r\n?/g, '\n')) {
			let run: Run = { text: this.safe(char), font: primary, rtl: false };
			if (!this.covers(char)) {
				const face = scriptFaceFor(char.codePointAt(0) as number, bold);
				if (face) {
					this.register(face);
					run = { text: char, font: face.name, rtl: face.rtl };
				} else if (this.fonts[this.role].unicode) {
					run.text = '?'; // a standard face already took its look-alike or "?"
				}
			}
			const last = runs.at(-1);
			if (last && last.font === run.font) last.text += run.text;
			else runs.push(run);
		}
		return displayOrder(runs);
	}

	private plain(runs: Run[]): boolean {
		return runs.length <= 1 && (runs.length === 0 || runs[0].font === this.fonts[this.role].name);
	}

	/** Draws runs one after another (pdfkit's `continued`), then goes back to the role's face. */
	private drawRuns(runs: Run[], x: number, y: number, options: PDFKit.Mixins.TextOptions): void {
		const { doc } = this;
		let at = x;
		let rest = options;
		if (options.lineBreak === false && options.align && options.align !== 'left' && options.width !== undefined) {
			// One line: place the whole line, since pdfkit would align each run on its own.
			const spare = options.width - this.widthOfRuns(runs);
			at = x + (options.align === 'center' ? spare / 2 : options.align === 'right' ? spare : 0);
			rest = { ...options, align: 'left', width: undefined };
		}
		// Every run on the role's baseline (a number is the baseline's offset above y, negated).
		doc.font(this.fonts[this.role].name);
		const baseline = -this.ascent();
		runs.forEach((run, i) => {
			doc.font(run.font);
			const continued = i < runs.length - 1;
			if (i === 0) doc.text(run.text, at, y, { ...rest, baseline, continued });
			else doc.text(run.text, { baseline, continued });
		});
		doc.font(this.fonts[this.role].name);
	}

	private widthOfRuns(runs: Run[]): number {
		let width = 0;
		for (const run of runs) width += this.doc.font(run.font).widthOfString(run.text);
		this.doc.font(this.fonts[this.role].name);
		return width;
	}

	text(text: string, x: number, y: number, options: PDFKit.Mixins.TextOptions = {}): this {
		const runs = this.runs(text);
		if (this.plain(runs)) this.doc.text(runs[0]?.text ?? '', x, y, options);
		else this.drawRuns(runs, x, y, options);
		return this;
	}

	/** Text that continues the flow at the left margin (or x) and moves y below it. */
	flow(text: string, options: PDFKit.Mixins.TextOptions & { x?: number } = {}): this {
		const { x = this.left, ...rest } = options;
		return this.text(text, x, this.doc.y, { width: this.width - (x - this.left), ...rest });
	}

	/** Top of a line to its baseline in the current face, so mixed faces can share a baseline. */
	ascent(): number {
		const font = (this.doc as unknown as { _font: { ascender: number } })._font;
		return (font.ascender / 1000) * this.size;
	}

	widthOf(text: string): number {
		const runs = this.runs(text);
		return this.plain(runs) ? this.doc.widthOfString(runs[0]?.text ?? '') : this.widthOfRuns(runs);
	}

	/** Height of the text wrapped to `width`; with several faces, the tallest of setting it all in each (never too short). */
	heightOf(text: string, width: number, options: PDFKit.Mixins.TextOptions = {}): number {
		const runs = this.runs(text);
		if (this.plain(runs)) return this.doc.heightOfString(runs[0]?.text ?? '', { width, ...options });
		const whole = runs.map((r) => r.text).join('');
		let height = 0;
		for (const font of new Set(runs.map((r) => r.font))) height = Math.max(height, this.doc.font(font).heightOfString(whole, { width, ...options }));
		this.doc.font(this.fonts[this.role].name);
		return height;
	}

	/** Starts a new page unless `height` still fits below the current position. */
	ensureSpace(height: number): void {
		if (this.doc.y + height > this.bottom) this.newPage();
	}

	newPage(): void {
		this.doc.addPage();
		this.doc.y = PAGE.marginTop;
	}

	gap(points: number): void {
		this.doc.y += points;
	}
}
