import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import type { Knex } from 'knex';
import { launch, newPage, signIn } from './browser';
import { testDb } from '../helpers/db';
import { loadComparisonModel, loadSessionSummary } from '../../src/lib/server/results/load';
import { getComparison } from '../../src/lib/server/queries/reviews';
import { responseTable, type ResponseSeries } from '../../src/lib/charts/response-data';
import { formatBand, formatHz, formatNumber, formatSeconds, MISSING } from '../../src/lib/format';
import type { SmoothingKey } from '../../src/lib/analysis/types';
import type { ComparisonModel, SessionSummary } from '../../src/lib/results/types';

// The results pages are sent their responses at one smoothing and their octave tables only; each
// other smoothing and the one-third-octave tables are fetched when chosen. Whatever is chosen,
// the page must draw what the whole results model says — the chart's numbers at the
// one-third-octave centres, the positions' and the comparison's band tables — for the demo visit,
// its comparison and the report.
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

const SMOOTHINGS: [SmoothingKey, string][] = [
	['1', '1/1'],
	['3', '1/3'],
	['12', '1/12'],
	['24', '1/24'],
	['6', '1/6']
];

/** The chart's "Show the numbers" table of levels at one-third-octave centres, as its cells read. */
async function levelTable(chart: Locator): Promise<string[][]> {
	return chart.locator('table', { has: chart.page().locator('caption', { hasText: 'Levels at one-third-octave centres' }) }).evaluate((table) =>
		[...table.querySelectorAll('tbody tr')].map((tr) => [...tr.children].map((cell) => (cell.textContent ?? '').trim()))
	);
}

/** The same table as the chart makes it from these curves (ChartFrame: one decimal, the centre as stored). */
function expectedLevels(series: ResponseSeries[]): string[][] {
	return responseTable(series).rows.map(([f, ...levels]) => [String(f), ...levels.map((v) => (v === null ? MISSING : formatNumber(v as number, 1)))]);
}

async function choose(chart: Locator, label: string) {
	await chart.getByRole('radio', { name: `${label} octave`, exact: true }).check({ force: true });
}

async function openDemoVisit(page: Page): Promise<number> {
	await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
	await page.getByRole('link', { name: 'Attic listening room' }).click();
	await page.waitForURL(/\/rooms\/\d+$/);
	await page.getByRole('link', { name: '2026-10-06' }).click();
	await page.waitForURL(/\/sessions\/\d+$/);
	await page.waitForFunction(() => document.querySelectorAll('[data-testid="capture-row"][data-status="analysed"]').length === 3, null, { timeout: 90_000 });
	await page.reload();
	return Number(new URL(page.url()).pathname.split('/').pop());
}

