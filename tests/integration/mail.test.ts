import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import nodemailer from 'nodemailer';
import { testDb } from '../helpers/db';
import { waitForMail } from '../helpers/mail';
import { createTransport, deliverDueMail, enqueueMail, MAIL_MAX_ATTEMPTS } from '../../src/lib/server/mail';
import { loadConfig } from '../../src/lib/server/config';

// The outbox: a failed send is retried later and never lost; a good one reaches the sink.
let k: Knex;
beforeAll(() => {
	k = testDb();
});
afterAll(async () => k.destroy());

describe('e-mail outbox', () => {
	it('retries after a failed send and delivers once the server answers', async () => {
		const to = `outbox-${Date.now()}@example.test`;
		// Other tests may have queued mail; deliver it first so our row is the one tried.
		const live = createTransport(loadConfig(process.env));
		while ((await deliverDueMail(k, live, 'Ringdown <no-reply@ringdown.test>')) > 0);
		const id = await enqueueMail(k, { to, subject: 'Outbox check', text: 'Plain text with a link: http://127.0.0.1/x', kind: 'test' });

		const dead = nodemailer.createTransport({ host: '127.0.0.1', port: 9, connectionTimeout: 500, greetingTimeout: 500 });
		expect(await deliverDueMail(k, dead, 'Ringdown <no-reply@ringdown.test>')).toBe(0);
		const failed = await k('email_outbox').where({ id }).first();
		expect(failed).toMatchObject({ status: 'pending', attempts: 1 });
		expect(failed.last_error).toBeTruthy();
		expect(new Date(failed.next_attempt_at).getTime()).toBeGreaterThan(Date.now()); // backed off

		await k('email_outbox').where({ id }).update({ next_attempt_at: new Date(Date.now() - 1000) });
		expect(await deliverDueMail(k, live, 'Ringdown <no-reply@ringdown.test>')).toBeGreaterThanOrEqual(1);
		expect((await k('email_outbox').where({ id }).first()).status).toBe('sent');
		const m = await waitForMail(to, /Outbox check/);
		expect(m.text).toContain('http://127.0.0.1/x');
		live.close();
	});

	it(`gives up after ${MAIL_MAX_ATTEMPTS} attempts and marks the message failed`, async () => {
		const id = await enqueueMail(k, { to: `never-${Date.now()}@example.test`, subject: 'Never', text: 'x', kind: 'test' });
		await k('email_outbox').where({ id }).update({ attempts: MAIL_MAX_ATTEMPTS - 1 });
		const dead = nodemailer.createTransport({ host: '127.0.0.1', port: 9, connectionTimeout: 500, greetingTimeout: 500 });
		await deliverDueMail(k, dead, 'x@example.test');
		expect((await k('email_outbox').where({ id }).first()).status).toBe('failed');
	});
});
