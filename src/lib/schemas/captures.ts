import { z } from 'zod';

export const CAPTURE_KINDS = ['impulse', 'sweep'] as const;
export const WAV_CONTENT_TYPES = ['audio/wav', 'audio/x-wav', 'audio/wave', 'audio/vnd.wave'] as const;
/** The smallest possible WAV file: a 44-byte header and one sample. */
export const MIN_WAV_BYTES = 46;

const filename = z
	.string({ error: 'Give the file name.' })
	.trim()
	.min(1, { error: 'Give the file name.' })
	.max(255, { error: 'The file name is too long.' })
	.refine((n) => /\.wave?$/i.test(n), { error: 'Only WAV files (.wav) can be analysed.' });

const sizeBytes = (max: number) =>
	z
		.number({ error: 'Give the file size in bytes.' })
		.int()
		.min(MIN_WAV_BYTES, { error: 'The file is too small to be a WAV recording.' })
		.max(max, { error: `The file is larger than the ${Math.round(max / 1024 / 1024)} MB limit.` });

const positionLabel = z.string().trim().min(1).max(80);

/** What the browser (or a script) says about a file before uploading it. */
export function createCaptureSchema(maxBytes: number) {
	return z
		.object({
			filename,
			sizeBytes: sizeBytes(maxBytes),
			sha256: z.string().regex(/^[0-9a-f]{64}$/, { error: 'The SHA-256 must be 64 lowercase hex digits.' }),
			kind: z.enum(CAPTURE_KINDS, { error: 'Say whether the file is an impulse response or a recorded sweep.' }),
			positionId: z.number().int().positive().optional(),
			newPositionLabel: positionLabel.optional(),
			channel: z.number().int().min(0, { error: 'Channels count from 0.' }).max(7, { error: 'At most 8 channels (0–7).' }).default(0),
			sweepDefinitionId: z.number().int().positive().optional(),
			reference: z.object({ filename, sizeBytes: sizeBytes(maxBytes) }).optional()
		})
		.refine((v) => (v.positionId === undefined) !== (v.newPositionLabel === undefined), {
			path: ['positionId'],
			error: 'Pick a position or name a new one.'
		})
		.refine((v) => v.kind === 'impulse' || v.sweepDefinitionId !== undefined || v.reference !== undefined, {
			path: ['sweepDefinitionId'],
			error: 'A recorded sweep needs the sweep that was played: pick a test signal or upload its reference.'
		})
		.refine((v) => !(v.sweepDefinitionId !== undefined && v.reference !== undefined), {
			path: ['reference'],
			error: 'Give either a test signal or a reference file, not both.'
		})
		.refine((v) => v.kind === 'sweep' || (v.sweepDefinitionId === undefined && v.reference === undefined), {
			path: ['kind'],
			error: 'An impulse response needs no reference sweep.'
		});
}
export type CreateCaptureInput = z.infer<ReturnType<typeof createCaptureSchema>>;

/**
 * The multipart form of an upload through the server, as the API description shows it: the file
 * (and the played sweep) as parts, and the metadata fields of `createCaptureSchema` as text, from
 * which the route builds the announcement and checks it with that schema. The size is the
 * file's own, and the file name and SHA-256 are taken from the file when not given.
 */
export function captureUploadFormSchema(maxBytes: number) {
	const fields = createCaptureSchema(maxBytes).shape;
	return z.object({
		file: z.file().meta({ description: 'The WAV recording or impulse response.' }),
		reference: z.file().optional().meta({ description: 'The sweep that was played, for a recorded sweep without a stored test signal.' }),
		filename: fields.filename.optional().meta({ description: 'Defaults to the name of the file part.' }),
		sha256: fields.sha256.optional().meta({ description: 'Computed by the server when not given.' }),
		kind: fields.kind,
		positionId: fields.positionId,
		newPositionLabel: fields.newPositionLabel,
		channel: fields.channel,
		sweepDefinitionId: fields.sweepDefinitionId
	});
}

export const updateCaptureSchema = z
	.object({
		positionId: z.number().int().positive().optional(),
		newPositionLabel: positionLabel.optional(),
		filename: filename.optional()
	})
	.refine((v) => !(v.positionId !== undefined && v.newPositionLabel !== undefined), { path: ['positionId'], error: 'Pick a position or name a new one, not both.' })
	.refine((v) => v.positionId !== undefined || v.newPositionLabel !== undefined || v.filename !== undefined, { error: 'Nothing to change.' });

// The test signal an acoustician plays. Limits: the audible range, rates the engine reads,
// and lengths long enough for a clean low end yet short enough to stay patient (common practice, no source).
export const sweepDefinitionSchema = z
	.object({
		name: z.string().trim().min(1, { error: 'Name the test signal.' }).max(120),
		sampleRate: z.coerce.number().int().refine((v) => [44100, 48000, 88200, 96000, 176400, 192000].includes(v), { error: 'Pick 44.1, 48, 88.2, 96, 176.4 or 192 kHz.' }),
		f1Hz: z.coerce.number().min(10, { error: 'Start at 10 Hz or above.' }).max(1000, { error: 'Start at 1 kHz or below.' }),
		f2Hz: z.coerce.number().min(1000, { error: 'End at 1 kHz or above.' }),
		durationS: z.coerce.number().min(1, { error: 'At least 1 s.' }).max(30, { error: 'At most 30 s.' }),
		levelDbfs: z.coerce.number().min(-40, { error: 'No quieter than −40 dBFS.' }).max(-1, { error: 'Leave at least 1 dB of headroom (−1 dBFS or lower).' }),
		fadeS: z.coerce.number().min(0.005, { error: 'Fade at least 5 ms.' }).max(0.5, { error: 'Fade at most 0.5 s.' }).default(0.05),
		silenceS: z.coerce.number().min(0.5, { error: 'Leave at least 0.5 s of silence for the decay.' }).max(10).default(2),
		bitDepth: z.enum(['16', '24', '32f']).default('24')
	})
	.refine((v) => v.f2Hz <= v.sampleRate / 2, { path: ['f2Hz'], error: 'The end frequency must be below half the sample rate.' })
	.refine((v) => v.f2Hz / v.f1Hz >= 8, { path: ['f2Hz'], error: 'Sweep at least three octaves.' });
