// The account page's API tokens, as a person uses them: create one, see it once, use it from a
// script, see when it was last used, revoke it — after which the script is refused.
import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import type { Knex } from 'knex';
import { launch, newPage, seen, signIn } from './browser';
import { testDb } from '../helpers/db';
import { withToken } from '../helpers/api-tokens';

let browser: Browser;
let k: Knex;
beforeAll(async () => {
	browser = await launch();
	k = testDb();
});
afterAll(async () => {
	await browser?.close();
	await k?.destroy();
});

// Set SCREENSHOT_DIR to keep pictures of the page at desktop and phone width.
const shots = process.env.SCREENSHOT_DIR;

describe('API tokens on the account page', () => {
	it('acoustician: creates a token, sees it once, uses it, and revokes it', async () => {
		// A visit of the demo practice, which the demo acoustician reaches.
		const visit = await k('sessions as s')
			.join('rooms as r', 'r.id', 's.room_id')
			.join('projects as p', 'p.id', 'r.project_id')
			.join('memberships as m', 'm.organization_id', 'p.organization_id')
			.join('users as u', 'u.id', 'm.user_id')
			.where('u.email', 'acoustician@fenwick-hale.test')
			.first('s.id as id');
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.goto('/account');
		await page.waitForLoadState('networkidle');

		const name = `field laptop ${Date.now().toString(36)}`;
		await page.getByLabel('Token name').fill(name);
		// "read" is ticked already; add "upload", and a month.
		expect(await page.getByRole('checkbox', { name: /^read/ }).isChecked()).toBe(true);
		await page.getByRole('checkbox', { name: /^upload/ }).check();
		await page.getByLabel('Expires after').selectOption('30');
		await page.getByRole('button', { name: 'Create token' }).click();

		const shown = page.getByTestId('new-token');
		await shown.waitFor();
		const token = (await shown.innerText()).trim();
		expect(token).toMatch(/^rdt_[A-Za-z0-9_-]{43}$/);
		expect(await seen(page.getByText('it is shown this once'))).toBe(true);
		// The form is ready for the next token.
		expect(await page.getByLabel('Token name').inputValue()).toBe('');
		const row = page.getByTestId('tokens').getByRole('row', { name: new RegExp(name) });
		expect(await row.innerText()).toMatch(/read, upload[\s\S]*never[\s\S]*In use/);
		if (shots) {
			mkdirSync(shots, { recursive: true });
			await page.screenshot({ path: `${shots}/account-tokens-created-1280.png`, fullPage: true });
		}

		// A script uses it.
		const res = await withToken(token, 'GET', `/api/sessions/${visit.id}/captures`);
		expect(res.status).toBe(200);

		// Seen once: after a reload only its name and first characters are left, and its last use.
		await page.reload();
		await page.waitForLoadState('networkidle');
		expect(await page.getByTestId('new-token').count()).toBe(0);
		expect(await page.content()).not.toContain(token);
		expect(await row.innerText()).toContain(`${token.slice(0, 8)}…`);
		expect(await row.innerText()).toMatch(/UTC[\s\S]*from 127\.0\.0\.1/);
		// On a phone the page fits the screen: the token table scrolls inside its own box.
		const phone = await newPage(browser, { width: 390, height: 844 });
		await signIn(phone, 'acoustician@fenwick-hale.test');
		await phone.goto('/account');
		await phone.waitForLoadState('networkidle');
		expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
		if (shots) await phone.screenshot({ path: `${shots}/account-tokens-390.png`, fullPage: true });
		await phone.close();

		// Revoked (after a confirmation): the row says so and the script is refused.
		page.once('dialog', (d) => void d.accept());
		await row.getByRole('button', { name: `Revoke ${name}` }).click();
		expect(await seen(page.getByText('Token revoked'))).toBe(true);
		await expect.poll(async () => row.innerText()).toMatch(/Revoked/);
		expect(await row.getByRole('button').count()).toBe(0);
		const after = await withToken(token, 'GET', `/api/sessions/${visit.id}/captures`);
		expect(after.status).toBe(401);
		expect((await after.json()).message).toContain('was revoked');
		if (shots) await page.screenshot({ path: `${shots}/account-tokens-revoked-1280.png`, fullPage: true });
	});

	it('a refused form keeps what was typed and says why', async () => {
		const page = await newPage(browser);
		await signIn(page, 'consultant@fenwick-hale.test');
		await page.goto('/account');
		await page.waitForLoadState('networkidle');
		await page.getByLabel('Token name').fill('no scopes at all');
		await page.getByRole('checkbox', { name: /^read/ }).uncheck();
		await page.getByRole('button', { name: 'Create token' }).click();
		expect(await seen(page.getByText('Tick at least one scope.'))).toBe(true);
		expect(await page.getByLabel('Token name').inputValue()).toBe('no scopes at all');
		expect(await page.getByTestId('new-token').count()).toBe(0);
		expect(await k('api_tokens').where({ name: 'no scopes at all' }).first()).toBeUndefined();
	});
});
