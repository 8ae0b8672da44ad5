import { z } from 'zod';

/** A remark on the conditions of one capture ("door open", "HVAC on"), kept short. */
export const CAPTURE_NOTE_MAX = 500;

/** The note form: empty clears the note; line ends are kept as `\n`. */
export const captureNoteSchema = z.object({
	note: z
		.string({ error: 'Write the note, or leave it empty to clear it.' })
		.transform((v) => v.replace(/\r\n?/g, '\n').trim())
		.pipe(z.string().max(CAPTURE_NOTE_MAX, { error: `Keep the note under ${CAPTURE_NOTE_MAX} characters.` }))
		.transform((v) => (v === '' ? null : v))
});
export type CaptureNoteInput = z.infer<typeof captureNoteSchema>;
