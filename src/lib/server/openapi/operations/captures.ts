// Captures: one recording of a visit, from its announcement to its analysis.
import { z } from 'zod';
import { updateCaptureSchema } from '../../../schemas/captures';
import { exportQuerySchema } from '../../../schemas/exports';
import type { ApiOperation } from '../registry';
import { binary, captureBandsExportSchema, captureEnvelopeSchema, queuedSchema, storedAnalysisSchema } from '../shapes';

const route = '/api/captures/[captureId=id]';

export const captureOperations: ApiOperation[] = [
	{
		method: 'get',
		route,
		resource: 'Captures',
		operationId: 'getCapture',
		summary: 'A capture\'s state',
		description: 'Its state, and once analysed its headline numbers and quality notes. Poll it after an upload until the status is analysed or failed.',
		access: 'project:internal',
		responses: { 200: { description: 'The capture.', content: { 'application/json': { schema: captureEnvelopeSchema } } } }
	},
	{
		method: 'patch',
		route,
		resource: 'Captures',
		operationId: 'updateCapture',
		summary: 'Rename a capture or move it to another position',
		description: 'Give a new file label, or move the capture to another position of its visit (positionId) or to a new one (newPositionLabel), not both.',
		access: 'capture:write',
		body: { content: { 'application/json': updateCaptureSchema.meta({ id: 'CaptureChange' }) } },
		responses: { 200: { description: 'The capture as changed.', content: { 'application/json': { schema: captureEnvelopeSchema } } } },
		errors: {
			400: 'The body is not JSON (code not_json).',
			422: 'A field is not valid (code invalid, errors per field), nothing to change, or the position belongs to another visit (errors.positionId).'
		}
	},
	{
		method: 'delete',
		route,
		resource: 'Captures',
		operationId: 'deleteCapture',
		summary: 'Delete a capture',
		description:
			'Removes its objects from storage, then its analysis, jobs and row; the deletion is audited. A capture whose file never arrived can be taken back this way: a new position its announcement made goes with it, unless another capture or a person\'s edit has kept it.',
		access: 'capture:write',
		responses: { 204: { description: 'Deleted.' } }
	},
	{
		method: 'get',
		route: `${route}/analysis`,
		resource: 'Captures',
		operationId: 'getCaptureAnalysis',
		summary: 'A capture\'s whole stored result',
		description:
			'Metrics per band and broadband, quality notes and the chart curves. The answer carries an entity tag (ETag, Cache-Control: private, no-cache): send it back as If-None-Match and an unchanged result is answered 304 without a body. It changes only when the capture is analysed again.',
		access: 'project:internal',
		headers: z.object({ 'if-none-match': z.string().optional().meta({ description: 'The ETag of a result already held.' }) }),
		responses: {
			200: {
				description: 'The stored analysis.',
				headers: z.object({ etag: z.string().meta({ description: 'Entity tag of this result.' }) }),
				content: { 'application/json': { schema: storedAnalysisSchema } }
			},
			304: { description: 'Unchanged since the entity tag sent in If-None-Match.' }
		},
		errors: { 404: 'No such capture within your reach, or it has no analysis yet ("This capture has no analysis yet.").' }
	},
	{
		method: 'get',
		route: `${route}/download`,
		resource: 'Captures',
		operationId: 'downloadCapture',
		summary: 'The original file',
		description: 'Redirects to a presigned link of the object store, valid for 5 minutes, that downloads the file under its own name.',
		access: 'project:internal',
		responses: {
			302: { description: 'Found: follow Location to download.', headers: z.object({ location: z.url().meta({ description: 'The presigned download link.' }) }) }
		}
	},
	{
		method: 'get',
		route: `${route}/export`,
		resource: 'Captures',
		operationId: 'exportCaptureBands',
		summary: 'A capture\'s values per band, as CSV or JSON',
		description: 'One row per octave band and one for broadband: EDT, T20, T30, C50, C80, D50, Ts, INR, curvature, and whether a band is biased by its filter. Sent as a download (Content-Disposition: attachment).',
		access: 'project:internal',
		query: exportQuerySchema,
		responses: {
			200: {
				description: 'The band values.',
				content: { 'text/csv': { schema: binary('RFC 4180 CSV, UTF-8, one header row.') }, 'application/json': { schema: captureBandsExportSchema } }
			}
		},
		errors: {
			400: 'format is neither csv nor json.',
			404: 'No such capture within your reach, or it has no analysis yet.',
			409: 'The capture could not be analysed, so it has no band values (code capture_failed).'
		}
	},
	{
		method: 'post',
		route: `${route}/rerun`,
		resource: 'Captures',
		operationId: 'rerunCapture',
		summary: 'Queue a capture\'s analysis again',
		description: 'For a settled capture (analysed or failed), e.g. after an engine update.',
		access: 'capture:write',
		responses: { 202: { description: 'Queued.', content: { 'application/json': { schema: queuedSchema } } } },
		errors: { 409: 'The capture is still being uploaded or analysed (code conflict, queued: 0).' }
	},
	{
		method: 'post',
		route: `${route}/uploaded`,
		resource: 'Captures',
		operationId: 'confirmCaptureUpload',
		summary: 'Confirm a presigned upload',
		description:
			'Say the PUT to the presigned URL is done: the server checks the stored object (present, of the announced size, a WAV it can read, the chosen channel exists) and queues the analysis. Calling it again for a capture already confirmed answers the capture as it is. A file that is refused for good (wrong size, not a WAV, no such channel) is removed with its capture.',
		access: 'capture:write',
		responses: { 200: { description: 'The capture, now queued.', content: { 'application/json': { schema: captureEnvelopeSchema } } } },
		errors: {
			409: 'The file has not arrived in storage yet (code not_uploaded): PUT it, then confirm again.',
			413: 'The stored file is larger than the upload limit; the capture is removed.',
			422: 'The stored file is not the size announced, is not a readable WAV, or has no such channel; the capture is removed.'
		}
	}
];
