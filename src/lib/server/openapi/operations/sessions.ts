// Visits (sessions in the paths): their captures, the two ways to upload, and their averages.
import { captureUploadFormSchema, createCaptureSchema } from '../../../schemas/captures';
import { exportQuerySchema } from '../../../schemas/exports';
import { bandsQuerySchema, responsesQuerySchema } from '../../../schemas/results';
import type { ApiOperation, DescriptionLimits } from '../registry';
import {
	binary,
	captureEnvelopeSchema,
	createdCaptureSchema,
	ifNoneMatch,
	queuedSchema,
	sessionAverageExportSchema,
	sessionCapturesSchema,
	TAGGED,
	taggedResponses,
	visitBandsSchema,
	visitResponsesSchema
} from '../shapes';

const route = '/api/sessions/[sessionId=id]';

export function sessionOperations(limits: DescriptionLimits): ApiOperation[] {
	return [
		{
			method: 'get',
			route: `${route}/average`,
			resource: 'Visits',
			operationId: 'exportVisitAverage',
			summary: 'A visit\'s spatial average per band, as CSV or JSON',
			description: 'The average over the visit\'s analysed positions per band, with each metric\'s spread, the outlying positions and the averaged response. Sent as a download.',
			access: 'project:internal',
			query: exportQuerySchema,
			responses: {
				200: {
					description: 'The average.',
					content: { 'text/csv': { schema: binary('RFC 4180 CSV, UTF-8.') }, 'application/json': { schema: sessionAverageExportSchema } }
				}
			},
			errors: { 400: 'format is neither csv nor json.' }
		},
		{
			method: 'get',
			route: `${route}/responses`,
			resource: 'Visits',
			operationId: 'getVisitResponses',
			summary: 'A visit\'s responses at one smoothing',
			description: `Each position's frequency response and their power average, 1/N-octave smoothed (what the visit page draws for another smoothing than its first). ${TAGGED}`,
			access: 'project:internal',
			query: responsesQuerySchema,
			headers: ifNoneMatch,
			responses: taggedResponses('The responses.', visitResponsesSchema),
			errors: { 422: 'smoothing is missing or not 1, 3, 6, 12 or 24 (code invalid).' }
		},
		{
			method: 'get',
			route: `${route}/bands`,
			resource: 'Visits',
			operationId: 'getVisitBands',
			summary: 'A visit\'s band tables of one kind',
			description: `Per octave or one-third-octave band: each position's T30, T20, EDT, C80 and C50, their average and their spread with the measurement grade (what the visit page shows when one-third octaves are chosen). ${TAGGED}`,
			access: 'project:internal',
			query: bandsQuerySchema,
			headers: ifNoneMatch,
			responses: taggedResponses('The band tables.', visitBandsSchema),
			errors: { 404: 'No such visit within your reach, or it has no one-third-octave bands.', 422: 'kind is missing or neither octave nor third (code invalid).' }
		},
		{
			method: 'get',
			route: `${route}/captures`,
			resource: 'Visits',
			operationId: 'listVisitCaptures',
			summary: 'A visit\'s captures and their states',
			description: 'Poll it while pending is above 0.',
			access: 'project:internal',
			responses: { 200: { description: 'The captures, by position.', content: { 'application/json': { schema: sessionCapturesSchema } } } }
		},
		{
			method: 'post',
			route: `${route}/captures`,
			resource: 'Visits',
			operationId: 'announceCapture',
			summary: 'Announce a file and get presigned upload URLs',
			description:
				'Step one of a browser upload: the server checks the metadata, creates the capture (awaiting_upload) and answers where to PUT the file (and its reference sweep). Step two is the PUT to the object store with the headers given; step three is confirmCaptureUpload. A file already in the visit (same SHA-256, channel and sweep) is refused.',
			access: 'capture:write',
			body: { content: { 'application/json': createCaptureSchema(limits.uploadMaxBytes).meta({ id: 'CaptureAnnouncement' }) } },
			responses: { 201: { description: 'The capture, and where to upload.', content: { 'application/json': { schema: createdCaptureSchema } } } },
			errors: {
				400: 'The body is not JSON (code not_json).',
				409: 'This file is already in the visit (code duplicate; duplicateOf is the id of that capture).',
				422: 'A field is not valid (code invalid, errors per field), the position belongs to another visit, or the test signal is not of this organization.'
			}
		},
		{
			method: 'post',
			route: `${route}/captures/upload`,
			resource: 'Visits',
			operationId: 'uploadCapture',
			summary: 'Upload a file through the server (scripts)',
			description:
				'One request instead of three: multipart/form-data with the metadata as text fields — best sent before the file parts, so a bad field is refused before the file is read — then the file in file (and optionally the played sweep in reference). The body streams to storage while each file\'s size and SHA-256 are measured (a sha256 field, when given, must match). The checks are those of announceCapture and confirmCaptureUpload, and a refusal leaves nothing stored; the answer is the queued capture. This is the one route that takes a large body.',
			access: 'capture:write',
			body: { content: { 'multipart/form-data': captureUploadFormSchema(limits.uploadMaxBytes).meta({ id: 'CaptureUploadForm' }) } },
			responses: { 201: { description: 'The capture, queued for analysis.', content: { 'application/json': { schema: captureEnvelopeSchema } } } },
			errors: {
				400: 'Not multipart/form-data (code not_multipart), a malformed or cut-off form (codes bad_form, incomplete), a field longer than 4096 bytes, or more than 32 fields.',
				409: 'This file is already in the visit (code duplicate; duplicateOf is the id of that capture).',
				413: `The body is larger than the ${limits.uploadBodyDescription} allowed here (a file and its reference, each up to the upload limit, plus the fields), or a file passes the upload limit as it arrives (code too_large).`,
				422: 'No file part, a file in a part other than file and reference, a field that is not valid (code invalid, errors per field), a sha256 field that is not the file\'s, a file that is not a readable WAV, or no such channel.'
			}
		},
		{
			method: 'post',
			route: `${route}/rerun`,
			resource: 'Visits',
			operationId: 'rerunVisit',
			summary: 'Queue the analysis of every settled capture of a visit again',
			description: 'Captures still uploading or being analysed are skipped.',
			access: 'capture:write',
			responses: { 200: { description: 'How many were queued.', content: { 'application/json': { schema: queuedSchema } } } }
		}
	];
}