describe('results drawn from what is fetched on demand', () => {
	let summary: SessionSummary;
	let comparisonId = 0;

	it('the visit draws every smoothing and the one-third-octave tables as the whole results say', async () => {
		const page = await newPage(browser);
		await signIn(page, 'consultant@fenwick-hale.test');
		const sessionId = await openDemoVisit(page);
		summary = await loadSessionSummary(k, sessionId);
		expect(summary.positions).toHaveLength(3);
		const chart = page.getByRole('figure', { name: 'Frequency response at every position' });
		const fetched: string[] = [];
		page.on('request', (r) => r.url().includes('/api/sessions/') && r.url().includes('/responses') && fetched.push(new URL(r.url()).search));
		for (const [key, label] of SMOOTHINGS) {
			await choose(chart, label);
			const series: ResponseSeries[] = [
				...summary.positions.map((p) => ({ label: p.positionLabel, tone: 'neutral' as const, freqHz: p.response.freqHz, db: p.response.smoothed[key] })),
				{ label: 'Average', tone: 'after', freqHz: summary.averageResponse!.freqHz, db: summary.averageResponse!.smoothed[key] }
			];
			const expected = expectedLevels(series);
			expect(expected.length).toBeGreaterThan(20);
			await expect.poll(() => levelTable(chart), { timeout: 10_000 }).toEqual(expected);
		}
		// Each other smoothing was fetched once; the default one came with the page.
		expect(fetched.sort()).toEqual(['?smoothing=1', '?smoothing=12', '?smoothing=24', '?smoothing=3']);

		const panel = page.locator('section', { has: page.getByRole('heading', { name: 'Positions and bands' }) }).last();
		await page.getByText('1/3 octave', { exact: true }).first().click();
		const thirdCentres = summary.thirds!.average.map((b) => b.centerHz);
		const table = panel.getByRole('table');
		await expect.poll(() => table.locator('thead th').allTextContents(), { timeout: 10_000 }).toEqual(['Position', ...thirdCentres.map(formatHz)]);
		const rows = await table.locator('tbody tr').evaluateAll((trs) => trs.map((tr) => [...tr.children].map((c) => (c.textContent ?? '').trim())));
		summary.positions.forEach((p, i) => {
			expect(rows[i]).toEqual([p.positionLabel, ...thirdCentres.map((c) => formatSeconds(p.thirdBands!.find((b) => b.centerHz === c)?.t30S ?? null))]);
		});
		expect(await page.getByTestId('spread-table').getByRole('cell', { name: '1.25 kHz', exact: true }).count()).toBe(1);
		await page.close();
	});

	async function checkComparison(page: Page, path: string, model: ComparisonModel) {
		await page.goto(path);
		const chart = page.getByRole('figure', { name: 'Frequency response, averaged over the positions' });
		await chart.waitFor();
		for (const [key, label] of SMOOTHINGS) {
			await choose(chart, label);
			const expected = expectedLevels([
				{ label: `Before (${model.baseline.conditionLabel})`, tone: 'before', freqHz: model.baseline.averageResponse!.freqHz, db: model.baseline.averageResponse!.smoothed[key] },
				{ label: `After (${model.treated.conditionLabel})`, tone: 'after', freqHz: model.treated.averageResponse!.freqHz, db: model.treated.averageResponse!.smoothed[key] }
			]);
			await expect.poll(() => levelTable(chart), { timeout: 10_000 }).toEqual(expected);
		}
		await page.getByText('1/3 octave', { exact: true }).first().click();
		const expectedRows = model.thirds!.differences.map((d) => [formatBand(d.centerHz), `${formatSeconds(d.metrics.t30S?.before)} s`, `${formatSeconds(d.metrics.t30S?.after)} s`]);
		await expect
			.poll(() => page.getByTestId('band-row').evaluateAll((trs) => trs.map((tr) => [...tr.children].slice(0, 3).map((c) => (c.textContent ?? '').trim()))), { timeout: 10_000 })
			.toEqual(expectedRows);
	}

	it('the comparison and the report draw every smoothing and the one-third-octave comparison as the whole model says', async () => {
		const session = await k('sessions').where({ id: summary.sessionId }).first('room_id');
		const treated = await k('sessions').where({ room_id: session.room_id, condition_label: 'after treatment' }).first('id');
		[comparisonId] = await k('comparisons').insert({ room_id: session.room_id, baseline_session_id: summary.sessionId, treated_session_id: treated.id, title: `On demand ${Date.now()}` });
		// The worker may still be analysing the treated visit.
		await expect.poll(async () => (await k('captures').where({ session_id: treated.id, status: 'analysed' }).count('* as n'))[0].n, { timeout: 90_000, interval: 1000 }).toBe(3);
		const model = await loadComparisonModel(k, (await getComparison(k, comparisonId))!);
		expect(model.thirds).not.toBeNull();
		const page = await newPage(browser);
		await signIn(page, 'consultant@fenwick-hale.test');
		await checkComparison(page, `/comparisons/${comparisonId}`, model);
		await checkComparison(page, `/reports/${comparisonId}`, model);
		await page.close();
	});
});
