import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, newPage, signIn } from './browser';

// The header's user menu (the account link and "Sign out") sits at the right end of the header on
// a desktop screen, after the navigation, as is usual in web applications (common practice, no source).
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

describe('header', () => {
	it('puts the user menu at the right end on a desktop screen', async () => {
		const page = await newPage(browser, { width: 1280, height: 900 });
		await signIn(page, 'consultant@fenwick-hale.test');
		const header = page.locator('header > div').first();
		const bar = (await header.boundingBox())!;
		const signOut = (await page.getByRole('button', { name: 'Sign out' }).boundingBox())!;
		const projects = (await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Projects' }).boundingBox())!;
		// The bar's content ends 16 px (its padding) inside its box; the button ends there, give or take a pixel.
		expect(bar.x + bar.width - 16 - (signOut.x + signOut.width)).toBeLessThan(2);
		expect(signOut.x - (projects.x + projects.width)).toBeGreaterThan(400);
	});
});

describe('safety cautions', () => {
	it('are shown in full until read, then as one line that opens again, and always in full in print', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.getByRole('link', { name: '2026-10-06' }).click();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.waitForLoadState('networkidle');
		const caution = page.getByRole('note', { name: 'Protect your hearing — and the loudspeakers' });
		const rule = caution.getByText('Everyone in the room wears hearing protection');
		expect(await rule.isVisible()).toBe(true);
		const fullHeight = (await caution.boundingBox())!.height;

		await caution.getByRole('button', { name: /I have read these/ }).click();
		await rule.waitFor({ state: 'hidden' });
		expect((await caution.boundingBox())!.height).toBeLessThan(fullHeight / 2);
		// Remembered in this browser: still short after a reload.
		await page.reload();
		await page.waitForLoadState('networkidle');
		await rule.waitFor({ state: 'hidden' });
		// Printed, the cautions are there in full.
		await page.emulateMedia({ media: 'print' });
		expect(await rule.isVisible()).toBe(true);
		await page.emulateMedia({ media: 'screen' });
		await caution.getByRole('button', { name: 'Show the cautions' }).click();
		expect(await rule.isVisible()).toBe(true);
	});
});
