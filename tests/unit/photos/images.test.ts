import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { preparePhoto, PhotoImageError, sniffPhotoFormat } from '../../../src/lib/server/photos/images';
import { PHOTO_DISPLAY_MAX_PX, PHOTO_THUMB_MAX_PX } from '../../../src/lib/schemas/photos';
import { cameraPhoto, jpegSegments, metadataTags, pixel } from '../../helpers/photos';

const bytes = (...b: (number | string)[]) => new Uint8Array(b.flatMap((x) => (typeof x === 'string' ? [...x].map((c) => c.charCodeAt(0)) : [x])));

describe('sniffPhotoFormat', () => {
	// Signatures: JPEG SOI + marker (ITU-T T.81 Annex B), PNG (ISO/IEC 15948 §5.2), WebP's RIFF form type (RFC 9649 §2.5).
	it.each([
		['jpeg', bytes(0xff, 0xd8, 0xff, 0xe0, 0, 16)],
		['png', bytes(0x89, 'PNG', 0x0d, 0x0a, 0x1a, 0x0a, 0, 0)],
		['webp', bytes('RIFF', 0x10, 0, 0, 0, 'WEBPVP8 ')]
	])('knows %s by its first bytes', (format, b) => {
		expect(sniffPhotoFormat(b)).toBe(format);
	});
	it.each([
		['a GIF', bytes('GIF89a', 1, 0, 1, 0)],
		['a WAV (RIFF of another form)', bytes('RIFF', 0x10, 0, 0, 0, 'WAVEfmt ')],
		['text named .jpg', bytes('not a photo at all')],
		['a PNG signature cut short', bytes(0x89, 'PNG', 0x0d, 0x0a)],
		['nothing', bytes()]
	])('refuses %s', (_, b) => {
		expect(sniffPhotoFormat(b)).toBeNull();
	});
});

describe('preparePhoto', () => {
	it('turns the photo upright, shrinks it to the display and thumbnail sizes and keeps no metadata', async () => {
		// Stored 3000 × 2400 with orientation 6: upright it is 2400 wide, 3000 high.
		const original = await cameraPhoto({ width: 3000, height: 2400, orientation: 6 });
		const before = metadataTags(original);
		expect(before.gps).toMatchObject({ Latitude: expect.closeTo(59.325, 3) });
		expect(jpegSegments(original).some((s) => s.id === 'Exif')).toBe(true);

		const p = await preparePhoto(original);
		expect(p).toMatchObject({ format: 'jpeg', width: 2400, height: 3000 });
		// Long edge to the limit, the aspect kept: 2400 × 3000 → 1638 × 2048 and 384 × 480.
		expect([p.display.width, p.display.height]).toEqual([1638, PHOTO_DISPLAY_MAX_PX]);
		expect([p.thumb.width, p.thumb.height]).toEqual([384, PHOTO_THUMB_MAX_PX]);
		for (const r of [p.display, p.thumb]) {
			const meta = await sharp(r.bytes).metadata();
			expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', r.width, r.height]);
			expect(meta.exif).toBeUndefined();
			expect(meta.orientation).toBeUndefined();
			// No application segment at all: EXIF, GPS, XMP (APP1) and IPTC (APP13) are gone.
			expect(jpegSegments(r.bytes).filter((s) => /^FFE[1-9A-F]$/.test(s.marker))).toEqual([]);
			expect(metadataTags(r.bytes)).toEqual({ exif: undefined, gps: undefined, xmp: undefined, iptc: undefined });
			// Turned 90° clockwise: the left (red) half of the stored picture is now on top.
			const [top, bottom] = [await pixel(r.bytes, 5, 5), await pixel(r.bytes, 5, r.height - 5)];
			expect(top[0]).toBeGreaterThan(200);
			expect(top[2]).toBeLessThan(60);
			expect(bottom[2]).toBeGreaterThan(200);
			expect(bottom[0]).toBeLessThan(60);
		}
	});

	it('never enlarges a small picture, and puts transparent parts of a PNG on white', async () => {
		const png = new Uint8Array(await sharp({ create: { width: 300, height: 200, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } }).png().toBuffer());
		const p = await preparePhoto(png);
		expect(p.format).toBe('png');
		expect([p.display.width, p.display.height, p.thumb.width, p.thumb.height]).toEqual([300, 200, 300, 200]);
		const white = await pixel(p.display.bytes, 150, 100);
		for (const c of white) expect(c).toBeGreaterThan(250);
	});

	it('takes WebP, and a landscape photo is bounded by its width', async () => {
		const webp = await cameraPhoto({ width: 3000, height: 1000, format: 'webp' });
		const p = await preparePhoto(webp);
		expect(p.format).toBe('webp');
		expect([p.display.width, p.display.height]).toEqual([2048, 683]);
		expect([p.thumb.width, p.thumb.height]).toEqual([480, 160]);
		expect(jpegSegments(p.display.bytes).filter((s) => s.marker === 'FFE1')).toEqual([]);
	});

	it.each([
		['text with a .jpg name', bytes('hello, this is not an image'), /not a JPEG, PNG or WebP image/],
		['a GIF', bytes('GIF89a', 1, 0, 1, 0, 0, 0, 0), /not a JPEG, PNG or WebP image/],
		['a JPEG start followed by noise', bytes(0xff, 0xd8, 0xff, 0xe0, ...new Array(200).fill(7)), /could not be read/],
		['a PNG signature followed by noise', bytes(0x89, 'PNG', 0x0d, 0x0a, 0x1a, 0x0a, ...new Array(200).fill(3)), /could not be read/]
	])('refuses %s with the reason', async (_, b, reason) => {
		const refusal = await preparePhoto(b).catch((e) => e);
		expect(refusal).toBeInstanceOf(PhotoImageError);
		expect((refusal as Error).message).toMatch(reason);
	});

	it('refuses a JPEG cut short in its image data', async () => {
		const whole = await cameraPhoto({ width: 800, height: 600 });
		const refusal = await preparePhoto(whole.subarray(0, Math.floor(whole.length * 0.6))).catch((e) => e);
		expect(refusal).toBeInstanceOf(PhotoImageError);
		expect((refusal as Error).message).toMatch(/could not be read/);
	});
});
