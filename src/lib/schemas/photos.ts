import { z } from 'zod';

// Photos of a visit: of the room as a whole or of one position. The browser sends the image
// through the server (multipart form), which re-encodes it, so only these limits reach the store.

/** The largest image taken (a phone's full-size JPEG is 3–12 MB). */
export const PHOTO_MAX_BYTES = 20 * 1024 * 1024;
/** The photo route's body: the image plus its form fields. */
export const PHOTO_BODY_MAX_BYTES = PHOTO_MAX_BYTES + 256 * 1024;
/** Beyond this many pixels an image is refused before it is decoded (a 108 MP phone mode is 12000 × 9000). */
export const PHOTO_MAX_PIXELS = 120_000_000;
/** The long edge of the stored display size and of the thumbnail, in pixels (never enlarged). */
export const PHOTO_DISPLAY_MAX_PX = 2048;
export const PHOTO_THUMB_MAX_PX = 480;
/** What the file picker offers; the server goes by the file's first bytes, not by its name or type. */
export const PHOTO_ACCEPT = 'image/jpeg,image/png,image/webp';
export const PHOTO_TYPES_TEXT = 'JPEG, PNG or WebP';
export const CAPTION_MAX = 300;

const MIB = 1024 * 1024;

const caption = z
	.string()
	.trim()
	.max(CAPTION_MAX, { error: `Keep the caption under ${CAPTION_MAX} characters.` })
	.default('');

const photoId = z.coerce.number({ error: 'Say which photo.' }).int().positive({ error: 'Say which photo.' });

/** Where the form sends the browser back to without JavaScript: the visit page or its photo page. */
const back = z.enum(['visit', 'photos']).default('photos');

/** The photo's position: a position id of the visit, or empty for the room as a whole. */
const photoPosition = z
	.string()
	.trim()
	.regex(/^([1-9]\d{0,9})?$/, { error: 'Pick a position, or the room as a whole.' })
	.optional()
	.transform((v) => (v ? Number(v) : null));

export const addPhotoSchema = z.object({ positionId: photoPosition, caption, back });
export type AddPhotoInput = z.infer<typeof addPhotoSchema>;

export const photoCaptionSchema = z.object({ photoId, caption, back });
export const removePhotoSchema = z.object({ photoId, back });

/** The uploaded file itself, before its bytes are looked at. */
export const photoFileSchema = z
	.instanceof(File, { error: 'Choose a photo to upload.' })
	.refine((f) => f.size > 0, { error: 'Choose a photo to upload: the file is empty.' })
	.refine((f) => f.size <= PHOTO_MAX_BYTES, { error: `The photo is larger than the ${PHOTO_MAX_BYTES / MIB} MB limit.` })
	.refine((f) => f.name.length <= 255, { error: 'The file name is too long.' });

/** Which stored size of a photo to send. */
export const photoSizeQuery = z.object({ size: z.enum(['display', 'thumb']).default('display') });
