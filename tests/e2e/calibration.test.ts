import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, newPage, seen, signIn } from './browser';
import { encodeWav } from '../../src/lib/analysis';

// The demo's untreated visit was measured through a chain calibrated from a 94 dB calibrator
// recording (scripts/demo/seed-calibration.ts): its levels read in dB SPL, and the page says so.
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

async function openDemoVisit(page: Page): Promise<void> {
	await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
	await page.getByRole('link', { name: 'Attic listening room' }).click();
	await page.waitForURL(/\/rooms\/\d+$/);
	await page.getByRole('link', { name: '2026-10-06' }).click();
	await page.waitForURL(/\/sessions\/\d+$/);
}

describe('a calibrated visit', () => {
	it('shows its calibration and its band levels in dB SPL, and refuses a malformed correction file by line', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await openDemoVisit(page);
		const state = page.getByTestId('calibration-state');
		expect(await seen(state)).toBe(true);
		expect(await state.innerText()).toMatch(/calibrated with a 94\.0 dB calibrator \(tone −28\.0 dBFS, so dB SPL = dBFS \+ 122\.0 dB\)/);

		// Band levels appear once the worker has analysed the demo captures.
		const table = page.getByTestId('band-levels');
		for (let i = 0; i < 30 && !(await seen(table, 1_000)); i++) await page.reload();
		expect(await seen(table)).toBe(true);
		expect(await table.locator('caption').innerText()).toContain('dB SPL');
		expect(await table.locator('thead').textContent()).toContain('Average (dB SPL)');
		expect(await page.getByText('Sound pressure levels in dB SPL from calibrated input chains, averaged as measured.').count()).toBeGreaterThan(0);

		// Normalising for shapes turns the label to relative and names the reference band.
		await page.waitForLoadState('networkidle');
		await page.getByLabel('Normalise to compare shapes').check();
		expect(await seen(page.getByText(/each position set to 0 dB in the 1 kHz band before averaging, for comparing shapes/))).toBe(true);
		expect(await table.locator('thead').textContent()).toContain('Average (dB (relative))');

		await page.getByRole('link', { name: 'Calibrate input chains' }).click();
		await page.waitForURL(/\/sessions\/\d+\/calibration$/);
		await page.waitForLoadState('networkidle');
		expect(await page.getByTestId('chains').innerText()).toContain('dB SPL = dBFS + 122.0 dB');
		await page.getByLabel('Correction file').setInputFiles({ name: 'mic.txt', mimeType: 'text/plain', buffer: Buffer.from('* mic\n20 0.5\n1000 abc\n') });
		await page.getByRole('button', { name: 'Store the correction' }).click();
		expect(await seen(page.getByText(/Line 3 of the correction file/).first())).toBe(true);
		expect(await page.getByTestId('chains').innerText()).not.toContain('mic.txt');

		// The capture page draws the response through the chain too, and says so.
		await page.goBack();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.getByRole('link', { name: 'untreated-P1-ir.wav' }).click();
		await page.waitForURL(/\/captures\/\d+$/);
		expect(await seen(page.getByText('Calibrated input chain: levels in dB SPL.'), 15_000)).toBe(true);
	});

	it('a visit without calibration labels its levels relative', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		// A visit of its own, with nothing calibrated.
		await page.getByRole('button', { name: 'New visit' }).click();
		await page.getByLabel('Condition').fill(`uncalibrated check ${Date.now()}`);
		await page.getByRole('button', { name: 'Create visit' }).click();
		await page.waitForURL(/\/sessions\/\d+$/);
		const state = page.getByTestId('calibration-state');
		expect(await seen(state)).toBe(true);
		expect(await state.innerText()).toContain('Not calibrated');
		expect(await page.getByText('dB SPL').count()).toBe(0);

		// Calibrated from the browser: a 1 kHz sine of amplitude 0.05 (−26.02 dBFS, AES17) from a 94 dB calibrator.
		const x = new Float64Array(5 * 48_000);
		for (let i = 24_000; i < 4.5 * 48_000; i++) x[i] = 0.05 * Math.sin((2 * Math.PI * 1000 * i) / 48_000);
		await page.getByRole('link', { name: 'Calibrate input chains' }).click();
		await page.waitForURL(/\/calibration$/);
		await page.waitForLoadState('networkidle');
		await page.getByLabel('Calibrator recording').setInputFiles({ name: 'cal-94.wav', mimeType: 'audio/wav', buffer: Buffer.from(encodeWav(x, 48_000, 16)) });
		await page.getByRole('button', { name: 'Calibrate', exact: true }).click();
		expect(await seen(page.getByText('Calibrated: dB SPL = dBFS + 120.0 dB.'))).toBe(true);
		expect(await page.getByTestId('chains').innerText()).toContain('dB SPL = dBFS + 120.0 dB');
	});
});
