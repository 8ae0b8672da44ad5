// Steps the browser-measurement tests share: a test signal and a visit of their own, the
// measurement page opened from the visit, the audio started and a level check played.
import type { Locator, Page } from 'playwright-core';
import { seen } from './browser';

export interface SignalFields {
	f1Hz: number;
	f2Hz: number;
	durationS: number;
	silenceS: number;
	sampleRate: number;
}

/** Make a test signal on the test-signal page; its id comes from its download link. */
export async function createTestSignal(page: Page, name: string, s: SignalFields): Promise<{ id: number; name: string }> {
	await page.goto('/signal');
	await page.waitForLoadState('networkidle');
	await page.getByLabel('Name').fill(name);
	await page.getByLabel('Sample rate').selectOption(String(s.sampleRate));
	await page.getByLabel('From').fill(String(s.f1Hz));
	await page.getByLabel('To').fill(String(s.f2Hz));
	await page.getByLabel('Sweep length').fill(String(s.durationS));
	await page.getByLabel('Silence after').fill(String(s.silenceS));
	await page.getByRole('button', { name: 'Make test signal' }).click();
	const item = page.getByRole('listitem').filter({ hasText: name });
	if (!(await seen(item, 15_000))) throw new Error(`the test signal "${name}" was not made`);
	const href = await item.getByRole('link', { name: 'Download WAV' }).getAttribute('href');
	return { id: Number(href!.match(/\/api\/sweeps\/(\d+)\//)![1]), name };
}

/** A visit of its own in the demo room, so the demo's visits stay as they are. */
export async function newVisit(page: Page, condition: string): Promise<string> {
	await page.goto('/projects');
	await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
	await page.getByRole('link', { name: 'Attic listening room' }).click();
	await page.waitForURL(/\/rooms\/\d+$/);
	await page.getByRole('button', { name: 'New visit' }).click();
	await page.getByLabel('Condition').fill(condition);
	await page.getByRole('button', { name: 'Create visit' }).click();
	await page.waitForURL(/\/sessions\/\d+$/);
	return new URL(page.url()).pathname;
}

export async function openMeasurePage(page: Page, visitUrl: string): Promise<void> {
	await page.goto(visitUrl);
	await page.getByRole('link', { name: 'Measure in the browser' }).click();
	await page.waitForURL(/\/sessions\/\d+\/measure$/);
	await page.waitForLoadState('networkidle');
}

/** Choose the signal, start the audio, confirm the caution and play the level check; its report. */
export async function startAndCheckLevel(page: Page, signalName: string): Promise<Locator> {
	await page.getByRole('combobox', { name: /^Test signal/ }).selectOption({ label: signalName });
	await page.getByRole('button', { name: 'Start the audio' }).click();
	await page.getByTestId('input-processing').waitFor();
	// Nothing plays before the hearing caution is confirmed.
	const play = page.getByRole('button', { name: 'Play the level check' });
	if (!(await play.isDisabled())) throw new Error('the level check could be played before the caution was confirmed');
	await page.getByLabel(/playback volume is turned down/).check();
	await play.click();
	const check = page.getByTestId('level-check');
	await check.waitFor({ timeout: 60_000 });
	return check;
}
