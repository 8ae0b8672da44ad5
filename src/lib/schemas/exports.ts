import { z } from 'zod';

export const EXPORT_FORMATS = ['csv', 'json'] as const;

/** The query of an export route: `?format=csv` (the default) or `?format=json`. */
export const exportQuerySchema = z.object({
	format: z.enum(EXPORT_FORMATS, { error: 'Ask for format=csv or format=json.' }).default('csv').meta({ description: 'csv (RFC 4180, UTF-8) or json.' })
});

/** The cut list's query: its format, and the unit of the CSV's extra columns. */
export const cutListQuerySchema = exportQuerySchema.extend({
	units: z
		.enum(['mm', 'in'])
		.optional()
		.meta({ description: 'in adds inch columns to the CSV; without it (or with another value) the user\'s own unit preference decides.' })
});
