// Changing what a recorded sweep was played with, after its upload: another stored test signal,
// or another reference file uploaded to storage first (announced, PUT, then applied).
import { z } from 'zod';
import { MIN_WAV_BYTES } from './captures';

/** The object key a reference announcement hands out (storage.newObjectKey('references')). */
export const REFERENCE_KEY_PATTERN = /^references\/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\.wav$/;

/** A new reference file about to be uploaded. */
export function referenceUploadSchema(maxBytes: number) {
	return z.object({
		filename: z
			.string({ error: 'Give the file name.' })
			.trim()
			.min(1, { error: 'Give the file name.' })
			.max(255, { error: 'The file name is too long.' })
			.refine((n) => /\.wave?$/i.test(n), { error: 'The reference must be a WAV file (.wav).' }),
		sizeBytes: z
			.number({ error: 'Give the file size in bytes.' })
			.int()
			.min(MIN_WAV_BYTES, { error: 'The file is too small to be a WAV recording.' })
			.max(maxBytes, { error: `The file is larger than the ${Math.round(maxBytes / 1024 / 1024)} MB limit.` })
	});
}

/** The change itself: a stored test signal, or the reference file uploaded under the key handed out. */
export const changeReferenceSchema = z
	.object({
		sweepDefinitionId: z.number({ error: 'Pick a test signal.' }).int().positive({ error: 'Pick a test signal.' }).optional(),
		referenceKey: z.string().regex(REFERENCE_KEY_PATTERN, { error: 'Upload the reference file first, then apply it.' }).optional()
	})
	.refine((v) => (v.sweepDefinitionId === undefined) !== (v.referenceKey === undefined), {
		path: ['sweepDefinitionId'],
		error: 'Pick a test signal, or upload a reference file — one of the two.'
	});
export type ChangeReferenceInput = z.infer<typeof changeReferenceSchema>;
