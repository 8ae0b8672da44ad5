import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, newPage, seen, signIn } from './browser';

// A double click on a creating form's button makes one thing: the button is disabled while the
// form is sent, and the server acts on the form's one-time key once.
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

describe('creating forms are sent once', () => {
	it('acoustician: a double click on "Create room" creates one room', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.waitForURL(/\/projects\/\d+$/);
		await page.waitForLoadState('networkidle');
		await page.getByRole('button', { name: 'New room' }).click();
		const name = `Vocal booth ${Date.now()}`;
		await page.getByLabel('Room name').fill(name);
		await page.getByLabel('Length').fill('2.4');
		await page.getByLabel('Width').fill('1.8');
		await page.getByLabel('Height').fill('2.3');
		await page.getByRole('button', { name: 'Create room' }).dblclick();
		await page.waitForURL(/\/rooms\/\d+$/);
		await page.getByRole('link', { name: 'Lindqvist listening room' }).first().click();
		await page.waitForURL(/\/projects\/\d+$/);
		expect(await seen(page.getByRole('link', { name }))).toBe(true);
		expect(await page.getByRole('link', { name }).count()).toBe(1);
	});
});
