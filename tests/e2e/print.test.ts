import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, newPage, signIn } from './browser';

// Printed on A4 (210 mm wide, ISO 216) with the app's 12 mm margins, a page is 186 mm wide: at
// CSS's 96 px per inch that is 703 px. Every table must fit that width (nothing cut off at the
// right edge), and nothing that can only be pressed on a screen is printed.
const PRINTED_WIDTH_PX = Math.floor((186 / 25.4) * 96);
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

async function asPrinted(page: Page) {
	await page.setViewportSize({ width: PRINTED_WIDTH_PX, height: 1000 });
	await page.emulateMedia({ media: 'print' });
	return page.evaluate(() => {
		const visible = (el: Element) => {
			const r = el.getBoundingClientRect();
			return r.width > 0 && r.height > 0 && getComputedStyle(el).visibility !== 'hidden';
		};
		const tooWide = [...document.querySelectorAll('table')]
			.filter((t) => visible(t) && t.getBoundingClientRect().right > window.innerWidth + 1)
			.map((t) => `${t.querySelector('caption')?.textContent?.trim() || t.querySelector('th')?.textContent?.trim()} (${Math.round(t.getBoundingClientRect().right)} px)`);
		const controls = [...document.querySelectorAll('button, a[download], summary')].filter(visible).map((el) => el.textContent?.trim() ?? '');
		return { tooWide, controls };
	});
}

describe('printed pages', () => {
	it('build sheets: the tables fit A4 and no button, download or "show the numbers" is printed', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.getByRole('link', { name: 'Treatment plan' }).click();
		await page.waitForURL(/\/rooms\/\d+\/plan$/);
		await page.getByRole('link', { name: 'Build sheets and cut list' }).click();
		await page.waitForURL(/\/plan\/build/);
		await page.waitForLoadState('networkidle');
		// In inches too: fractions make the widest columns.
		for (const units of ['mm', 'in']) {
			await page.goto(`${new URL(page.url()).pathname}?units=${units}`);
			await page.waitForLoadState('networkidle');
			if (units === 'in') {
				// Part names, notes and assembly steps speak the chosen unit (1 in = 25.4 mm): no "… mm" left.
				// (The fixing notes are the user's own words, kept as typed, so they are not looked at.)
				const sheets = await page.getByTestId('build-sheet').evaluateAll((els) => els.map((el) => [...el.querySelectorAll('table, [data-testid="assembly-step"], [data-testid="mounting"] ul')].map((n) => (n as HTMLElement).innerText).join('\n')));
				expect(sheets.length).toBeGreaterThan(0);
				for (const text of sheets) expect(text).not.toMatch(/\d mm\b/);
			}
			const printed = await asPrinted(page);
			expect(printed.tooWide, units).toEqual([]);
			expect(printed.controls, units).toEqual([]);
			await page.emulateMedia({ media: 'screen' });
		}
	});

	it('visit page: the results print without their controls', async () => {
		const page = await newPage(browser);
		await signIn(page, 'consultant@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.getByRole('link', { name: '2026-10-06' }).first().click();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.waitForLoadState('networkidle');
		const printed = await asPrinted(page);
		expect(printed.tooWide).toEqual([]);
		expect(printed.controls).toEqual([]);
	});
});
