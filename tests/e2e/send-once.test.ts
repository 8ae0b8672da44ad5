import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import { compareDemoVisits, launch, newPage, openDemoRoom, seen, signIn } from './browser';

// A double click on a creating form's button makes one thing: the button is disabled while the
// form is sent, and the server acts on the form's one-time key once — a form sent twice with
// the same key past its disabled button (a resent request) still makes one.
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

/** Count the POSTs to a form action (`?/name`) the page sends from now on. */
function countPosts(page: Page, action: string): () => number {
	let n = 0;
	page.on('request', (r) => {
		if (r.method() === 'POST' && r.url().includes(`?/${action}`)) n++;
	});
	return () => n;
}

/** Send a form twice in a row with the same one-time key, past its disabled buttons (as a resent request would). */
async function sendTwice(form: Locator): Promise<void> {
	await form.evaluate((f: HTMLFormElement) => {
		f.requestSubmit();
		f.requestSubmit();
	});
}

/** The comparisons listed on the room page: all of them, and those of one title. */
async function listed(page: Page, room: string, title: string): Promise<{ all: number; titled: number }> {
	await page.goto(room);
	const list = page.getByRole('list', { name: 'Comparisons' });
	await list.waitFor();
	return { all: await list.getByRole('link').count(), titled: await list.getByRole('link', { name: title, exact: true }).count() };
}

/** The treatment plan of the demo room, with the form for a new porous absorber open and named. */
async function openPlanForm(page: Page, room: string, label: string): Promise<Locator> {
	await page.goto(`${room}/plan`);
	await page.waitForLoadState('networkidle');
	await page.getByText('Add a porous absorber', { exact: true }).click();
	const form = page.getByRole('form', { name: 'Add a porous absorber' });
	await form.getByLabel('Name').fill(label);
	await form.getByLabel('Mounted on').selectOption({ label: 'Free-standing (covers no surface)' });
	return form;
}

/** Take the test's item out of the shared demo plan again. */
async function removeItem(page: Page, label: string): Promise<void> {
	const item = page.getByTestId('plan-item').filter({ has: page.getByRole('heading', { name: label, exact: true }) });
	while ((await item.count()) > 0) {
		const n = await item.count();
		await item.first().getByRole('button', { name: 'Remove' }).click();
		await expect.poll(() => item.count()).toBe(n - 1);
	}
}

/**
 * A new comparison sent through `send`, which returns the check of what reached the server;
 * then the room lists exactly one comparison of that title, and one more in all.
 */
async function comparesOnce(
	titleStart: string,
	send: (button: Locator, posts: () => number) => Promise<(page: Page, path: string) => void | Promise<void>>
): Promise<void> {
	const page = await newPage(browser);
	await signIn(page, 'consultant@fenwick-hale.test');
	const room = await openDemoRoom(page);
	const title = `${titleStart} ${Date.now()}`;
	const before = await listed(page, room, title);
	await page.waitForLoadState('networkidle');
	const posts = countPosts(page, 'createComparison');
	let check: (page: Page, path: string) => void | Promise<void> = () => {};
	const path = await compareDemoVisits(page, title, async (button) => {
		check = await send(button, posts);
	});
	await check(page, path);
	const after = await listed(page, room, title);
	expect(after.titled).toBe(1);
	expect(after.all).toBe(before.all + 1);
}

/**
 * A new plan item sent through `send` (which also checks what reached the server); then the
 * plan shows it once, and one item more in all, as drawn and as reloaded from the server.
 */
async function addsOneItem(labelStart: string, send: (form: Locator, posts: () => number, page: Page) => Promise<void>): Promise<void> {
	const page = await newPage(browser);
	await signIn(page, 'consultant@fenwick-hale.test');
	const room = await openDemoRoom(page);
	const label = `${labelStart} ${Date.now()}`;
	const form = await openPlanForm(page, room, label);
	const items = page.getByTestId('plan-item');
	const mine = items.filter({ has: page.getByRole('heading', { name: label, exact: true }) });
	const before = await items.count();
	const posts = countPosts(page, 'addItem');
	await send(form, posts, page);
	expect(await mine.count()).toBe(1);
	expect(await items.count()).toBe(before + 1);
	// Reloaded from the server, not only as the page drew it.
	await page.reload();
	expect(await mine.count()).toBe(1);
	expect(await items.count()).toBe(before + 1);
	await removeItem(page, label);
}

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

	it('consultant: a double click on "Compare visits" creates one comparison', () =>
		comparesOnce('Double-click check', async (button, posts) => {
			await button.dblclick();
			// The button is disabled while the form is sent: the second click sends nothing.
			return () => expect(posts()).toBe(1);
		}));

	it('consultant: "Compare visits" sent twice with one key still creates one comparison', () =>
		comparesOnce('Resent check', async (button, posts) => {
			await sendTwice(button.locator('xpath=ancestor::form'));
			// Both reached the server; the second waited for the first and got its redirect.
			return async (page, path) => {
				await expect.poll(posts).toBe(2);
				await page.waitForLoadState('networkidle');
				expect(new URL(page.url()).pathname).toBe(path);
			};
		}));

	it('consultant: a double click on "Add to the plan" adds one item', () =>
		addsOneItem('Double-click absorber', async (form, posts, page) => {
			await form.getByRole('button', { name: 'Add to the plan' }).dblclick();
			await page.getByText('Item saved; the prediction is updated.').waitFor();
			await page.waitForLoadState('networkidle');
			expect(posts()).toBe(1);
		}));

	it('consultant: "Add to the plan" sent twice with one key still adds one item', () =>
		addsOneItem('Resent absorber', async (form, posts, page) => {
			await sendTwice(form);
			await page.getByText('Item saved; the prediction is updated.').waitFor();
			await expect.poll(posts).toBe(2);
			await page.waitForLoadState('networkidle');
		}));
});
