import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import type { Knex } from 'knex';
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { launch, newPage, seen, shots, signIn } from './browser';
import { testDb } from '../helpers/db';
import { hashPassword } from '../../src/lib/server/auth/password';

// An acoustician who works in feet and inches creates a room in feet, places a position in feet,
// and reads feet and inches back on the room, project, visit (plan view), treatment plan and
// report pages and in the PDF, while the database keeps metres. 1 in = 25.4 mm exactly
// (international yard and pound agreement, 1959; NIST SP 811, Appendix B).
const FIXTURES = join(import.meta.dirname, '../../fixtures');
const PASSWORD = 'feet and inches 1959';
let browser: Browser;
let k: Knex;
let email: string;

beforeAll(async () => {
	browser = await launch();
	k = testDb();
	// A member of the demo practice with the imperial choice made on the account page.
	const { organization_id: organizationId } = await k('memberships as m').join('users as u', 'u.id', 'm.user_id').where('u.email', 'acoustician@fenwick-hale.test').first('m.organization_id');
	email = `imperial-${Date.now()}@fenwick-hale.test`;
	const [userId] = await k('users').insert({ email, name: 'Imperial Acoustician', password_hash: await hashPassword(PASSWORD), unit_system: 'imperial' });
	await k('memberships').insert({ user_id: userId, organization_id: organizationId, role: 'acoustician' });
});
afterAll(async () => {
	await browser?.close();
	await k?.destroy();
});

async function visitWithOneCapture(page: Page, roomUrl: string, condition: string, fixture: string): Promise<void> {
	await page.goto(roomUrl);
	await page.getByRole('button', { name: 'New visit' }).click();
	await page.getByLabel('Condition').fill(condition);
	await page.getByRole('button', { name: 'Create visit' }).click();
	await page.waitForURL(/\/sessions\/\d+$/);
	await page.waitForLoadState('networkidle');
	await page.getByLabel('Choose WAV files').setInputFiles(join(FIXTURES, fixture));
	await page.getByRole('button', { name: 'Upload 1 file' }).click();
	await page.getByTestId('upload-item').getByText('Uploaded', { exact: true }).waitFor({ timeout: 30_000 });
	await page.waitForFunction(() => document.querySelector('[data-testid="capture-row"][data-status="analysed"]') !== null, null, { timeout: 60_000 });
}

