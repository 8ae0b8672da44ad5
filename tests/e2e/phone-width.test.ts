import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, newPage, seen, signIn } from './browser';

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

/** The visible controls inside `selector` that reach beyond the window's left or right edge. */
async function cutOff(page: Page, selector: string): Promise<string[]> {
	return page.evaluate((sel) => {
		const root = document.querySelector(sel);
		if (!root) return [`${sel} not found`];
		return [...root.querySelectorAll<HTMLElement>('input:not([type="hidden"]), select, button, textarea')]
			.filter((el) => el.offsetParent !== null)
			.filter((el) => {
				const r = el.getBoundingClientRect();
				return r.left < -1 || r.right > window.innerWidth + 1;
			})
			.map((el) => `${el.tagName.toLowerCase()}[${el.getAttribute('name') ?? el.textContent?.trim() ?? ''}] ${Math.round(el.getBoundingClientRect().left)}–${Math.round(el.getBoundingClientRect().right)} px`);
	}, selector);
}

describe('forms at phone and desktop width', () => {
	const DESKTOP = { width: 1280, height: 900 };

	async function demoVisit(page: Page): Promise<{ room: string }> {
		await page.goto('/projects');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		const room = page.url();
		await page.getByRole('link', { name: '2026-10-06' }).first().click();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.waitForLoadState('networkidle');
		return { room };
	}

	for (const viewport of [PHONE, DESKTOP]) {
		it(`acoustician at ${viewport.width} px: a position's change form and the finish menus lie within the window`, async () => {
			const page = await newPage(browser, viewport);
			await signIn(page, 'acoustician@fenwick-hale.test');
			const { room } = await demoVisit(page);
			await page.getByTestId('position').first().getByRole('button', { name: 'Change' }).click();
			const edit = page.getByRole('form', { name: /^Change position / });
			await edit.waitFor();
			await page.screenshot({ path: `/tmp/position-edit-${viewport.width}.png`, fullPage: true });
			expect(await cutOff(page, 'form[aria-label^="Change position "]')).toEqual([]);
			// Its inputs take a usable width, not a sliver.
			expect((await edit.getByLabel('Label', { exact: true }).boundingBox())?.width).toBeGreaterThan(200);
			expect((await overflow(page)).width).toBeLessThanOrEqual(viewport.width);

			// The plan page's finish menus: each whole, with its button, inside the window (the
			// surfaces table scrolls in its own box; scrolled to the menu, the menu shows whole).
			await page.goto(`${room}/plan`);
			await page.waitForLoadState('networkidle');
			const menus = page.getByRole('combobox', { name: /^Finish of the / });
			expect(await menus.count()).toBe(6);
			for (let i = 0; i < 6; i++) {
				const menu = menus.nth(i);
				await menu.scrollIntoViewIfNeeded();
				const box = (await menu.boundingBox())!;
				const set = (await menu.locator('xpath=following-sibling::button').boundingBox())!;
				expect(box.x, `menu ${i}`).toBeGreaterThanOrEqual(0);
				expect(set.x + set.width, `menu ${i}`).toBeLessThanOrEqual(viewport.width);
				expect(box.width, `menu ${i}`).toBeGreaterThan(150);
				// The chosen finish's name is not cut inside the menu.
				// (the name's width in the menu's font, plus its padding and a 16 px allowance for the arrow)
				const fit = await menu.evaluate((el: HTMLSelectElement) => {
					const style = getComputedStyle(el);
					const ctx = document.createElement('canvas').getContext('2d')!;
					ctx.font = style.font;
					const text = ctx.measureText(el.selectedOptions[0]?.text ?? '').width;
					return { need: Math.ceil(text + parseFloat(style.paddingLeft) + parseFloat(style.paddingRight) + 16), have: el.clientWidth, name: el.selectedOptions[0]?.text };
				});
				if (fit.need > fit.have) {
					// Narrower than the name: the cell shows the chosen name in full, on the screen.
					const name = page.getByTestId('finish-name').nth(i);
					expect(await name.isVisible(), `menu ${i}: ${fit.name} is cut (${fit.have} of ${fit.need} px) and not shown beside it`).toBe(true);
					expect(await name.innerText()).toBe(fit.name);
					const nameBox = (await name.boundingBox())!;
					expect(nameBox.x >= 0 && nameBox.x + nameBox.width <= viewport.width, `menu ${i}: the name lies on the screen`).toBe(true);
				}
			}
			await menus.first().scrollIntoViewIfNeeded();
			await page.screenshot({ path: `/tmp/finish-menus-${viewport.width}.png` });
			expect((await overflow(page)).width).toBeLessThanOrEqual(viewport.width);
		});
	}

	it('acoustician: the new-position panel closes after an add and keeps what was typed after a refusal', async () => {
		const page = await newPage(browser, PHONE);
		page.on('dialog', (d) => void d.accept());
		await signIn(page, 'acoustician@fenwick-hale.test');
		await demoVisit(page);
		const label = `N${Date.now() % 100000}`;
		await page.getByRole('button', { name: 'New position' }).click();
		const panel = page.locator('form[action="?/createPosition"]');
		await panel.getByLabel('Label', { exact: true }).fill(label);
		await panel.getByLabel('Loudspeaker x', { exact: true }).fill('999');
		await panel.getByRole('button', { name: 'Add position' }).click();
		expect(await seen(page.getByText(/Must lie inside the room/))).toBe(true);
		expect(await panel.getByLabel('Label', { exact: true }).inputValue()).toBe(label);
		expect(await panel.getByLabel('Loudspeaker x', { exact: true }).inputValue()).toBe('999');

		await panel.getByLabel('Loudspeaker x', { exact: true }).fill(''); // a point is given whole or not at all
		await panel.getByRole('button', { name: 'Add position' }).click();
		const row = page.getByTestId('position').filter({ hasText: label });
		await row.waitFor();
		await expect.poll(() => page.getByRole('button', { name: 'Add position' }).count()).toBe(0);
		expect(await page.getByRole('button', { name: 'New position' }).getAttribute('aria-expanded')).toBe('false');

		// Opened again, it is empty.
		await page.getByRole('button', { name: 'New position' }).click();
		expect(await page.locator('form[action="?/createPosition"]').getByLabel('Label', { exact: true }).inputValue()).toBe('');

		// Leave the demo visit as it was.
		await row.getByRole('button', { name: `Remove position ${label}` }).click();
		await expect.poll(() => page.getByTestId('position').filter({ hasText: label }).count()).toBe(0);
	});
});
