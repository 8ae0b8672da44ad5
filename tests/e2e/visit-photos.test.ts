import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { launch, newPage, seen, signIn } from './browser';
import { cameraPhoto } from '../helpers/photos';

// Visit records in the browser: a photo of a position is uploaded, seen in the grid and at its
// display size (upright, as the phone meant it), captioned anew and removed; a capture gets a
// note that stays after a reload and shows on its own page. Neither fits wider than a phone.
const FIXTURES = join(import.meta.dirname, '../../fixtures');
const SHOTS = process.env.SCREENSHOT_DIR ?? '';
const PHONE = { width: 390, height: 844 };
let browser: Browser;
/** The visit the acoustician made, which the client then reads. */
let visitUrl = '';
beforeAll(async () => {
	browser = await launch();
	if (SHOTS) mkdirSync(SHOTS, { recursive: true });
});
afterAll(async () => browser?.close());

const pageWidth = (page: Page) => page.evaluate(() => Math.max(document.documentElement.scrollWidth, document.body.scrollWidth));
/** An image's decoded size once it has loaded (0 × 0 if it could not be fetched). */
const naturalSize = (page: Page, selector: string) =>
	page.locator(selector).first().evaluate(async (img: HTMLImageElement) => {
		if (!img.complete) await new Promise((r) => img.addEventListener('load', r, { once: true }));
		return [img.naturalWidth, img.naturalHeight];
	});

