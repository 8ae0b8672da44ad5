import { error } from '@sveltejs/kit';

export type ExportFormat = 'csv' | 'json';

export function exportFormat(url: URL): ExportFormat {
	const f = url.searchParams.get('format') ?? 'csv';
	if (f !== 'csv' && f !== 'json') error(400, 'Ask for format=csv or format=json.');
	return f;
}

const safeName = (s: string) => s.replace(/[^\w.-]+/g, '-').replace(/-+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'export';

/** A download response: CSV as text/csv (RFC 4180, UTF-8), JSON pretty-printed. */
export function download(format: ExportFormat, baseName: string, csv: () => string, json: () => unknown): Response {
	const name = `${safeName(baseName)}.${format}`;
	const body = format === 'csv' ? csv() : JSON.stringify(json(), null, 2);
	return new Response(body, {
		headers: {
			'content-type': format === 'csv' ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8',
			'content-disposition': `attachment; filename="${name}"`
		}
	});
}
