// A local mail sink: an SMTP server that nodemailer sends to, keeping every message, and a
// small HTTP side to read them — a web view for people, JSON for the tests.
import { createServer, type Server as HttpServer } from 'node:http';
import { appendFileSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { RunningService } from './mariadb';

export interface MailSinkOptions {
	dir: string;
	smtpPort: number;
	httpPort: number;
}

export interface SunkMessage {
	id: number;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
}

const escapeHtml = (s: string) =>
	s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export async function startMailSink(o: MailSinkOptions): Promise<RunningService> {
	mkdirSync(o.dir, { recursive: true });
	const store = join(o.dir, 'messages.jsonl');
	const messages: SunkMessage[] = existsSync(store)
		? readFileSync(store, 'utf8')
				.split('\n')
				.filter(Boolean)
				.map((l) => JSON.parse(l) as SunkMessage)
		: [];

	const smtp = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		logger: false,
		onData(stream, session, callback) {
			simpleParser(stream)
				.then((mail) => {
					const m: SunkMessage = {
						id: (messages.at(-1)?.id ?? 0) + 1,
						receivedAt: new Date().toISOString(),
						from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
						to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
						subject: mail.subject ?? '',
						text: mail.text ?? '',
						html: typeof mail.html === 'string' ? mail.html : null
					};
					messages.push(m);
					appendFileSync(store, JSON.stringify(m) + '\n');
					callback();
				})
				.catch((e: Error) => callback(e));
		}
	});
	await new Promise<void>((resolve, reject) => {
		smtp.once('error', reject);
		smtp.listen(o.smtpPort, '127.0.0.1', () => resolve());
	});

	const http: HttpServer = createServer((req, res) => {
		const url = new URL(req.url ?? '/', 'http://127.0.0.1');
		if (url.pathname === '/api/messages' && req.method === 'GET') {
			const to = url.searchParams.get('to')?.toLowerCase();
			const list = to ? messages.filter((m) => m.to.includes(to)) : messages;
			res.writeHead(200, { 'content-type': 'application/json' });
			res.end(JSON.stringify(list));
			return;
		}
		if (url.pathname === '/api/messages' && req.method === 'DELETE') {
			messages.length = 0;
			writeFileSync(store, '');
			res.writeHead(204).end();
			return;
		}
		if (url.pathname === '/' && req.method === 'GET') {
			const rows = [...messages]
				.reverse()
				.map(
					(m) =>
						`<article><h2>${escapeHtml(m.subject)}</h2><p class="meta">to ${escapeHtml(m.to.join(', '))} · ${escapeHtml(m.receivedAt)}</p><pre>${escapeHtml(m.text)}</pre></article>`
				)
				.join('');
			res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
			res.end(
				`<!doctype html><meta charset="utf-8"><title>Ringdown mail sink</title><style>body{font:14px/1.5 system-ui;margin:2rem auto;max-width:60rem;color:#1d2430;background:#f7f5f0}article{background:#fff;border:1px solid #ddd;padding:1rem;margin:1rem 0}pre{white-space:pre-wrap;font:13px ui-monospace,monospace}.meta{color:#4a5566}</style><h1>Mail sink · ${messages.length} message(s)</h1>${rows || '<p>No mail yet.</p>'}`
			);
			return;
		}
		res.writeHead(404).end();
	});
	await new Promise<void>((resolve, reject) => {
		http.once('error', reject);
		http.listen(o.httpPort, '127.0.0.1', () => resolve());
	});

	return {
		name: 'mail sink',
		async stop() {
			await new Promise<void>((r) => http.close(() => r()));
			await new Promise<void>((r) => smtp.close(() => r()));
		}
	};
}
