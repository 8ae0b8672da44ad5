// Saving chart numbers as a file in the browser.

/** File name from a chart title: "Decay — 125 Hz" → "decay-125-hz.csv". */
export function csvFileName(title: string): string {
	const slug = title
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '');
	return `${slug || 'chart'}.csv`;
}

/**
 * Offers text as a download through a Blob URL. A UTF-8 byte-order mark goes first so
 * spreadsheet programs read "°", "µ" and labels in other scripts correctly (common practice, no source).
 */
export function downloadText(fileName: string, text: string, mimeType = 'text/csv;charset=utf-8'): void {
	if (typeof document === 'undefined') throw new Error('downloads need a browser');
	const blob = new Blob(['\uFEFF', text], { type: mimeType });
	const url = URL.createObjectURL(blob);
	const link = document.createElement('a');
	link.href = url;
	link.download = fileName;
	link.rel = 'noopener';
	document.body.append(link);
	link.click();
	link.remove();
	// Revoked on the next turn: some browsers start reading the URL only after click() returns.
	setTimeout(() => URL.revokeObjectURL(url), 0);
}
