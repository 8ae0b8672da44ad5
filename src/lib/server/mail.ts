// Outgoing mail: actions add rows to the outbox inside their transaction; the worker sends
// them through nodemailer, retrying with back-off, so a mail server problem never blocks
// or undoes the action that caused the message.
import nodemailer, { type Transporter } from 'nodemailer';
import type { Knex } from 'knex';
import { config, type AppConfig } from './config';

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html?: string;
	kind: string;
}

export async function enqueueMail(k: Knex, m: OutgoingMail): Promise<number> {
	const [id] = await k('email_outbox').insert({
		to_address: m.to,
		subject: m.subject,
		text_body: m.text,
		html_body: m.html ?? null,
		kind: m.kind
	});
	return id;
}

export function createTransport(c: AppConfig = config()): Transporter {
	return nodemailer.createTransport({
		host: c.SMTP_HOST,
		port: c.SMTP_PORT,
		secure: c.SMTP_SECURE,
		auth: c.SMTP_USER ? { user: c.SMTP_USER, pass: c.SMTP_PASSWORD ?? '' } : undefined,
		// The local sink has no TLS; a real server negotiates it.
		ignoreTLS: !c.SMTP_SECURE && c.SMTP_HOST === '127.0.0.1'
	});
}

export const MAIL_MAX_ATTEMPTS = 8;

/** Back-off before the next try: 10 s, 20 s, 40 s … capped at one hour. */
export function mailRetryDelayMs(attempts: number): number {
	return Math.min(3600_000, 10_000 * 2 ** Math.max(0, attempts - 1));
}

/**
 * Send up to `limit` due messages. Each row is claimed by pushing its next attempt into the
 * future under a row lock, so two workers never send the same message.
 */
export async function deliverDueMail(k: Knex, transport: Transporter, from: string, limit = 20): Promise<number> {
	let sent = 0;
	for (let i = 0; i < limit; i++) {
		const row = await k.transaction(async (trx) => {
			const r = await trx('email_outbox')
				.where('status', 'pending')
				.where('next_attempt_at', '<=', trx.raw('CURRENT_TIMESTAMP(3)'))
				.orderBy('id')
				.forUpdate()
				.skipLocked()
				.first();
			if (!r) return null;
			await trx('email_outbox')
				.where({ id: r.id })
				.update({
					attempts: r.attempts + 1,
					next_attempt_at: new Date(Date.now() + mailRetryDelayMs(r.attempts + 1))
				});
			return r;
		});
		if (!row) break;
		try {
			await transport.sendMail({ from, to: row.to_address, subject: row.subject, text: row.text_body, html: row.html_body ?? undefined });
			await k('email_outbox').where({ id: row.id }).update({ status: 'sent', sent_at: new Date(), last_error: null });
			sent++;
		} catch (e) {
			const failed = row.attempts + 1 >= MAIL_MAX_ATTEMPTS;
			await k('email_outbox')
				.where({ id: row.id })
				.update({ status: failed ? 'failed' : 'pending', last_error: String((e as Error).message).slice(0, 2000) });
		}
	}
	return sent;
}
