// Lists, ranges and capitals in sentences and tables.

/** "a", "a and b", "a, b and c". */
export function formatList(items: readonly string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/** Two ends written the same way, joined by an en dash: formatRange(0.2, 0.3, formatSeconds) → "0.20–0.30". */
export function formatRange(lo: number, hi: number, format: (value: number) => string): string {
	return `${format(lo)}–${format(hi)}`;
}

/** "within target" → "Within target". */
export function capitalise(text: string): string {
	return text.length === 0 ? text : text[0].toUpperCase() + text.slice(1);
}
