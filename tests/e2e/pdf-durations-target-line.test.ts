import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { compareDemoVisits, launch, newPage, openDemoRoom, signIn } from './browser';

// Three details of the demo room's pages: the report's PDF link is a download, not a page the
// client router tries (no error in the console); a duration such as "0.55 s" in a visit's tables
// never breaks between number and unit; and the comparison chart draws the target line in its
// own colour and dash, apart from the "after" series.
let browser: Browser;
const visits: string[] = [];
let comparisonPath = '';
let reportPath = '';

beforeAll(async () => {
	browser = await launch();
	const page = await newPage(browser);
	await signIn(page, 'consultant@fenwick-hale.test');
	await openDemoRoom(page);
	const room = page.url();
	// Both demo visits analysed (three captures each, scripts/demo/scenario.ts), then a published comparison of them.
	for (const day of ['2026-10-06', '2026-11-17']) {
		await page.goto(room);
		await page.getByRole('link', { name: day }).first().click();
		await page.waitForURL(/\/sessions\/\d+$/);
		visits.push(new URL(page.url()).pathname);
		await page.waitForFunction(() => document.querySelectorAll('[data-testid="capture-row"][data-status="analysed"]').length === 3, null, { timeout: 90_000 });
	}
	await page.goto(room);
	await page.waitForLoadState('networkidle');
	comparisonPath = await compareDemoVisits(page, `Details check ${Date.now()}`);
	await page.waitForLoadState('networkidle');
	await page.getByRole('button', { name: 'Publish to the client' }).click();
	await page.waitForURL(/\/reports\/\d+\?published=1$/);
	reportPath = new URL(page.url()).pathname;
	await page.context().close();
});
afterAll(async () => browser?.close());

describe('the report PDF link', () => {
	for (const email of ['client@fenwick-hale.test', 'consultant@fenwick-hale.test']) {
		it(`${email.split('@')[0]}: "Download PDF" downloads the PDF with no console or page error`, async () => {
			const page = await newPage(browser);
			await signIn(page, email);
			await page.goto(reportPath);
			await page.waitForLoadState('networkidle');
			const errors: string[] = [];
			page.on('console', (m) => {
				if (m.type() === 'error') errors.push(`console: ${m.text()}`);
			});
			page.on('pageerror', (e) => errors.push(`page: ${e.message}`));
			const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download PDF' }).click()]);
			expect(await download.failure()).toBeNull();
			expect(download.suggestedFilename()).toMatch(/\.pdf$/);
			// The page stays where it was, and whatever the click set off has settled.
			await page.waitForLoadState('networkidle');
			await page.waitForTimeout(500);
			expect(new URL(page.url()).pathname).toBe(reportPath);
			expect(errors).toEqual([]);
			await page.context().close();
		});
	}
});

/**
 * Every duration ("0.55 s") in the tables of the page: its text, how many lines it takes as laid
 * out, and whether a line may break between number and unit at all (a plain space where the text
 * wraps), so a breakable duration shows whether or not this window is narrow enough to break it.
 */
async function durations(page: Page): Promise<{ text: string; lines: number; breakable: boolean }[]> {
	return page.evaluate(() => {
		const found: { text: string; lines: number; breakable: boolean }[] = [];
		const walker = document.createTreeWalker(document.querySelector('main')!, NodeFilter.SHOW_TEXT);
		for (let node = walker.nextNode() as Text | null; node; node = walker.nextNode() as Text | null) {
			const parent = node.parentElement!;
			if (!parent.closest('td, th') || parent.getClientRects().length === 0) continue;
			const style = getComputedStyle(parent) as CSSStyleDeclaration & { textWrapMode?: string };
			const wraps = !['nowrap', 'pre'].includes(style.whiteSpace) && style.textWrapMode !== 'nowrap';
			for (const m of node.data.matchAll(/\d+(?:\.\d+)?([ \u00a0])s(?![\p{L}\d])/gu)) {
				const range = document.createRange();
				range.setStart(node, m.index!);
				range.setEnd(node, m.index! + m[0].length);
				const lines = new Set([...range.getClientRects()].filter((r) => r.width > 0).map((r) => Math.round(r.top))).size;
				found.push({ text: m[0], lines, breakable: wraps && m[1] === ' ' });
			}
		}
		return found;
	});
}

describe('durations in a visit', () => {
	for (const width of [1280, 390]) {
		it(`keep number and unit on one line at ${width} px`, async () => {
			const page = await newPage(browser, { width, height: 900 });
			await signIn(page, 'acoustician@fenwick-hale.test');
			for (const visit of visits) {
				await page.goto(visit);
				await page.waitForFunction(() => document.querySelectorAll('[data-testid="capture-row"][data-status="analysed"]').length === 3);
				await page.waitForLoadState('networkidle');
				const found = await durations(page);
				// Each capture row shows its T30, EDT and length in seconds.
				expect(found.length, JSON.stringify(found)).toBeGreaterThanOrEqual(9);
				const broken = found.filter((d) => d.lines !== 1 || d.breakable);
				expect(broken, `${visit}: ${JSON.stringify(broken)}`).toEqual([]);
			}
			await page.context().close();
		});
	}
});

interface SeriesStyle {
	label: string;
	stroke: string;
	dash: number[];
}

describe('the comparison chart of reverberation per band', () => {
	it('draws the target line in another colour and dash than the "after" series', async () => {
		const page = await newPage(browser);
		// Keep each chart uPlot makes, to read the series styles it draws with.
		await page.addInitScript(() => {
			const plots: object[] = [];
			(window as unknown as { __plots: object[] }).__plots = plots;
			Object.defineProperty(Object.prototype, 'valToPosH', {
				configurable: true,
				set(value: unknown) {
					Object.defineProperty(this, 'valToPosH', { value, writable: true, enumerable: true, configurable: true });
					plots.push(this);
				}
			});
		});
		await signIn(page, 'consultant@fenwick-hale.test');
		await page.goto(comparisonPath);
		const figure = page.getByRole('figure', { name: 'Reverberation time per band, before and after' });
		await figure.locator('canvas').first().waitFor();
		await page.waitForLoadState('networkidle');
		const series = await figure.evaluate((fig) => {
			type Plot = { root: HTMLElement; series: { label?: string; stroke?: unknown; dash?: number[] }[] };
			const plots = ((window as unknown as { __plots: Plot[] }).__plots ?? []).filter((u) => u.root?.isConnected && fig.contains(u.root));
			const u = plots.at(-1);
			if (!u) return null;
			return u.series.slice(1).map((s, i) => ({
				label: String(s.label ?? ''),
				stroke: String(typeof s.stroke === 'function' ? (s.stroke as (u: Plot, i: number) => unknown)(u, i + 1) : s.stroke),
				dash: s.dash ?? []
			}));
		});
		expect(series, 'no chart drawn in the figure').not.toBeNull();
		const styles = series as SeriesStyle[];
		const target = styles.find((s) => s.label === 'Target');
		const afters = styles.filter((s) => /\bafter\b/i.test(s.label));
		expect(target, JSON.stringify(styles)).toBeDefined();
		expect(afters.map((s) => s.label)).toContain('T30 after');
		expect(target!.dash.length, 'the target line is dashed').toBeGreaterThan(0);
		for (const after of afters) {
			expect(target!.stroke.toLowerCase(), after.label).not.toBe(after.stroke.toLowerCase());
			expect(target!.dash, after.label).not.toEqual(after.dash);
		}
		await page.context().close();
	});
});
