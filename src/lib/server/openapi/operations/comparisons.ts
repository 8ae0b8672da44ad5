// Comparisons of two visits of a room, their exports and their printed report.
import { exportQuerySchema } from '../../../schemas/exports';
import { bandsQuerySchema, responsesQuerySchema } from '../../../schemas/results';
import type { ApiOperation } from '../registry';
import { binary, comparisonBandsSchema, comparisonExportSchema, comparisonResponsesSchema, comparisonSchema, ifNoneMatch, TAGGED, taggedResponses } from '../shapes';

const route = '/api/comparisons/[comparisonId=id]';
const CLIENTS = 'Clients reach only published comparisons of their own projects; a draft answers them 404.';

export const comparisonOperations: ApiOperation[] = [
	{
		method: 'get',
		route,
		resource: 'Comparisons',
		operationId: 'getComparison',
		summary: 'A comparison with its model',
		description: `Both visits' averages and position curves, the differences per band, the target, the verdicts and the summary, with the room's problem bands. ${CLIENTS}`,
		access: 'project:read',
		responses: { 200: { description: 'The comparison.', content: { 'application/json': { schema: comparisonSchema } } } },
		errors: { 404: `No such comparison within your reach. ${CLIENTS}` }
	},
	{
		method: 'get',
		route: `${route}/export`,
		resource: 'Comparisons',
		operationId: 'exportComparison',
		summary: 'A comparison band by band, as CSV or JSON',
		description: `Before, after and difference per band and metric, with the target and verdicts. Sent as a download. ${CLIENTS}`,
		access: 'project:read',
		query: exportQuerySchema,
		responses: {
			200: {
				description: 'The comparison.',
				content: { 'text/csv': { schema: binary('RFC 4180 CSV, UTF-8.') }, 'application/json': { schema: comparisonExportSchema } }
			}
		},
		errors: { 400: 'format is neither csv nor json.', 404: `No such comparison within your reach. ${CLIENTS}` }
	},
	{
		method: 'get',
		route: `${route}/responses`,
		resource: 'Comparisons',
		operationId: 'getComparisonResponses',
		summary: 'The averaged responses before and after, at one smoothing',
		description: `Each visit's power-averaged frequency response, 1/N-octave smoothed (what the comparison and report pages draw for another smoothing than their first). ${TAGGED} ${CLIENTS}`,
		access: 'project:read',
		query: responsesQuerySchema,
		headers: ifNoneMatch,
		responses: taggedResponses('The responses.', comparisonResponsesSchema),
		errors: { 404: `No such comparison within your reach. ${CLIENTS}`, 422: 'smoothing is missing or not 1, 3, 6, 12 or 24 (code invalid).' }
	},
	{
		method: 'get',
		route: `${route}/bands`,
		resource: 'Comparisons',
		operationId: 'getComparisonBands',
		summary: 'The band-by-band comparison of one kind',
		description: `Per octave or one-third-octave band: each metric before, after and its change, judged against the spread of the positions and the JND (what the pages show when one-third octaves are chosen). ${TAGGED} ${CLIENTS}`,
		access: 'project:read',
		query: bandsQuerySchema,
		headers: ifNoneMatch,
		responses: taggedResponses('The band tables.', comparisonBandsSchema),
		errors: {
			404: `No such comparison within your reach, or a visit has no one-third-octave bands. ${CLIENTS}`,
			422: 'kind is missing or neither octave nor third (code invalid).'
		}
	},
	{
		method: 'get',
		route: `${route}/report.pdf`,
		resource: 'Comparisons',
		operationId: 'downloadComparisonReport',
		summary: 'The report as a PDF',
		description: `Rendered on the server from what the report page shows (A4). ${CLIENTS}`,
		access: 'project:read',
		responses: { 200: { description: 'The report.', content: { 'application/pdf': { schema: binary('A PDF document.') } } } },
		errors: { 404: `No such comparison within your reach. ${CLIENTS}` }
	}
];
