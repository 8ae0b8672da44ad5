// Small helpers shared by the SVG drawings.

export function escapeXml(text: string): string {
	return text
		.replace(/&/g, '&amp;')
		.replace(/</g, '&lt;')
		.replace(/>/g, '&gt;')
		.replace(/"/g, '&quot;');
}

/** Coordinates rounded to 0.01 px keep the markup short and stable. */
export const px = (v: number): string => (Math.round(v * 100) / 100).toString();

export function rect(x: number, y: number, w: number, h: number, attrs: string): string {
	return `<rect x="${px(x)}" y="${px(y)}" width="${px(w)}" height="${px(h)}" ${attrs}/>`;
}

export function text(x: number, y: number, content: string, attrs: string): string {
	return `<text x="${px(x)}" y="${px(y)}" ${attrs}>${escapeXml(content)}</text>`;
}

export function line(x1: number, y1: number, x2: number, y2: number, attrs: string): string {
	return `<line x1="${px(x1)}" y1="${px(y1)}" x2="${px(x2)}" y2="${px(y2)}" ${attrs}/>`;
}

export const DRAWING_FONT = "font-family=\"'JetBrains Mono', ui-monospace, monospace\"";

export const PALETTE = {
	ink: '#1f2937',
	muted: '#6b7280',
	wood: '#e7dcc8',
	woodEdge: '#8b6f47',
	fill: '#f3f4f6',
	accent: '#0f766e',
	paper: '#ffffff'
} as const;
