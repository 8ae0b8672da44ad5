import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, newPage, seen, signIn } from './browser';

// The People page's role menu after a refused change: the demo practice has one admin
// (scripts/demo/scenario.ts), so making her a client is refused, and the menu must go back to the
// role she still has instead of showing the refused one.
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

describe('role menu', () => {
	it('shows the role a member still has after a refused change', async () => {
		const page = await newPage(browser);
		await signIn(page, 'admin@fenwick-hale.test');
		await page.goto('/organization');
		await page.waitForLoadState('networkidle');
		const menu = page.getByLabel('Role of Iris Fenwick');
		expect(await menu.inputValue()).toBe('admin');
		await menu.selectOption('client');
		await page.locator('form', { has: menu }).getByRole('button', { name: 'Change' }).click();
		expect(await seen(page.getByText('An organization needs at least one admin.'))).toBe(true);
		expect(await menu.inputValue()).toBe('admin');
		// And she is still the admin: the People page stays hers.
		await page.reload();
		expect(await page.getByLabel('Role of Iris Fenwick').inputValue()).toBe('admin');
	});
});
