import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { join } from 'node:path';
import { launch, newPage, seen, signIn } from './browser';
import { waitForMail } from '../helpers/mail';

const FIXTURES = join(import.meta.dirname, '../../fixtures');
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

describe('batch upload from the visit page', () => {
	it('uploads impulse responses and a recorded sweep with progress, then shows them analysed', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);

		// A visit of its own, so the demo's visits stay as they are.
		await page.getByRole('button', { name: 'New visit' }).click();
		const condition = `upload check ${Date.now()}`;
		await page.getByLabel('Condition').fill(condition);
		await page.getByRole('button', { name: 'Create visit' }).click();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.getByRole('region', { name: 'Add recordings' }).waitFor();

		await page.getByLabel('Choose WAV files').setInputFiles([
			join(FIXTURES, 'decay-t0.5-48k.wav'),
			join(FIXTURES, 'stereo-t0.3-t0.6-48k.wav'),
			join(FIXTURES, 'sweep-recorded-48k.wav')
		]);
		const items = page.getByTestId('upload-item');
		expect(await items.count()).toBe(3);

		// The stereo file: analyse its second channel. The sweep: the played sweep is uploaded beside it.
		await items.nth(1).getByLabel('Channel (from 0)').fill('1');
		const sweepItem = items.nth(2);
		await sweepItem.getByLabel('Kind').selectOption('sweep');
		await sweepItem.getByLabel('Played sweep').selectOption('file');
		await sweepItem.getByLabel(/Reference sweep for/).setInputFiles(join(FIXTURES, 'sweep-1s-48k.wav'));

		await page.getByRole('button', { name: 'Upload 3 files' }).click();
		// Every file shows its own progress bar, and each reaches 100 %.
		for (let i = 0; i < 3; i++) {
			await items.nth(i).getByText('Uploaded', { exact: true }).waitFor({ timeout: 30_000 });
			expect(await items.nth(i).getByRole('progressbar').getAttribute('aria-valuenow')).toBe('100');
		}

		// The list updates by itself as the worker analyses them.
		const rows = page.getByTestId('capture-row');
		await page.waitForFunction(() => document.querySelectorAll('[data-testid="capture-row"][data-status="analysed"]').length === 3, null, { timeout: 60_000 });
		expect(await rows.count()).toBe(3);
		expect(await seen(page.getByText('3 analysed · 0 failed'))).toBe(true);
		const sweepRow = rows.filter({ hasText: 'sweep-recorded-48k.wav' });
		expect(await sweepRow.getByText('recorded sweep').count()).toBe(1);
		const stereoRow = rows.filter({ hasText: 'stereo-t0.3-t0.6-48k.wav' });
		expect(await stereoRow.getByText('ch 1 of 2').count()).toBe(1);

		// The acoustician hears about it once the last capture is done.
		const mail = await waitForMail('acoustician@fenwick-hale.test', new RegExp(`${condition}: 3 captures analysed`));
		expect(mail.text).toMatch(/Analysed: 3/);
		expect(mail.text).toMatch(/\/sessions\/\d+/);

		// The same file again is flagged, not stored twice.
		await page.getByLabel('Choose WAV files').setInputFiles(join(FIXTURES, 'decay-t0.5-48k.wav'));
		await page.getByRole('button', { name: 'Upload 1 file' }).click();
		await page.getByText('Already here').waitFor();
		expect(await rows.count()).toBe(3);
	});
});
