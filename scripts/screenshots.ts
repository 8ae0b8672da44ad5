// Screenshots of the main pages for a role, at desktop and phone width, for people to look at.
// Usage: npx tsx scripts/screenshots.ts <email> <outdir> <path> [path …]   (against the demo on :3000)
import { chromium } from 'playwright-core';
import { mkdirSync } from 'node:fs';

const [email, outDir, ...paths] = process.argv.slice(2);
const base = process.env.BASE_URL ?? 'http://127.0.0.1:3000';
mkdirSync(outDir, { recursive: true });
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
for (const [label, viewport] of [['desktop', { width: 1280, height: 900 }], ['phone', { width: 390, height: 844 }]] as const) {
	const page = await (await browser.newContext({ baseURL: base, viewport })).newPage();
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(process.env.PASSWORD ?? 'ringdown-demo');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL('**/projects');
	for (const p of paths) {
		await page.goto(p);
		await page.waitForLoadState('networkidle');
		await page.waitForTimeout(600);
		const name = p.replace(/[^a-z0-9]+/gi, '_').replace(/^_|_$/g, '') || 'root';
		await page.screenshot({ path: `${outDir}/${name}-${label}.png`, fullPage: true });
	}
}
await browser.close();
