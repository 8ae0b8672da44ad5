import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, newPage, seen, signIn } from './browser';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

// The demo scenario (scripts/demo/scenario.ts): one practice, two client projects.
const OWN = 'Lindqvist listening room';
const OTHER = 'Okafor home theatre';

describe('each demo role sees what it should', () => {
	it('admin: both projects, the People page, and can invite', async () => {
		const page = await newPage(browser);
		await signIn(page, 'admin@fenwick-hale.test');
		expect(await seen(page.getByRole('link', { name: OWN }))).toBe(true);
		expect(await seen(page.getByRole('link', { name: OTHER }))).toBe(true);
		await page.getByRole('link', { name: 'People' }).click();
		await page.waitForURL('**/organization');
		expect(await seen(page.getByRole('heading', { name: 'Invite someone' }))).toBe(true);
		expect(await seen(page.getByText('consultant@fenwick-hale.test'))).toBe(true);
	});

	it('acoustician: both projects, may create rooms and visits, no People page', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		expect(await seen(page.getByRole('button', { name: 'New project' }))).toBe(true);
		expect(await page.getByRole('link', { name: 'People' }).count()).toBe(0);
		await page.getByRole('link', { name: OWN }).click();
		await page.waitForURL(/\/projects\/\d+$/);
		expect(await seen(page.getByRole('button', { name: 'New room' }))).toBe(true);
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		expect(await seen(page.getByRole('button', { name: 'New visit' }))).toBe(true);
		expect(await seen(page.getByRole('link', { name: '2026-10-06' }))).toBe(true);
		const res = await page.goto('/organization');
		expect(res?.status()).toBe(403);
	});

	it('consultant: both projects, no project creation, no People page', async () => {
		const page = await newPage(browser);
		await signIn(page, 'consultant@fenwick-hale.test');
		expect(await seen(page.getByRole('link', { name: OTHER }))).toBe(true);
		expect(await page.getByRole('button', { name: 'New project' }).count()).toBe(0);
		expect(await page.getByRole('link', { name: 'People' }).count()).toBe(0);
		expect(await page.getByRole('link', { name: 'Test signal' }).count()).toBe(0);
	});

	it('client: only their own project, read-only', async () => {
		const page = await newPage(browser);
		await signIn(page, 'client@fenwick-hale.test');
		expect(await seen(page.getByRole('link', { name: OWN }))).toBe(true);
		expect(await page.getByText(OTHER).count()).toBe(0);
		await page.getByRole('link', { name: OWN }).click();
		await page.waitForURL(/\/projects\/\d+$/);
		expect(await page.getByRole('button', { name: 'New room' }).count()).toBe(0);
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		expect(await page.getByRole('button', { name: 'New visit' }).count()).toBe(0);
		expect(await page.getByRole('link', { name: 'Test signal' }).count()).toBe(0);
	});

	it('a signed-out visitor is sent to sign-in and back after it', async () => {
		const page = await newPage(browser);
		await page.goto('/projects');
		expect(new URL(page.url()).pathname).toBe('/signin');
		expect(await seen(page.getByRole('heading', { name: 'Sign in' }))).toBe(true);
	});
});
