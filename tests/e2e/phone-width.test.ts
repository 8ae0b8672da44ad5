import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, newPage, signIn } from './browser';

// On a phone (390 px, a common width) the pages fit the screen: wide charts and band tables
// scroll inside their own box, never the page (common practice, no source).
const PHONE = { width: 390, height: 844 };
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

/** The page's own width beyond the screen, and the widest elements that cause it. */
async function overflow(page: Page): Promise<{ width: number; culprits: string[] }> {
	await page.waitForLoadState('networkidle');
	await page.waitForTimeout(500);
	return page.evaluate(() => {
		const width = document.documentElement.scrollWidth;
		const culprits = [...document.querySelectorAll<HTMLElement>('main *')]
			.filter((el) => el.getBoundingClientRect().right > window.innerWidth + 1 && !el.parentElement?.closest('.overflow-x-auto, .overflow-auto'))
			.slice(0, 5)
			.map((el) => `${el.tagName.toLowerCase()}.${[...el.classList].slice(0, 3).join('.')} (${Math.round(el.getBoundingClientRect().right)} px)`);
		return { width, culprits };
	});
}

describe('pages at phone width', () => {
	it('consultant: the visit, a comparison and its report fit 390 px', async () => {
		const page = await newPage(browser, PHONE);
		await signIn(page, 'consultant@fenwick-hale.test');
		await page.goto('/projects');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		const room = page.url();
		await page.getByRole('link', { name: '2026-10-06' }).first().click();
		await page.waitForURL(/\/sessions\/\d+$/);
		const visit = await overflow(page);
		expect(visit.width, visit.culprits.join(', ')).toBeLessThanOrEqual(PHONE.width);

		// A comparison of the demo's two visits, and its report as the client will see it.
		await page.goto(room);
		await page.waitForLoadState('networkidle');
		await page.getByRole('form', { name: 'Compare two visits' }).getByLabel('Title').fill(`Phone check ${Date.now()}`);
		await page.getByRole('button', { name: 'Compare visits' }).click();
		await page.waitForURL(/\/comparisons\/\d+$/);
		const comparison = await overflow(page);
		expect(comparison.width, comparison.culprits.join(', ')).toBeLessThanOrEqual(PHONE.width);

		await page.goto(page.url().replace('/comparisons/', '/reports/'));
		const report = await overflow(page);
		expect(report.width, report.culprits.join(', ')).toBeLessThanOrEqual(PHONE.width);
	});
});