describe('an imperial user', () => {
	it('creates a room in feet and inches and reads feet on the room, plan and report pages', async () => {
		const page = await newPage(browser);
		await signIn(page, email, PASSWORD);
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		await page.getByRole('button', { name: 'New room' }).click();
		const name = `Den in feet ${Date.now()}`;
		await page.getByLabel('Room name').fill(name);
		// Three ways of writing feet and inches: 16' 5" = 197 in, 12 ft 6 in = 150 in, 96 in = 8 ft.
		await page.getByLabel('Length').fill(`16' 5"`);
		await page.getByLabel('Width').fill('12 ft 6 in');
		await page.getByLabel('Height').fill('96 in');
		await shots(page, 'imperial-room-form');
		await page.getByRole('button', { name: 'Create room' }).click();
		await page.waitForURL(/\/rooms\/\d+$/);
		const roomUrl = new URL(page.url()).pathname;

		// Stored in metres: 197 in = 5.0038 m, 150 in = 3.81 m, 96 in = 2.4384 m (to the millimetre).
		const row = await k('rooms').where({ name }).first('length_m', 'width_m', 'height_m');
		expect([Number(row.length_m), Number(row.width_m), Number(row.height_m)]).toEqual([5.004, 3.81, 2.438]);

		// The volume of the stored lengths: 5.004 × 3.81 × 2.438 = 46.481 m³ = 1641.5 ft³ (÷ 0.3048³).
		expect(await seen(page.getByText('16′ 5″ × 12′ 6″ × 8′ 0″ · 1641 ft³'))).toBe(true);
		await page.getByRole('button', { name: 'Edit room' }).click();
		expect(await page.getByLabel('Length').inputValue()).toBe(`16' 5"`);
		expect(await page.getByLabel('Width').inputValue()).toBe(`12' 6"`);

		// The project's list of rooms.
		await page.goto('/projects');
		await page.getByRole('link', { name: 'Lindqvist listening room' }).click();
		const roomRow = page.getByRole('row').filter({ hasText: name });
		expect(await roomRow.innerText()).toContain('16′ 5″ × 12′ 6″ × 8′ 0″');
		expect(await roomRow.innerText()).toContain('1641 ft³');

		// A visit; its position placed in feet and inches, drawn on the plan with its labels in feet.
		await visitWithOneCapture(page, roomUrl, 'before, in feet', 'decay-t0.5-48k.wav');
		await page.getByTestId('position').filter({ hasText: 'P1' }).getByRole('button', { name: 'Change' }).click();
		const edit = page.getByRole('form', { name: 'Change position P1' });
		for (const [label, value] of [['Loudspeaker x', `2'`], ['Loudspeaker y', `6' 3"`], ['Loudspeaker z', '4 ft'], ['Microphone x', `11' 6 1/2"`], ['Microphone y', '75 in'], ['Microphone z', '42']]) {
			await edit.getByLabel(label, { exact: true }).fill(value);
		}
		// A bare 42 is feet, taller than the room: refused in feet and inches.
		await edit.getByRole('button', { name: 'Save position' }).click();
		expect(await seen(page.getByText('Must lie inside the room (0 – 8′ 0″).'))).toBe(true);
		await shots(page, 'imperial-position-form');
		await page.getByRole('form', { name: 'Change position P1' }).getByLabel('Microphone z', { exact: true }).fill('42 in');
		await page.getByRole('form', { name: 'Change position P1' }).getByRole('button', { name: 'Save position' }).click();
		await page.getByTestId('positions-plan').waitFor();
		const p1 = page.getByTestId('position').filter({ hasText: 'P1' });
		expect(await p1.innerText()).toContain('2′ 0″, 6′ 3″, 4′ 0″');
		expect(await p1.innerText()).toContain('11′ 6 1/2″, 6′ 3″, 3′ 6″');
		expect(await page.getByTestId('plan-width').textContent()).toBe('front wall · 12′ 6″');
		expect(await page.getByTestId('plan-length').textContent()).toBe('left wall · 16′ 5″');
		expect(await page.getByTestId('mic-P1').getAttribute('aria-label')).toBe('Microphone of P1 at x 11′ 6 1/2″, y 6′ 3″');
		const mic = await k('positions as p').join('sessions as s', 's.id', 'p.session_id').join('rooms as r', 'r.id', 's.room_id').where({ 'r.name': name, 'p.label': 'P1' }).first('p.mic_x_m', 'p.mic_z_m');
		expect([Number(mic.mic_x_m), Number(mic.mic_z_m)]).toEqual([3.518, 1.067]); // 138.5 in = 3.5179 m, 42 in = 1.0668 m
		await shots(page, 'imperial-visit');

		// A second visit, a comparison of the two, and its report.
		await visitWithOneCapture(page, roomUrl, 'after, in feet', 'stereo-t0.3-t0.6-48k.wav');
		await page.goto(roomUrl);
		await shots(page, 'imperial-room');
		const compare = page.getByRole('form', { name: 'Compare two visits' });
		await compare.getByLabel('Before', { exact: true }).selectOption({ label: `before, in feet — ${today()}` });
		await compare.getByLabel('After', { exact: true }).selectOption({ label: `after, in feet — ${today()}` });
		await compare.getByRole('button', { name: 'Compare visits' }).click();
		await page.waitForURL(/\/comparisons\/\d+$/);
		await page.getByRole('link', { name: 'Preview the report' }).click();
		await page.waitForURL(/\/reports\/\d+$/);
		expect(await seen(page.getByText('16′ 5″ × 12′ 6″ × 8′ 0″, 1641 ft³'))).toBe(true);
		await shots(page, 'imperial-report');

		const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download PDF' }).click()]);
		const file = join(mkdtempSync(join(tmpdir(), 'imperial-report-')), 'report.pdf');
		await download.saveAs(file);
		const text = spawnSync('/usr/bin/pdftotext', [file, '-'], { encoding: 'utf8' });
		expect(text.status, 'pdftotext (poppler-utils) must be installed').toBe(0);
		expect(text.stdout).toContain('16′ 5″ × 12′ 6″ × 8′ 0″');
		expect(text.stdout).toContain('1641 ft³');
		expect(text.stdout).not.toContain('5.00 × 3.81');

		// The treatment plan page follows the user's inches too.
		await page.goto(`${roomUrl}/plan`);
		expect(await seen(page.getByText(/16′ 5″ × 12′ 6″ × 8′ 0″ · 1641 ft³ · \d+ ft² of surface/))).toBe(true);
		await shots(page, 'imperial-plan');
	});
});

const today = () => new Date().toISOString().slice(0, 10);

