// The played sweep of a recorded sweep, changed after its upload: read it, announce another
// reference file, apply a test signal or that file.
import { z } from 'zod';
import { CAPTURE_KINDS } from '../../../schemas/captures';
import { changeReferenceSchema, referenceUploadSchema } from '../../../schemas/capture-reference';
import { CAPTURE_STATUSES } from '../../../captures/status';
import type { ApiOperation, DescriptionLimits } from '../registry';
import { captureEnvelopeSchema } from '../shapes';

const route = '/api/captures/[captureId=id]/reference';

const referenceChoicesSchema = z
	.object({
		kind: z.enum(CAPTURE_KINDS),
		status: z.enum(CAPTURE_STATUSES),
		recordingS: z.number().nullable().meta({ description: 'The recording\'s length from its header, once uploaded.' }),
		current: z
			.discriminatedUnion('kind', [
				z.object({ kind: z.literal('signal'), sweepDefinitionId: z.number().int(), name: z.string(), durationS: z.number() }),
				z.object({ kind: z.literal('uploaded') }),
				z.object({ kind: z.literal('none') })
			])
			.meta({ description: 'A test signal of the practice, a reference file uploaded with the recording, or nothing (an impulse response).' }),
		sweeps: z.array(z.object({ id: z.number().int(), name: z.string(), durationS: z.number() })).meta({ description: 'Test signals to choose from; empty for a role that may not change it.' }),
		canChange: z.boolean()
	})
	.meta({ id: 'CaptureReference' });

const referenceAnnouncedSchema = z
	.object({
		referenceKey: z.string().meta({ description: 'Send it back as referenceKey once the file is stored.' }),
		upload: z.object({ url: z.url(), method: z.literal('PUT'), headers: z.record(z.string(), z.string()) })
	})
	.meta({ id: 'ReferenceAnnounced' });

export function captureReferenceOperations(limits: DescriptionLimits): ApiOperation[] {
	return [
		{
			method: 'get',
			route,
			resource: 'Captures',
			operationId: 'getCaptureReference',
			summary: 'What a recorded sweep was played with',
			description: 'The test signal or uploaded reference file its analysis deconvolves with, and — for a role that may change it — the test signals of the practice to choose from.',
			access: 'project:internal',
			responses: { 200: { description: 'The played sweep and the choices.', content: { 'application/json': { schema: referenceChoicesSchema } } } }
		},
		{
			method: 'post',
			route,
			resource: 'Captures',
			operationId: 'announceCaptureReference',
			summary: 'Announce another reference file for a recorded sweep',
			description: 'Answers a presigned PUT under a new key. Nothing changes until the key is applied with PUT on this path; a file never applied is swept after a day.',
			access: 'capture:write',
			body: { content: { 'application/json': referenceUploadSchema(limits.uploadMaxBytes).meta({ id: 'ReferenceUpload' }) } },
			responses: { 201: { description: 'Where to PUT the file.', content: { 'application/json': { schema: referenceAnnouncedSchema } } } },
			errors: {
				400: 'The body is not JSON (code not_json).',
				409: 'The capture is still being uploaded or analysed (code capture_busy).',
				422: 'A field is not valid, or the capture is an impulse response (code not_a_sweep).'
			}
		},
		{
			method: 'put',
			route,
			resource: 'Captures',
			operationId: 'changeCaptureReference',
			summary: 'Change the played sweep of a recorded sweep, and analyse it again',
			description:
				'Give another test signal of the practice (sweepDefinitionId) or the key of a reference file announced and uploaded (referenceKey). The capture is queued for analysis; a replaced reference file is deleted. The duplicate rule holds: a visit keeps one capture per file, channel and reference.',
			access: 'capture:write',
			body: { content: { 'application/json': changeReferenceSchema.meta({ id: 'ReferenceChange' }) } },
			responses: { 202: { description: 'The capture, queued again.', content: { 'application/json': { schema: captureEnvelopeSchema } } } },
			errors: {
				400: 'The body is not JSON (code not_json).',
				409: 'The capture is still being uploaded or analysed (code capture_busy), the file belongs to another capture, the reference file has not arrived (code not_uploaded), or the change would repeat another capture of the visit (code duplicate, duplicateOf).',
				422: 'Not a test signal of the practice, already the one used (code unchanged), the recording is shorter than that signal (code sweep_mismatch), the reference is not a readable WAV, or the capture is an impulse response (code not_a_sweep).'
			}
		}
	];
}
