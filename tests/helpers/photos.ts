// Test images made with sharp from plain colours: a camera-like JPEG with EXIF (make, model, GPS
// position, orientation), and readers of what metadata a JPEG file still carries.
import sharp from 'sharp';
import ExifReader from 'exifreader';

/** Somewhere in Stockholm, as a camera writes it (degrees, minutes, seconds as rationals). */
export const GPS = { GPSLatitudeRef: 'N', GPSLatitude: '59/1 19/1 30/1', GPSLongitudeRef: 'E', GPSLongitude: '18/1 4/1 15/1' };

/**
 * A photo as a phone stores it: left half red, right half blue, `width` × `height` pixels as
 * stored, with EXIF naming the camera and the GPS position, and the EXIF orientation given
 * (6: the picture is to be turned 90° clockwise to be seen upright).
 */
export async function cameraPhoto(o: { width: number; height: number; orientation?: number; format?: 'jpeg' | 'png' | 'webp' }): Promise<Uint8Array> {
	const half = Math.floor(o.width / 2);
	const blue = await sharp({ create: { width: o.width - half, height: o.height, channels: 3, background: '#0000ff' } }).png().toBuffer();
	let img = sharp({ create: { width: o.width, height: o.height, channels: 3, background: '#ff0000' } })
		.composite([{ input: blue, left: half, top: 0 }])
		.withExif({ IFD0: { Make: 'Testcam', Model: 'Field unit 7', Software: 'fw 1.2' }, IFD3: GPS });
	if (o.orientation) img = img.withMetadata({ orientation: o.orientation });
	const format = o.format ?? 'jpeg';
	const out = format === 'png' ? img.png() : format === 'webp' ? img.webp() : img.jpeg({ quality: 90 });
	return new Uint8Array(await out.toBuffer());
}

/** The EXIF, GPS, XMP and IPTC tags a file carries, as an independent reader sees them. */
export function metadataTags(bytes: Uint8Array): Record<string, unknown> {
	const tags = ExifReader.load(Buffer.from(bytes), { expanded: true }) as Record<string, unknown>;
	return { exif: tags.exif, gps: tags.gps, xmp: tags.xmp, iptc: tags.iptc };
}

/**
 * The segments of a JPEG before its image data (ITU-T T.81 Annex B: FF, a marker byte, a 2-byte
 * length), with the identifier an application segment starts with: APP1 "Exif" holds EXIF (and
 * GPS), APP1 "http://ns.adobe.com/xap/1.0/" XMP, APP13 "Photoshop 3.0" IPTC, APP2 ICC profiles.
 */
export function jpegSegments(bytes: Uint8Array): { marker: string; id: string }[] {
	if (bytes[0] !== 0xff || bytes[1] !== 0xd8) throw new Error('not a JPEG');
	const out: { marker: string; id: string }[] = [];
	let i = 2;
	while (i + 4 <= bytes.length && bytes[i] === 0xff) {
		const marker = bytes[i + 1];
		if (marker === 0xda || marker === 0xd9) break; // start of scan: the image data follows
		const length = (bytes[i + 2] << 8) | bytes[i + 3];
		const payload = bytes.subarray(i + 4, Math.min(i + 2 + length, i + 4 + 32));
		const id = String.fromCharCode(...payload).split('\0')[0];
		out.push({ marker: `FF${marker.toString(16).toUpperCase()}`, id });
		i += 2 + length;
	}
	return out;
}

/** The colour of one pixel of an image, as 0–255 RGB. */
export async function pixel(bytes: Uint8Array, x: number, y: number): Promise<[number, number, number]> {
	const { data, info } = await sharp(bytes).removeAlpha().raw().toBuffer({ resolveWithObject: true });
	const at = (y * info.width + x) * info.channels;
	return [data[at], data[at + 1], data[at + 2]];
}
