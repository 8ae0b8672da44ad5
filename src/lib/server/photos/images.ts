// A photo as it is stored: turned upright by its EXIF orientation, shrunk to a display size and a
// thumbnail, and re-encoded as JPEG without any metadata (no EXIF, so no GPS position, camera
// serial or time; no XMP, no IPTC). sharp (libvips) does the decoding and resizing.
import sharp, { type Metadata, type Sharp, type SharpOptions } from 'sharp';
import { PHOTO_DISPLAY_MAX_PX, PHOTO_MAX_PIXELS, PHOTO_THUMB_MAX_PX, PHOTO_TYPES_TEXT } from '../../schemas/photos';

export type PhotoFormat = 'jpeg' | 'png' | 'webp';

export const PHOTO_CONTENT_TYPES: Record<PhotoFormat, string> = { jpeg: 'image/jpeg', png: 'image/png', webp: 'image/webp' };
/** What is stored: JPEG for both sizes, which every browser and the PDF writer read. */
export const STORED_CONTENT_TYPE = 'image/jpeg';

/** A file that is not an image we take, or one that cannot be read; the message says which. */
export class PhotoImageError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'PhotoImageError';
	}
}

/**
 * The format a file's first bytes say it is (its name and declared type are not trusted):
 * JPEG starts FF D8 FF (ITU-T T.81 Annex B, SOI then a marker), PNG with its 8-byte signature
 * (ISO/IEC 15948 §5.2), WebP as a RIFF container of form type "WEBP" (RFC 9649 §2.5).
 */
export function sniffPhotoFormat(bytes: Uint8Array): PhotoFormat | null {
	const at = (offset: number, ...values: number[]) => values.every((v, i) => bytes[offset + i] === v);
	if (bytes.length >= 3 && at(0, 0xff, 0xd8, 0xff)) return 'jpeg';
	if (bytes.length >= 8 && at(0, 0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a)) return 'png';
	if (bytes.length >= 12 && at(0, 0x52, 0x49, 0x46, 0x46) && at(8, 0x57, 0x45, 0x42, 0x50)) return 'webp';
	return null;
}

export interface Rendition {
	bytes: Uint8Array;
	width: number;
	height: number;
}

export interface PreparedPhoto {
	format: PhotoFormat;
	/** The upright size of the original. */
	width: number;
	height: number;
	display: Rendition;
	thumb: Rendition;
}

const NOT_AN_IMAGE = `This file is not a ${PHOTO_TYPES_TEXT} image. Take or export the photo as one of those and upload it again.`;
const UNREADABLE = 'This image could not be read: the file may be damaged or cut short. Upload it again, or export it anew.';

async function render(source: Sharp, maxPx: number, quality: number): Promise<Rendition> {
	const { data, info } = await source
		.clone()
		.resize({ width: maxPx, height: maxPx, fit: 'inside', withoutEnlargement: true })
		// Transparent parts of a PNG or WebP become white, as they look on the page.
		.flatten({ background: '#ffffff' })
		// No keepMetadata/keepExif: sharp writes none, and converts to sRGB.
		.jpeg({ quality, mozjpeg: true })
		.toBuffer({ resolveWithObject: true });
	return { bytes: new Uint8Array(data.buffer, data.byteOffset, data.byteLength), width: info.width, height: info.height };
}

/** Check an uploaded image and make its two stored sizes; throws `PhotoImageError` with the reason. */
export async function preparePhoto(bytes: Uint8Array): Promise<PreparedPhoto> {
	const format = sniffPhotoFormat(bytes);
	if (!format) throw new PhotoImageError(NOT_AN_IMAGE);
	const options: SharpOptions = { limitInputPixels: PHOTO_MAX_PIXELS, failOn: 'error', autoOrient: true };
	let meta: Metadata;
	try {
		meta = await sharp(bytes, options).metadata();
	} catch {
		throw new PhotoImageError(UNREADABLE);
	}
	// The header must agree with the signature (a PNG signature before other data is no PNG).
	if (meta.format !== format || !meta.width || !meta.height) throw new PhotoImageError(UNREADABLE);
	if (meta.width * meta.height > PHOTO_MAX_PIXELS) {
		throw new PhotoImageError(`This image has ${Math.round((meta.width * meta.height) / 1e6)} megapixels; at most ${PHOTO_MAX_PIXELS / 1e6} are taken. Save it smaller and upload it again.`);
	}
	const source = sharp(bytes, options);
	try {
		const [display, thumb] = await Promise.all([render(source, PHOTO_DISPLAY_MAX_PX, 82), render(source, PHOTO_THUMB_MAX_PX, 75)]);
		// With autoOrient, metadata's autoOrient sizes are the upright ones.
		const upright = meta.autoOrient ?? { width: meta.width, height: meta.height };
		return { format, width: upright.width, height: upright.height, display, thumb };
	} catch {
		throw new PhotoImageError(UNREADABLE);
	}
}
