// A multipart/form-data body written by hand over node:http, in pieces and with back-pressure,
// so a test can send files of any size without holding a copy of the whole body, and see how
// much had been sent when the answer came (a server that streams answers a refusal early).
import { request } from 'node:http';
import { randomUUID } from 'node:crypto';

export type FormPart = { name: string; value: string } | { name: string; filename: string; body: Uint8Array; contentType?: string };

export interface MultipartAnswer {
	status: number | null;
	body: string;
	/** Body bytes written when the answer's headers arrived (all of them when it came last). */
	sentAtAnswer: number;
	totalBytes: number;
	error?: string;
}

const PIECE = 256 * 1024;

function segments(parts: FormPart[], boundary: string): Uint8Array[] {
	const out: Uint8Array[] = [];
	for (const p of parts) {
		const disposition = 'filename' in p ? `form-data; name="${p.name}"; filename="${p.filename}"` : `form-data; name="${p.name}"`;
		const type = 'filename' in p ? `\r\nContent-Type: ${p.contentType ?? 'audio/wav'}` : '';
		out.push(Buffer.from(`--${boundary}\r\nContent-Disposition: ${disposition}${type}\r\n\r\n`));
		out.push('filename' in p ? p.body : Buffer.from(p.value));
		out.push(Buffer.from('\r\n'));
	}
	out.push(Buffer.from(`--${boundary}--\r\n`));
	return out;
}

/** POST `parts` to `url`; writing stops as soon as the answer has come. */
export function postMultipart(url: string, parts: FormPart[], headers: Record<string, string> = {}, opts: { timeoutMs?: number } = {}): Promise<MultipartAnswer> {
	const boundary = `form-${randomUUID()}`;
	const body = segments(parts, boundary);
	const totalBytes = body.reduce((n, b) => n + b.byteLength, 0);
	let sent = 0;
	let sentAtAnswer = -1;
	let answered = false;
	return new Promise((resolve) => {
		let settled = false;
		const finish = (a: Omit<MultipartAnswer, 'sentAtAnswer' | 'totalBytes'>) => {
			if (settled) return;
			settled = true;
			clearTimeout(timer);
			resolve({ ...a, sentAtAnswer: sentAtAnswer < 0 ? sent : sentAtAnswer, totalBytes });
			req.destroy();
		};
		const req = request(
			url,
			{ method: 'POST', agent: false, headers: { connection: 'keep-alive', ...headers, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(totalBytes) } },
			(res) => {
				answered = true;
				sentAtAnswer = sent;
				let text = '';
				res.setEncoding('utf8');
				res.on('data', (s: string) => (text += s));
				res.on('end', () => finish({ status: res.statusCode ?? null, body: text }));
				res.on('error', (e) => finish({ status: res.statusCode ?? null, body: text, error: e.message }));
			}
		);
		const timer = setTimeout(() => finish({ status: null, body: '', error: 'timed out' }), opts.timeoutMs ?? 60_000);
		req.on('error', (e) => {
			if (!answered) finish({ status: null, body: '', error: e.message });
		});
		const drained = () =>
			new Promise<void>((ok) => {
				const go = () => (req.off('drain', go), req.off('close', go), ok());
				req.once('drain', go);
				req.once('close', go);
			});
		void (async () => {
			for (const segment of body) {
				for (let at = 0; at < segment.byteLength && !answered && !settled; at += PIECE) {
					const piece = segment.subarray(at, Math.min(segment.byteLength, at + PIECE));
					sent += piece.byteLength;
					if (!req.write(piece)) await drained();
				}
			}
			if (!settled) req.end();
		})().catch(() => {});
	});
}
