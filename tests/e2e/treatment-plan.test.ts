import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { launch, newPage, seen, signIn } from './browser';

// From a problem band in the demo room to a plan with predicted T per band, predicted and
// measured side by side, and a printed build sheet and cut list for the demo's diffuser and
// absorbers — each role in turn.
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

const ROOM = 'Attic listening room';

async function openRoom(page: Page) {
	await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
	await page.getByRole('link', { name: ROOM }).click();
	await page.waitForURL(/\/rooms\/\d+$/);
}

/** The prediction table's cells of one band row, by column header. */
async function bandRow(page: Page, band: string): Promise<Record<string, string>> {
	const table = page.getByTestId('prediction-table');
	const headers = (await table.locator('thead th').allInnerTexts()).map((h) => h.trim().toLowerCase());
	const row = table.locator('tbody tr').filter({ has: page.getByRole('rowheader', { name: band, exact: true }) });
	const cells = await row.locator('th, td').allInnerTexts();
	return Object.fromEntries(headers.map((h, i) => [h, cells[i]?.trim() ?? '']));
}

/** Reload until the demo's two visits are analysed and both show in the table. */
async function waitForMeasuredVisits(page: Page) {
	for (let i = 0; i < 60; i++) {
		const row = await bandRow(page, '500 Hz');
		if (/^\d/.test(row['measured before'] ?? '') && /^\d/.test(row['measured after'] ?? '')) return row;
		await page.waitForTimeout(1000);
		await page.reload();
	}
	throw new Error('the demo visits were not analysed in time');
}

