import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { join } from 'node:path';
import { launch, newPage, seen, shots, signIn } from './browser';

// Mistakes at upload are put right where they happen: an upload into a new position that fails
// leaves no empty position and can be sent again; a recorded sweep's played sweep is changed on
// its page and the capture analysed again.
const FIXTURES = join(import.meta.dirname, '../../fixtures');
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

async function newVisit(page: Page, condition: string): Promise<void> {
	await page.goto('/projects');
	await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
	await page.getByRole('link', { name: 'Attic listening room' }).click();
	await page.getByRole('button', { name: 'New visit' }).click();
	await page.getByLabel('Condition').fill(condition);
	await page.getByRole('button', { name: 'Create visit' }).click();
	await page.waitForURL(/\/sessions\/\d+$/);
	await page.waitForLoadState('networkidle');
}

describe('a failed upload into a new position', () => {
	it('leaves no position behind, and the same file goes once the connection is back', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await newVisit(page, `failed upload ${Date.now()}`);

		// The object store cannot be reached: every PUT fails.
		await page.route('**/*', (route) => (route.request().method() === 'PUT' ? route.abort('connectionrefused') : route.continue()));
		await page.getByLabel('Choose WAV files').setInputFiles(join(FIXTURES, 'decay-t0.5-48k.wav'));
		const item = page.getByTestId('upload-item');
		expect(await item.getByLabel('Position').inputValue()).toBe('new:P1');
		await page.getByRole('button', { name: 'Upload 1 file' }).click();
		await item.getByText('Not uploaded', { exact: true }).waitFor({ timeout: 30_000 });
		await page.waitForLoadState('networkidle');
		// No capture, and no position P1 made for it.
		expect(await page.getByTestId('capture-row').count()).toBe(0);
		expect(await page.getByTestId('position').count()).toBe(0);
		await page.reload();
		expect(await seen(page.getByText('No positions yet.'))).toBe(true);
		// The text is there before the page is hydrated; a file chosen earlier would go unheard.
		await page.waitForLoadState('networkidle');

		await page.unroute('**/*');
		await page.getByLabel('Choose WAV files').setInputFiles(join(FIXTURES, 'decay-t0.5-48k.wav'));
		await page.getByRole('button', { name: 'Upload 1 file' }).click();
		await item.getByText('Uploaded', { exact: true }).waitFor({ timeout: 30_000 });
		await page.getByTestId('capture-row').first().waitFor(); // the list refreshes after the upload
		expect(await page.getByTestId('capture-row').count()).toBe(1);
		await page.getByTestId('position').first().waitFor();
		expect(await page.getByTestId('position').allInnerTexts()).toEqual([expect.stringContaining('P1')]);
	});
});

describe('the played sweep of a recorded sweep', () => {
	it('is changed on the capture page, checked against the recording, and the capture analysed again', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		// Two test signals of the practice: the 1 s sweep that was played, and a 3 s one that cannot have been.
		const stamp = Date.now();
		for (const [name, seconds] of [[`Played 1 s ${stamp}`, '1'], [`Long 3 s ${stamp}`, '3']]) {
			await page.goto('/signal');
			await page.waitForLoadState('networkidle');
			await page.getByLabel('Name').fill(name);
			await page.getByLabel('Sweep length').fill(seconds);
			await page.getByRole('button', { name: 'Make test signal' }).click();
			expect(await seen(page.getByText(name))).toBe(true);
		}
		await newVisit(page, `sweep change ${stamp}`);

		// Uploaded with its reference file beside it.
		await page.getByLabel('Choose WAV files').setInputFiles(join(FIXTURES, 'sweep-recorded-48k.wav'));
		const item = page.getByTestId('upload-item');
		await item.getByLabel('Kind').selectOption('sweep');
		await item.getByLabel('Played sweep').selectOption('file');
		await item.getByLabel(/Reference sweep for/).setInputFiles(join(FIXTURES, 'sweep-1s-48k.wav'));
		await page.getByRole('button', { name: 'Upload 1 file' }).click();
		await item.getByText('Uploaded', { exact: true }).waitFor({ timeout: 30_000 });
		await page.waitForFunction(() => document.querySelector('[data-testid="capture-row"][data-status="analysed"]') !== null, null, { timeout: 60_000 });
		await page.getByRole('link', { name: 'sweep-recorded-48k.wav' }).click();
		await page.waitForURL(/\/captures\/\d+$/);

		const panel = page.getByRole('region', { name: 'Played sweep' });
		await panel.getByTestId('played-sweep').waitFor();
		expect(await panel.getByTestId('played-sweep').innerText()).toContain('the reference file uploaded with the recording');
		const change = panel.getByRole('button', { name: 'Change and analyse again' });

		// The 3 s signal is longer than the 1.6 s recording: said at once, and not sent.
		await panel.getByLabel('Change to').selectOption({ label: `Long 3 s ${stamp} (3.00 s)` });
		expect(await panel.getByTestId('reference-mismatch').innerText()).toContain('1.60 s long, shorter than the 3.00 s sweep');
		expect(await change.isDisabled()).toBe(true);
		await shots(page, 'capture-played-sweep');

		await panel.getByLabel('Change to').selectOption({ label: `Played 1 s ${stamp} (1.00 s)` });
		// The page comes back by itself once the new analysis is done.
		let reloaded = page.waitForEvent('load', { timeout: 90_000 });
		await change.click();
		expect(await seen(panel.getByText(/Queued for analysis with “Played 1 s/))).toBe(true);
		await reloaded;
		await panel.getByTestId('played-sweep').waitFor();
		expect(await panel.getByTestId('played-sweep').innerText()).toContain(`the test signal “Played 1 s ${stamp}” (1.00 s)`);
		expect(await seen(page.getByLabel('Broadband values'), 15_000)).toBe(true);
		expect(await page.getByText('This capture could not be analysed').count()).toBe(0);

		// And back to an uploaded reference file.
		await panel.getByLabel('Change to').selectOption('file');
		await panel.getByLabel('Reference file (WAV)').setInputFiles(join(FIXTURES, 'sweep-1s-48k.wav'));
		reloaded = page.waitForEvent('load', { timeout: 90_000 });
		await change.click();
		await reloaded;
		await panel.getByTestId('played-sweep').waitFor();
		expect(await panel.getByTestId('played-sweep').innerText()).toContain('the reference file uploaded with the recording');
		expect(await seen(page.getByLabel('Broadband values'), 15_000)).toBe(true);
	});
});

