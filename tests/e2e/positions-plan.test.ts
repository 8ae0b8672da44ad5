import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, newPage, seen, signIn } from './browser';

// The visit's plan view draws loudspeaker and microphone from their coordinates; dragging a point
// (or the arrow keys) moves it, and the new place is stored like a changed position.
let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

describe('the plan view of a visit', () => {
	it('acoustician: places a position, drags its microphone and nudges it with the keys', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('link', { name: 'Attic listening room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		await page.waitForLoadState('networkidle');
		await page.getByRole('button', { name: 'New visit' }).click();
		await page.getByLabel('Condition').fill(`plan view ${Date.now()}`);
		await page.getByRole('button', { name: 'Create visit' }).click();
		await page.waitForURL(/\/sessions\/\d+$/);
		await page.waitForLoadState('networkidle');

		await page.getByRole('button', { name: 'New position' }).click();
		await page.getByLabel('Label', { exact: true }).fill('P1');
		for (const [field, value] of [['Loudspeaker x', '0.5'], ['Loudspeaker y', '1'], ['Loudspeaker z', '1.2'], ['Microphone x', '3'], ['Microphone y', '2'], ['Microphone z', '1.1']])
			await page.getByLabel(field, { exact: true }).fill(value);
		await page.getByRole('button', { name: 'Add position' }).click();

		const plan = page.getByTestId('positions-plan');
		const mic = plan.getByTestId('mic-P1');
		expect(await seen(mic)).toBe(true);
		expect(await mic.getAttribute('aria-label')).toBe('Microphone of P1 at x 3.00 m, y 2.00 m');
		const row = page.getByTestId('position').filter({ hasText: 'P1' });
		expect(await row.innerText()).toContain('3.00, 2.00, 1.10');

		// Drag the microphone half a metre towards the back wall (down the plan: +x).
		// The drawing's own scale (the plan keeps the room's proportions inside its box).
		const metresPerPixel = await plan.locator('svg').evaluate((el) => 1 / (el as unknown as SVGSVGElement).getScreenCTM()!.a);
		// The label sits right of the circle: grab the circle itself.
		const circle = (await mic.locator('circle').boundingBox())!;
		const from = { x: circle.x + circle.width / 2, y: circle.y + circle.height / 2 };
		await page.mouse.move(from.x, from.y);
		await page.mouse.down();
		await page.mouse.move(from.x, from.y + 0.25 / metresPerPixel, { steps: 5 });
		await page.mouse.move(from.x, from.y + 0.5 / metresPerPixel, { steps: 5 });
		await page.mouse.up();
		await row.getByText(/3\.[45]\d, 2\.00, 1\.10/).waitFor();

		// Stored, not only drawn: after a reload the place holds; then 5 cm to the right with a key.
		await page.reload();
		await page.waitForLoadState('networkidle');
		const moved = /Microphone of P1 at x (\d\.\d\d) m, y 2\.00 m/.exec((await mic.getAttribute('aria-label')) ?? '');
		expect(moved).not.toBeNull();
		expect(Number(moved![1])).toBeGreaterThan(3.4);
		expect(Number(moved![1])).toBeLessThan(3.6);
		await mic.focus();
		await page.keyboard.press('ArrowRight');
		await row.getByText(`${moved![1]}, 2.05, 1.10`).waitFor();
	});
});
