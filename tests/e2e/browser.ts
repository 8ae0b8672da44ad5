// Headless Chromium from Debian, driven by playwright-core (no browser download).
import { chromium, type Browser, type Locator, type Page } from 'playwright-core';
import { join } from 'node:path';
import { BASE_URL, DEMO_PASSWORD } from '../helpers/env';

export interface LaunchOptions {
	/**
	 * A WAV file Chromium plays as the microphone, through its fake capture device (permission
	 * granted without asking). Chromium restarts the file with each new input stream and loops it
	 * unless the path ends in `%noloop`; 16-bit PCM works, and it is not resampled when its rate
	 * is the fake device's 44.1 kHz.
	 */
	fakeAudioCapture?: string;
}

export async function launch(options: LaunchOptions = {}): Promise<Browser> {
	const audio = options.fakeAudioCapture
		? ['--use-fake-ui-for-media-stream', '--use-fake-device-for-media-stream', `--use-file-for-fake-audio-capture=${options.fakeAudioCapture}`]
		: [];
	return chromium.launch({
		executablePath: '/usr/bin/chromium',
		headless: true,
		args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', ...audio]
	});
}

export async function newPage(browser: Browser, viewport = { width: 1280, height: 900 }): Promise<Page> {
	const context = await browser.newContext({ baseURL: BASE_URL, viewport });
	const page = await context.newPage();
	// Fail fast with the locator in the message rather than at the test's own time-out.
	page.setDefaultTimeout(15_000);
	return page;
}

/** Sign in through the form, as a person would, and wait for the projects page. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
	await page.goto('/signin');
	// Let the page hydrate first, so the enhanced form handles the submit from start to end.
	await page.waitForLoadState('networkidle');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	try {
		await page.waitForURL('**/projects');
	} catch (e) {
		const alert = await page.getByRole('alert').allInnerTexts().catch(() => []);
		throw new Error(`Sign-in of ${email} did not reach /projects (at ${page.url()}; ${alert.join(' ') || 'no message shown'})`, { cause: e });
	}
}

/** Whether a locator becomes visible within a few seconds (pages navigate and hydrate). */
export async function seen(locator: Locator, timeout = 5_000): Promise<boolean> {
	try {
		await locator.first().waitFor({ state: 'visible', timeout });
		return true;
	} catch {
		return false;
	}
}

/** Screenshots at a desktop and a phone width when SCREENSHOT_DIR is set, to look at (not compared). */
export async function shots(page: Page, name: string): Promise<void> {
	const dir = process.env.SCREENSHOT_DIR;
	if (!dir) return;
	for (const width of [1280, 390]) {
		await page.setViewportSize({ width, height: 900 });
		await page.screenshot({ path: join(dir, `${name}-${width}.png`), fullPage: true });
	}
	await page.setViewportSize({ width: 1280, height: 900 });
}

/** The demo's attic room page (scripts/demo/scenario.ts), from the projects list; its path. */
export async function openDemoRoom(page: Page): Promise<string> {
	await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
	await page.getByRole('link', { name: 'Attic listening room' }).click();
	await page.waitForURL(/\/rooms\/\d+$/);
	await page.waitForLoadState('networkidle');
	return new URL(page.url()).pathname;
}

/**
 * On the demo room's page: compare its untreated visit with the treated one under `title`,
 * sent through `send` (a click by default); the new comparison's path.
 */
export async function compareDemoVisits(page: Page, title: string, send: (button: Locator) => Promise<void> = (b) => b.click()): Promise<string> {
	const compare = page.getByRole('form', { name: 'Compare two visits' });
	await compare.getByLabel('Title').fill(title);
	await compare.getByLabel('Before', { exact: true }).selectOption({ label: 'untreated — 2026-10-06' });
	await compare.getByLabel('After', { exact: true }).selectOption({ label: 'after treatment — 2026-11-17' });
	await send(compare.getByRole('button', { name: 'Compare visits' }));
	await page.waitForURL(/\/comparisons\/\d+$/);
	return new URL(page.url()).pathname;
}
