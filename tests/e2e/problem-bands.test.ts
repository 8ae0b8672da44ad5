import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, newPage, seen, signIn } from './browser';

// The room page's problem-band list: a consultant can mark a band addressed, reopen it and remove
// it; a client does not see the consultant's marks on the room page (only inside a published report).
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

async function openDemoRoom(page: Page) {
	await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
	await page.getByRole('link', { name: 'Attic listening room' }).click();
	await page.waitForURL(/\/rooms\/\d+$/);
	await page.waitForLoadState('networkidle');
}

describe('problem bands on the room page', () => {
	const note = `Flutter between the side walls ${Date.now()}`;

	it('consultant: marks a band addressed, reopens it and removes it', async () => {
		const page = await newPage(browser);
		await signIn(page, 'consultant@fenwick-hale.test');
		await openDemoRoom(page);
		const form = page.getByRole('form', { name: 'Mark a problem band' });
		await form.getByLabel('From', { exact: true }).fill('2000');
		await form.getByLabel('To', { exact: true }).fill('4000');
		await form.getByLabel('Note').fill(note);
		await form.getByRole('button').click();

		const band = page.getByTestId('problem-band').filter({ hasText: note });
		expect(await seen(band)).toBe(true);
		expect(await band.innerText()).toMatch(/\bopen\b/);

		await band.getByRole('button', { name: 'Mark addressed' }).click();
		expect(await seen(band.getByRole('button', { name: 'Reopen' }))).toBe(true);
		expect(await band.innerText()).toMatch(/\baddressed\b/);
		// The change is stored, not only shown.
		await page.reload();
		expect(await seen(band.getByRole('button', { name: 'Reopen' }))).toBe(true);

		await band.getByRole('button', { name: 'Reopen' }).click();
		expect(await seen(band.getByRole('button', { name: 'Mark addressed' }))).toBe(true);

		await band.getByRole('button', { name: 'Remove' }).click();
		await band.waitFor({ state: 'detached' });
		await page.reload();
		expect(await page.getByTestId('problem-band').filter({ hasText: note }).count()).toBe(0);
	});

	it('client: the room page shows no problem bands', async () => {
		const page = await newPage(browser);
		await signIn(page, 'client@fenwick-hale.test');
		await openDemoRoom(page);
		expect(await seen(page.getByRole('heading', { name: 'Reports' }))).toBe(true);
		expect(await page.getByRole('heading', { name: 'Problem bands' }).count()).toBe(0);
		// The demo's consultant marked a band noted "Boom" in this room; its note is not in the page.
		expect(await page.content()).not.toMatch(/Boom/);
	});
});
