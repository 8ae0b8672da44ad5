// ad-hoc: npx tsx scripts/tmp-shot.ts email path out.png [selector] [width]
import { chromium } from 'playwright-core';
const [email, path, out, selector, width] = process.argv.slice(2);
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--no-first-run'] });
const page = await (await browser.newContext({ baseURL: 'http://127.0.0.1:3000', viewport: { width: Number(width ?? 1280), height: 900 } })).newPage();
await page.goto('/signin');
await page.waitForLoadState('networkidle');
await page.getByLabel('E-mail').fill(email);
await page.getByLabel('Password').fill('ringdown-demo');
await page.getByRole('button', { name: 'Sign in' }).click();
await page.waitForURL('**/projects');
await page.goto(path);
await page.waitForLoadState('networkidle');
await page.waitForTimeout(500);
if (selector) await page.locator(selector).first().screenshot({ path: out });
else await page.screenshot({ path: out, fullPage: true });
await browser.close();