describe('treatment planning on the demo room', () => {
	it('consultant: from a problem band to a plan item, with the predicted time per band against the measured ones', async () => {
		const page = await newPage(browser);
		await signIn(page, 'consultant@fenwick-hale.test');
		await openRoom(page);
		// The room's problem band list offers planning for each band.
		const boom = page.getByTestId('problem-band').filter({ hasText: 'Boom' });
		await boom.getByRole('link', { name: 'Plan treatment' }).click();
		await page.waitForURL(/\/rooms\/\d+\/plan\?band=\d+/);

		const proposals = page.getByTestId('proposals');
		expect(await seen(proposals.getByText('lies in the modal region'))).toBe(true);
		const trap = proposals.getByRole('article').filter({ hasText: 'Panel trap' }).first();
		expect(await trap.innerText()).toMatch(/resonates at f0 = .* ≈ \d+(\.\d)? Hz/);

		await waitForMeasuredVisits(page);
		const before63 = await bandRow(page, '63 Hz');
		const itemsBefore = await page.getByTestId('plan-item').count();
		// Add the proposed trap as a pair on the back wall.
		const form = trap.getByRole('form');
		await form.getByLabel('Name').fill('Rear-corner panel traps');
		await form.getByLabel('Mounted on').selectOption('back');
		await form.getByLabel('Quantity').fill('2');
		await form.getByRole('button', { name: 'Add to the plan' }).click();
		await page.getByText('Item saved; the prediction is updated.').waitFor();
		expect(await page.getByTestId('plan-item').count()).toBe(itemsBefore + 1);
		const added = page.getByTestId('plan-item').filter({ hasText: 'Rear-corner panel traps' });
		expect(await added.innerText()).toContain('Addresses 36–72 Hz');

		// More absorption at the trap's resonance: the predicted 63 Hz time drops; predicted and
		// measured after stand side by side with their difference.
		const after63 = await bandRow(page, '63 Hz');
		expect(Number.parseFloat(after63['predicted'])).toBeLessThan(Number.parseFloat(before63['predicted']));
		expect(after63['measured before']).toBe(before63['measured before']);
		expect(after63['measured after']).toMatch(/^\d\.\d\d$/);
		expect(after63['predicted − measured']).toMatch(/s \([+−]?\d+ %\)$/);
		for (const band of ['63 Hz', '125 Hz', '250 Hz', '500 Hz', '1 kHz', '2 kHz', '4 kHz', '8 kHz']) {
			const row = await bandRow(page, band);
			expect(row['predicted'], band).toMatch(/^\d\.\d\d/);
			expect(row['measured before'], band).toMatch(/^\d\.\d\d/);
			expect(row['measured after'], band).toMatch(/^\d\.\d\d/);
		}

		// The same change undone leaves the plan as the demo had it.
		await added.getByRole('button', { name: 'Remove' }).click();
		await page.getByText('Item removed.').waitFor();
		expect(await page.getByTestId('plan-item').count()).toBe(itemsBefore);
	});

	it('acoustician: prints the build sheets and the cut list of the demo diffuser and absorbers, in mm and in inches', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await openRoom(page);
		await page.getByRole('link', { name: 'Treatment plan' }).click();
		await page.waitForURL(/\/rooms\/\d+\/plan$/);
		await page.getByRole('link', { name: 'Build sheets and cut list' }).click();
		await page.waitForURL(/\/plan\/build/);

		const diffuser = page.getByRole('article', { name: 'Build sheet: Rear diffuser' });
		// Quadratic-residue diffuser N = 7, f0 = 500 Hz, c = 343 m/s: depths 0, 49, 196, 98, 98, 196, 49 mm (d_n = (n² mod N)·λ0/(2N), Schroeder, JASA 65:958, 1979).
		expect(await diffuser.innerText()).toContain('0 mm, 49 mm, 196 mm, 98 mm, 98 mm, 196 mm, 49 mm');
		expect(await seen(page.getByRole('article', { name: 'Build sheet: Left-wall absorbers' }))).toBe(true);
		expect(await seen(page.getByText('respirator'))).toBe(true);
		const summary = await page.getByTestId('cut-summary').innerText();
		const yieldPct = Number(/Yield\s+([\d.]+) %/.exec(summary)?.[1]);
		expect(yieldPct).toBeGreaterThan(50);
		expect(yieldPct).toBeLessThanOrEqual(100);
		const sheets = Number(/Sheets\s+(\d+)/.exec(summary)?.[1]);
		expect(await page.getByTestId('cut-sheet').count()).toBe(sheets);

		// The printed page: no navigation or buttons, every sheet drawn.
		await page.emulateMedia({ media: 'print' });
		expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
		expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
		const dir = mkdtempSync(join(tmpdir(), 'build-sheet-'));
		writeFileSync(join(dir, 'build.pdf'), await page.pdf({ format: 'A4', printBackground: true }));
		const text = spawnSync('/usr/bin/pdftotext', [join(dir, 'build.pdf'), '-'], { encoding: 'utf8' });
		expect(text.status, 'pdftotext (poppler-utils) must be installed').toBe(0);
		for (const phrase of ['Build sheets', 'Rear diffuser', 'Left-wall absorbers', 'Cut list', 'Birch ply 6 B/B']) expect(text.stdout).toContain(phrase);
		await page.emulateMedia({ media: 'screen' });

		// In inches: the 196 mm well is 7 11/16″ (196 / 25.4 = 7.717″, to the nearest 1/16).
		await page.getByRole('link', { name: 'inches' }).click();
		await page.waitForURL(/units=in/);
		expect(await page.getByRole('article', { name: 'Build sheet: Rear diffuser' }).innerText()).toContain('7 11/16″');
	});

	it('client: the plan and build pages stay closed', async () => {
		const page = await newPage(browser);
		await signIn(page, 'client@fenwick-hale.test');
		await openRoom(page);
		const roomUrl = new URL(page.url()).pathname;
		expect(await page.getByRole('link', { name: 'Treatment plan' }).count()).toBe(0);
		expect((await page.goto(`${roomUrl}/plan`))?.status()).toBe(403);
		expect((await page.goto(`${roomUrl}/plan/build`))?.status()).toBe(403);
	});
});
