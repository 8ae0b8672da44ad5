// Footer on every page: "Ringdown report — <room> — page N of M", written once all pages exist.
import type { ReportPen } from './pen';
import { COLOURS, PAGE, TYPE } from './theme';

export function footerText(roomName: string, pageNumber: number, pageCount: number): string {
	return `Ringdown report — ${roomName} — page ${pageNumber} of ${pageCount}`;
}

/** Needs a document made with `bufferPages: true`. */
export function stampFooters(pen: ReportPen, roomName: string): void {
	const { doc } = pen;
	const range = doc.bufferedPageRange();
	for (let index = range.start; index < range.start + range.count; index++) {
		doc.switchToPage(index);
		// Text in the bottom margin would otherwise make pdfkit start a page for it.
		const margin = doc.page.margins.bottom;
		doc.page.margins.bottom = 0;
		const ruleY = PAGE.footerY - 6;
		doc.save().moveTo(pen.left, ruleY).lineTo(pen.left + pen.width, ruleY).lineWidth(0.5).stroke(COLOURS.rule).restore();
		pen
			.use('prose', TYPE.footer, COLOURS.inkFaint)
			.text(footerText(roomName, index - range.start + 1, range.count), pen.left, PAGE.footerY, { width: pen.width, align: 'left', lineBreak: false });
		doc.page.margins.bottom = margin;
	}
}