describe('visit records', () => {
	it('acoustician: adds a photo of a position, sees it, recaptions and removes it; writes a capture note', async () => {
		const page = await newPage(browser);
		page.on('dialog', (d) => void d.accept());
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		await page.waitForLoadState('networkidle');
		await page.getByRole('button', { name: 'New visit' }).click();
		await page.getByLabel('Condition').fill(`photos ${Date.now()}`);
		await page.getByRole('button', { name: 'Create visit' }).click();
		await page.waitForURL(/\/sessions\/\d+$/);
		visitUrl = new URL(page.url()).pathname;
		await page.waitForLoadState('networkidle');
		await page.getByRole('button', { name: 'New position' }).click();
		await page.getByLabel('Label', { exact: true }).fill('P1');
		await page.getByRole('button', { name: 'Add position' }).click();
		await page.getByTestId('position').filter({ hasText: 'P1' }).waitFor();

		// A phone photo stored on its side (EXIF orientation 6): 1200 × 900 as stored, 900 × 1200 upright.
		const photos = page.getByTestId('visit-photos');
		const form = page.getByRole('form', { name: 'Add a photo' });
		await form.getByLabel('Photo', { exact: true }).setInputFiles({ name: 'IMG_2041.jpg', mimeType: 'image/jpeg', buffer: Buffer.from(await cameraPhoto({ width: 1200, height: 900, orientation: 6 })) });
		await form.getByLabel('Of').selectOption({ label: 'Position P1' });
		await form.getByLabel('Caption').fill('Loudspeaker and microphone at P1');
		await form.getByRole('button', { name: 'Add photo' }).click();

		const figure = photos.getByTestId('photo').filter({ hasText: 'Loudspeaker and microphone at P1' });
		await figure.waitFor();
		expect(await photos.getByRole('heading', { name: /Position P1/ }).count()).toBe(1);
		// The thumbnail comes through the app's own route, upright: 360 × 480.
		expect(await naturalSize(page, '[data-testid="photo"] img')).toEqual([360, 480]);
		// The form is ready for the next photo.
		expect(await form.getByLabel('Caption').inputValue()).toBe('');

		if (SHOTS) await page.screenshot({ path: `${SHOTS}/visit-photos-1280.png`, fullPage: true });

		// The larger view, upright at its display size.
		await figure.getByRole('link').click();
		const viewer = page.getByRole('dialog');
		await viewer.waitFor();
		expect(await naturalSize(page, '[data-testid="photo-large"]')).toEqual([900, 1200]);
		expect(await viewer.getByTestId('photo-large-caption').innerText()).toBe('Loudspeaker and microphone at P1');
		if (SHOTS) await page.screenshot({ path: `${SHOTS}/visit-photo-viewer-1280.png` });

		// A new caption, shown in the grid too.
		await viewer.getByLabel('Caption').fill('Loudspeaker on its stand, microphone at P1 ear height');
		await viewer.getByRole('button', { name: 'Save caption' }).click();
		await viewer.getByRole('status').getByText('Saved.').waitFor();
		await photos.getByTestId('photo').filter({ hasText: 'microphone at P1 ear height' }).waitFor();
		await viewer.getByRole('button', { name: 'Close' }).click();
		await viewer.waitFor({ state: 'hidden' });

		// A capture, and its note.
		await page.getByLabel('Choose WAV files').setInputFiles([join(FIXTURES, 'decay-t0.5-48k.wav')]);
		await page.getByRole('button', { name: 'Upload 1 file' }).click();
		const row = page.getByTestId('capture-row').filter({ hasText: 'decay-t0.5-48k.wav' });
		await row.waitFor({ timeout: 30_000 });
		await row.getByRole('button', { name: 'Add a note on decay-t0.5-48k.wav' }).click();
		await row.getByLabel('Note on decay-t0.5-48k.wav').fill('Door open, HVAC on');
		await row.getByRole('button', { name: 'Save note' }).click();
		await row.getByTestId('capture-note').getByText('Door open, HVAC on').waitFor();
		if (SHOTS) await page.screenshot({ path: `${SHOTS}/visit-note-1280.png`, fullPage: true });

		// At phone width the visit page, its photo grid and notes included, stays within the screen.
		await page.setViewportSize(PHONE);
		await page.waitForTimeout(300);
		expect(await pageWidth(page)).toBeLessThanOrEqual(PHONE.width);
		if (SHOTS) await page.screenshot({ path: `${SHOTS}/visit-photos-390.png`, fullPage: true });
		await page.setViewportSize({ width: 1280, height: 900 });

		// Stored, not only drawn: after a reload the note is there, and on the capture's own page.
		await page.reload();
		await page.waitForLoadState('networkidle');
		await row.getByTestId('capture-note').getByText('Door open, HVAC on').waitFor();
		await row.getByRole('link', { name: 'decay-t0.5-48k.wav' }).click();
		await page.waitForURL(/\/captures\/\d+$/);
		expect(await seen(page.getByTestId('capture-note').getByText('Door open, HVAC on'))).toBe(true);
		if (SHOTS) await page.screenshot({ path: `${SHOTS}/capture-note-1280.png` });
		await page.goBack();
		await page.waitForLoadState('networkidle');

		// A second photo, of the room as a whole (a PNG this time).
		await form.getByLabel('Photo', { exact: true }).setInputFiles({ name: 'room.png', mimeType: 'image/png', buffer: Buffer.from(await cameraPhoto({ width: 800, height: 600, format: 'png' })) });
		await form.getByLabel('Caption').fill('The room from the door');
		await form.getByRole('button', { name: 'Add photo' }).click();
		await photos.getByRole('heading', { name: /The room and visit/ }).waitFor();
		expect(await photos.getByTestId('photo').count()).toBe(2);

		// Removed: gone from the grid, and its image no longer served.
		const first = photos.getByTestId('photo').filter({ hasText: 'microphone at P1 ear height' });
		const src = (await first.locator('img').getAttribute('src'))!;
		await first.getByRole('link').click();
		await page.getByRole('dialog').getByRole('button', { name: 'Remove photo' }).click();
		await first.waitFor({ state: 'detached' });
		expect(await page.getByRole('dialog').isVisible()).toBe(false);
		expect(await photos.getByTestId('photo').count()).toBe(1);
		expect(await photos.getByRole('heading', { name: /Position P1/ }).count()).toBe(0);
		expect((await page.request.get(src)).status()).toBe(404);
	});

	it('client: sees the photos of a visit of their room, and cannot change them', async () => {
		expect(visitUrl).not.toBe('');
		const page = await newPage(browser, PHONE);
		await signIn(page, 'client@fenwick-hale.test');
		await page.goto(visitUrl);
		await page.waitForLoadState('networkidle');
		const photos = page.getByTestId('visit-photos');
		const figure = photos.getByTestId('photo').filter({ hasText: 'The room from the door' });
		await figure.waitFor();
		expect(await naturalSize(page, '[data-testid="photo"] img')).toEqual([480, 360]);
		expect(await page.getByRole('form', { name: 'Add a photo' }).count()).toBe(0);
		await figure.getByRole('link').click();
		const viewer = page.getByRole('dialog');
		await viewer.waitFor();
		expect(await naturalSize(page, '[data-testid="photo-large"]')).toEqual([800, 600]);
		expect(await viewer.getByRole('button', { name: 'Remove photo' }).count()).toBe(0);
		expect(await viewer.getByLabel('Caption').count()).toBe(0);
		if (SHOTS) await page.screenshot({ path: `${SHOTS}/visit-photo-viewer-client-390.png` });
		await viewer.getByRole('button', { name: 'Close' }).click();
		expect(await pageWidth(page)).toBeLessThanOrEqual(PHONE.width);
		if (SHOTS) await page.screenshot({ path: `${SHOTS}/visit-photos-client-390.png`, fullPage: true });

		// The demo's untreated visit comes with its photos: the room from the door and the main seat.
		await page.goto('/projects');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		await page.getByRole('link', { name: '2026-10-06' }).first().click();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.waitForLoadState('networkidle');
		const demo = page.getByTestId('visit-photos');
		await demo.getByTestId('photo').filter({ hasText: 'The room from the door, before treatment' }).waitFor();
		expect(await demo.getByTestId('photo').filter({ hasText: 'Microphone at the main seat' }).count()).toBe(1);
		expect(await pageWidth(page)).toBeLessThanOrEqual(PHONE.width);
		if (SHOTS) {
			await page.setViewportSize({ width: 1280, height: 900 });
			await demo.scrollIntoViewIfNeeded();
			await page.screenshot({ path: `${SHOTS}/demo-visit-client-1280.png`, fullPage: true });
		}
	});
});
