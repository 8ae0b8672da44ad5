// A thin layer over the pdfkit document: fonts by role (with text made safe for standard
// fonts), colours, and the flow of content down the page with page breaks.
import type { FontRole, ReportFonts } from './fonts';
import { toWinAnsi } from './win-ansi';
import { CONTENT_WIDTH, PAGE } from './theme';

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

	/** Text in the current face; characters the face cannot show are replaced first. */
	safe(text: string): string {
		return this.fonts[this.role].unicode ? text : toWinAnsi(text);
	}

	text(text: string, x: number, y: number, options: PDFKit.Mixins.TextOptions = {}): this {
		this.doc.text(this.safe(text), x, y, options);
		return this;
	}

	/** Text that continues the flow at the left margin (or x) and moves y below it. */
	flow(text: string, options: PDFKit.Mixins.TextOptions & { x?: number } = {}): this {
		const { x = this.left, ...rest } = options;
		this.doc.text(this.safe(text), x, this.doc.y, { width: this.width - (x - this.left), ...rest });
		return this;
	}

	/** Top of a line to its baseline in the current face, so mixed faces can share a baseline. */
	ascent(): number {
		const font = (this.doc as unknown as { _font: { ascender: number } })._font;
		return (font.ascender / 1000) * this.size;
	}

	widthOf(text: string): number {
		return this.doc.widthOfString(this.safe(text));
	}

	heightOf(text: string, width: number, options: PDFKit.Mixins.TextOptions = {}): number {
		return this.doc.heightOfString(this.safe(text), { width, ...options });
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
