import { error } from '@sveltejs/kit';
import { exportQuerySchema, type EXPORT_FORMATS } from '../schemas/exports';

export type ExportFormat = (typeof EXPORT_FORMATS)[number];

/** The `format` an export route was asked for (csv when none); 400 for any other. */
export function exportFormat(url: URL): ExportFormat {
	const parsed = exportQuerySchema.shape.format.safeParse(url.searchParams.get('format') ?? undefined);
	if (!parsed.success) error(400, parsed.error.issues[0].message);
	return parsed.data;
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
