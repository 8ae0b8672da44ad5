// The Content-Security-Policy blocks nothing the app itself does: pages, their scripts, the
// uPlot charts and Svelte's inline styles run without one violation report.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import type { Knex } from 'knex';
import { launch, newPage, signIn } from './browser';
import { testDb } from '../helpers/db';

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

/** Violations the browser reports on the page (the `securitypolicyviolation` event) and in its console. */
async function watchViolations(page: Page): Promise<string[]> {
	const seen: string[] = [];
	page.on('console', (m) => {
		if (/Content Security Policy/i.test(m.text())) seen.push(m.text().slice(0, 200));
	});
	await page.exposeFunction('reportViolation', (v: string) => seen.push(v));
	await page.addInitScript(() => {
		document.addEventListener('securitypolicyviolation', (e) => {
			(window as unknown as { reportViolation(v: string): void }).reportViolation(`${e.violatedDirective} blocked ${e.blockedURI.slice(0, 80)} (${e.sourceFile}:${e.lineNumber})`);
		});
	});
	return seen;
}

describe('Content-Security-Policy', () => {
	it('pages with charts, forms and inline styles raise no violation', async () => {
		const session = await k('sessions as s')
			.join('captures as c', 'c.session_id', 's.id')
			.where('c.status', 'analysed')
			.first('s.id as sessionId', 's.room_id as roomId', 'c.id as captureId');
		expect(session, 'the demo has analysed captures').toBeTruthy();

		const page = await newPage(browser);
		const violations = await watchViolations(page);
		await signIn(page, 'acoustician@fenwick-hale.test');
		for (const path of ['/projects', `/rooms/${session.roomId}`, `/sessions/${session.sessionId}`, `/captures/${session.captureId}`, `/rooms/${session.roomId}/plan`, `/rooms/${session.roomId}/plan/build`, '/signal', '/account']) {
			const res = await page.goto(path);
			expect(res?.status(), path).toBe(200);
			await page.waitForLoadState('networkidle');
		}
		// The capture page draws its charts with uPlot: canvases are there.
		await page.goto(`/captures/${session.captureId}`);
		await page.locator('.u-over').first().waitFor();
		expect(violations).toEqual([]);
	});
});
