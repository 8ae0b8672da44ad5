import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { copyFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { launch, newPage, seen, signIn } from './browser';

// A recorded sweep shorter than the test signal chosen for it is caught when the file is picked,
// from its WAV header, and not uploaded — instead of failing after the analysis.
const FIXTURES = join(import.meta.dirname, '../../fixtures');
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

describe('the sweep check at pick time', () => {
	it('says a 1 s "…sweep…" file cannot hold the 3 s sweep chosen for it, and keeps it back', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		// The practice's test signal: a 3 s sweep.
		await page.goto('/signal');
		await page.waitForLoadState('networkidle');
		const signal = `Check sweep 3 s ${Date.now()}`;
		await page.getByLabel('Name').fill(signal);
		await page.getByLabel('Sweep length').fill('3');
		await page.getByRole('button', { name: 'Make test signal' }).click();
		expect(await seen(page.getByText(signal))).toBe(true);

		await page.goto('/projects');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.getByRole('button', { name: 'New visit' }).click();
		await page.getByLabel('Condition').fill(`sweep check ${Date.now()}`);
		await page.getByRole('button', { name: 'Create visit' }).click();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.waitForLoadState('networkidle');

		// A 1.0 s impulse response saved under a sweep's name: the uploader takes it for a recorded sweep.
		const file = join(mkdtempSync(join(tmpdir(), 'ringdown-')), 'P1-sweep.wav');
		copyFileSync(join(FIXTURES, 'decay-t0.5-48k.wav'), file);
		await page.getByLabel('Choose WAV files').setInputFiles([file]);
		const item = page.getByTestId('upload-item');
		await item.getByLabel('Played sweep').selectOption({ label: signal });
		const warning = item.getByTestId('sweep-mismatch');
		expect(await seen(warning)).toBe(true);
		expect(await warning.innerText()).toContain(`1.00 s long, shorter than the 3.00 s sweep "${signal}"`);

		await page.getByRole('button', { name: /^Upload/ }).click();
		await item.getByText('Not uploaded', { exact: true }).waitFor();
		expect(await page.getByTestId('capture-row').count()).toBe(0);

		// Told what it is, the same file goes.
		await item.getByLabel('Kind').selectOption('impulse');
		expect(await warning.count()).toBe(0);
		await page.getByRole('button', { name: /^Upload/ }).click();
		await item.getByText('Uploaded', { exact: true }).waitFor({ timeout: 30_000 });
	});
});
