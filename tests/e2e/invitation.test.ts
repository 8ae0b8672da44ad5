import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, newPage, signIn } from './browser';
import { firstLink, waitForMail } from '../helpers/mail';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => browser?.close());

describe('invitation by e-mail', () => {
	it('admin invites, the invitee reads the mail, sets a password and signs in', async () => {
		const email = `new.consultant.${Date.now()}@example.test`;
		const admin = await newPage(browser);
		await signIn(admin, 'admin@fenwick-hale.test');
		await admin.goto('/organization');
		const invite = admin.locator('form', { has: admin.getByRole('button', { name: 'Send invitation' }) });
		await invite.getByLabel('E-mail').fill(email);
		await invite.getByLabel('Role').selectOption('consultant');
		await invite.getByRole('button', { name: 'Send invitation' }).click();
		await admin.getByText(`Invitation sent to ${email}`).waitFor();

		// The worker delivers the outbox to the mail sink.
		const mail = await waitForMail(email, /invited to Fenwick & Hale Acoustics/);
		expect(mail.text).toContain('as consultant');
		const link = firstLink(mail.text);

		const invitee = await newPage(browser);
		await invitee.goto(link);
		await invitee.getByLabel('Your name').fill('Ada Newcomer');
		await invitee.getByLabel('Password', { exact: true }).fill('a brand new password');
		await invitee.getByLabel('Password again').fill('a brand new password');
		await invitee.getByRole('button', { name: 'Set password' }).click();
		await invitee.waitForURL(/\/signin\?reset=1$/);

		await signIn(invitee, email, 'a brand new password');
		expect(await invitee.getByRole('link', { name: 'Lindqvist listening room' }).isVisible()).toBe(true);

		// The link is spent.
		const again = await invitee.goto(link);
		expect(again?.status()).toBe(410);
	});
});
