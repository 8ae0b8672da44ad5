// Upload a batch of WAV files to a visit through Ringdown's API, with a personal API token
// (account page → API tokens, scope "upload"). Uses only the public API: the scripted upload
// route, POST /api/sessions/:id/captures/upload, one file at a time, streamed from disk.
//
//   RINGDOWN_TOKEN=rdt_… npx tsx scripts/upload.ts --visit 12 --position P1 P1-*.wav
//
// Exit status: 0 every file uploaded or already in the visit, 1 some failed, 2 usage error
// (nothing sent), 3 every file failed, 4 the server refused the token or the visit (stopped).
import { createReadStream, statSync } from 'node:fs';
import { createHash, randomBytes } from 'node:crypto';
import { request as httpRequest, type IncomingHttpHeaders } from 'node:http';
import { request as httpsRequest } from 'node:https';
import { basename } from 'node:path';
import { parseArgs } from 'node:util';
import { pathToFileURL } from 'node:url';

export const EXIT = { ok: 0, someFailed: 1, usage: 2, allFailed: 3, refused: 4 } as const;

const USAGE = `Usage: npx tsx scripts/upload.ts --visit N [options] FILE.wav [FILE.wav …]

Uploads WAV recordings to a visit with a personal API token (scope "upload").

  --visit N              the visit's id (the number in /sessions/N)
  --token TOKEN          the API token; better in the environment as RINGDOWN_TOKEN
  --url URL              Ringdown's address (default http://127.0.0.1:3000)
  --position LABEL       the position of every file: the visit's position of that label, made if new
  --position-id N        or an existing position by its id
  --position-from-name   or each file's own position, named after the file (P1.wav → P1)
  --kind impulse|sweep   what the files are (default impulse)
  --channel N            the channel to analyse, from 0 (default 0)
  --sweep N              for recorded sweeps: the test signal played, by its id
  --reference FILE.wav   or the played sweep itself, sent with every file
  --help                 this text

Exit status: 0 every file uploaded or already in the visit, 1 some failed, 2 usage error
(nothing sent), 3 every file failed, 4 the token or the visit was refused (stopped).
Measurement sweeps are loud: protect your hearing and everyone's in the room when recording.`;

class UsageError extends Error {}

type Position = { positionId: number } | { newPositionLabel: string } | 'from-name';

export interface Options {
	visit: number;
	token: string;
	base: URL;
	position: Position;
	kind: 'impulse' | 'sweep';
	channel: number;
	sweep: number | null;
	reference: string | null;
	files: string[];
}

const positiveInt = (name: string, v: string | undefined): number => {
	if (v === undefined || !/^\d+$/.test(v) || Number(v) < 1) throw new UsageError(`--${name} takes a whole number from 1 (got ${v === undefined ? 'nothing' : `"${v}"`}).`);
	return Number(v);
};

const isWavName = (p: string) => /\.wave?$/i.test(p);

function checkFile(path: string, what: string): number {
	let st;
	try {
		st = statSync(path);
	} catch {
		throw new UsageError(`${what} ${path} cannot be read.`);
	}
	if (!st.isFile()) throw new UsageError(`${what} ${path} is not a file.`);
	if (!isWavName(path)) throw new UsageError(`${what} ${path} is not a .wav file.`);
	return st.size;
}

/** Read the command line (and RINGDOWN_TOKEN); throws a UsageError saying what is wrong. */
export function parseOptions(argv: string[], env: Record<string, string | undefined>): Options | 'help' {
	let parsed;
	try {
		parsed = parseArgs({
			args: argv,
			allowPositionals: true,
			strict: true,
			options: {
				visit: { type: 'string' },
				token: { type: 'string' },
				url: { type: 'string', default: 'http://127.0.0.1:3000' },
				position: { type: 'string' },
				'position-id': { type: 'string' },
				'position-from-name': { type: 'boolean', default: false },
				kind: { type: 'string', default: 'impulse' },
				channel: { type: 'string', default: '0' },
				sweep: { type: 'string' },
				reference: { type: 'string' },
				help: { type: 'boolean', default: false }
			}
		});
	} catch (e) {
		throw new UsageError((e as Error).message);
	}
	const v = parsed.values;
	if (v.help) return 'help';
	const visit = positiveInt('visit', v.visit);
	const token = v.token ?? env.RINGDOWN_TOKEN ?? '';
	if (!token) throw new UsageError('Give the API token: --token, or RINGDOWN_TOKEN in the environment.');
	let base: URL;
	try {
		base = new URL(v.url!);
	} catch {
		throw new UsageError(`--url ${v.url} is not an address.`);
	}
	if (base.protocol !== 'http:' && base.protocol !== 'https:') throw new UsageError('--url must start with http:// or https://.');

	const positions = [v.position !== undefined, v['position-id'] !== undefined, v['position-from-name']].filter(Boolean).length;
	if (positions !== 1) throw new UsageError('Say where the files were recorded, once: --position LABEL, --position-id N or --position-from-name.');
	let position: Position;
	if (v.position !== undefined) {
		const label = v.position.trim();
		if (label.length < 1 || label.length > 80) throw new UsageError('--position takes a label of 1 to 80 characters.');
		position = { newPositionLabel: label };
	} else if (v['position-id'] !== undefined) position = { positionId: positiveInt('position-id', v['position-id']) };
	else position = 'from-name';

	if (v.kind !== 'impulse' && v.kind !== 'sweep') throw new UsageError('--kind is impulse or sweep.');
	if (!/^[0-7]$/.test(v.channel!)) throw new UsageError('--channel takes 0 to 7.');
	const sweep = v.sweep === undefined ? null : positiveInt('sweep', v.sweep);
	const reference = v.reference ?? null;
	if (v.kind === 'sweep' && (sweep === null) === (reference === null)) throw new UsageError('A recorded sweep needs the sweep that was played: --sweep N or --reference FILE.wav (one of them).');
	if (v.kind === 'impulse' && (sweep !== null || reference !== null)) throw new UsageError('An impulse response needs no --sweep or --reference (or say --kind sweep).');
	if (reference) checkFile(reference, 'The reference');

	const files = parsed.positionals;
	if (files.length === 0) throw new UsageError('Name at least one WAV file to upload.');
	for (const f of files) checkFile(f, 'File');
	if (position === 'from-name') {
		for (const f of files) {
			const label = basename(f).replace(/\.wave?$/i, '');
			if (label.length < 1 || label.length > 80) throw new UsageError(`${f}: a position named after the file needs a name of 1 to 80 characters.`);
		}
	}
	return { visit, token, base, position, kind: v.kind, channel: Number(v.channel), sweep, reference, files };
}

// --- HTTP: a multipart body streamed from disk, with its length known up front ---------------

type Part = { kind: 'bytes'; bytes: Buffer } | { kind: 'file'; path: string; size: number };

interface Answer {
	status: number;
	headers: IncomingHttpHeaders;
	body: string;
}

function multipart(fields: [string, string][], files: { name: string; path: string; filename: string }[]): { boundary: string; parts: Part[]; length: number } {
	const boundary = `----ringdown-upload-${randomBytes(12).toString('hex')}`;
	const quote = (s: string) => s.replace(/["\\\r\n]/g, '_');
	const parts: Part[] = [];
	for (const [name, value] of fields) {
		parts.push({ kind: 'bytes', bytes: Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`) });
	}
	for (const f of files) {
		parts.push({ kind: 'bytes', bytes: Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${f.name}"; filename="${quote(f.filename)}"\r\nContent-Type: audio/wav\r\n\r\n`) });
		parts.push({ kind: 'file', path: f.path, size: statSync(f.path).size });
		parts.push({ kind: 'bytes', bytes: Buffer.from('\r\n') });
	}
	parts.push({ kind: 'bytes', bytes: Buffer.from(`--${boundary}--\r\n`) });
	const length = parts.reduce((n, p) => n + (p.kind === 'bytes' ? p.bytes.byteLength : p.size), 0);
	return { boundary, parts, length };
}

/** POST the parts; `onSent` hears the bytes written so far. An answer that comes early (a refusal) is kept. */
function post(url: URL, headers: Record<string, string>, body: ReturnType<typeof multipart>, onSent: (bytes: number) => void): Promise<Answer> {
	const send = url.protocol === 'https:' ? httpsRequest : httpRequest;
	return new Promise((resolve, reject) => {
		let answered = false;
		const req = send(url, {
			method: 'POST',
			headers: { ...headers, 'content-type': `multipart/form-data; boundary=${body.boundary}`, 'content-length': String(body.length) }
		});
		req.on('response', (res) => {
			answered = true;
			const chunks: Buffer[] = [];
			res.on('data', (c: Buffer) => chunks.push(c));
			res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString('utf8') }));
			res.on('error', reject);
		});
		req.on('error', (e) => {
			if (!answered) reject(e);
		});
		(async () => {
			let sent = 0;
			for (const p of body.parts) {
				if (answered) break;
				const chunks = p.kind === 'bytes' ? [p.bytes] : createReadStream(p.path, { highWaterMark: 256 * 1024 });
				for await (const chunk of chunks as AsyncIterable<Buffer> | Buffer[]) {
					if (answered) break;
					if (!req.write(chunk)) await new Promise<void>((r) => req.once('drain', () => r()));
					sent += chunk.byteLength;
					onSent(sent);
				}
			}
			req.end();
		})().catch((e) => {
			req.destroy(e as Error);
			if (!answered) reject(e);
		});
	});
}

// --- One file ----------------------------------------------------------------------------------

export type Result =
	| { file: string; size: number; result: 'uploaded'; captureId: number; position: string; note: string }
	| { file: string; size: number; result: 'duplicate'; captureId: number | null; position: string; note: string }
	| { file: string; size: number; result: 'failed' | 'not sent'; captureId: null; position: string; note: string };

function sha256Of(path: string): Promise<string> {
	return new Promise((resolve, reject) => {
		const h = createHash('sha256');
		createReadStream(path)
			.on('data', (c) => h.update(c))
			.on('end', () => resolve(h.digest('hex')))
			.on('error', reject);
	});
}

function messageOf(a: Answer): string {
	try {
		const j = JSON.parse(a.body) as { message?: string; errors?: Record<string, string> };
		const fields = j.errors ? Object.entries(j.errors).map(([k, v]) => `${k}: ${v}`) : [];
		return [j.message ?? `HTTP ${a.status}`, ...fields].join(' — ');
	} catch {
		return a.body.trim().slice(0, 200) || `HTTP ${a.status}`;
	}
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const TRIES = 4;
const MAX_WAIT_S = 60;

async function uploadOne(o: Options, file: string, onSent: (bytes: number, total: number) => void): Promise<{ answer: Answer } | { error: Error }> {
	const positionLabel = basename(file).replace(/\.wave?$/i, '');
	const fields: [string, string][] = [
		['kind', o.kind],
		['channel', String(o.channel)],
		['filename', basename(file)],
		['sha256', await sha256Of(file)]
	];
	if (o.position === 'from-name') fields.push(['newPositionLabel', positionLabel]);
	else if ('positionId' in o.position) fields.push(['positionId', String(o.position.positionId)]);
	else fields.push(['newPositionLabel', o.position.newPositionLabel]);
	if (o.sweep !== null) fields.push(['sweepDefinitionId', String(o.sweep)]);
	// Fields first, so the server can refuse a wrong one before the file is sent; the reference
	// before the recording.
	const files = [...(o.reference ? [{ name: 'reference', path: o.reference, filename: basename(o.reference) }] : []), { name: 'file', path: file, filename: basename(file) }];
	const url = new URL(`api/sessions/${o.visit}/captures/upload`, o.base.href.endsWith('/') ? o.base : new URL(`${o.base.href}/`));
	const headers = { authorization: `Bearer ${o.token}`, accept: 'application/json', 'user-agent': 'ringdown-upload/1' };
	for (let attempt = 1; ; attempt++) {
		const body = multipart(fields, files);
		try {
			const answer = await post(url, headers, body, (n) => onSent(n, body.length));
			// Busy or briefly down: wait as the server asks (bounded), then send the file again.
			if ((answer.status === 429 || answer.status === 503) && attempt < TRIES) {
				const wait = Math.min(Number(answer.headers['retry-after']) || 2 ** attempt, MAX_WAIT_S);
				await sleep(wait * 1000);
				continue;
			}
			return { answer };
		} catch (e) {
			if (attempt >= TRIES) return { error: e as Error };
			await sleep(1000 * attempt);
		}
	}
}

// --- The batch ---------------------------------------------------------------------------------

const kb = (n: number) => (n >= 1024 * 1024 ? `${(n / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(n / 1024))} kB`);

export function table(results: Result[]): string {
	const head = ['file', 'size', 'result', 'capture', 'position', 'note'];
	const rows = results.map((r) => [r.file, kb(r.size), r.result, r.captureId === null ? '—' : String(r.captureId), r.position || '—', r.note]);
	const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
	const line = (cells: string[]) => cells.map((c, i) => (i === cells.length - 1 ? c : c.padEnd(widths[i]))).join('  ').trimEnd();
	return [line(head), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

export function exitCodeOf(results: Result[], refused: boolean): number {
	if (refused) return EXIT.refused;
	const good = results.filter((r) => r.result === 'uploaded' || r.result === 'duplicate').length;
	if (good === results.length) return EXIT.ok;
	return good === 0 ? EXIT.allFailed : EXIT.someFailed;
}

export async function run(o: Options, out: { log: (s: string) => void; progress: ((s: string) => void) | null }): Promise<number> {
	const results: Result[] = [];
	let refused = false;
	const n = o.files.length;
	for (const [i, file] of o.files.entries()) {
		const name = basename(file);
		const size = statSync(file).size;
		const tag = `[${i + 1}/${n}] ${name}`;
		if (refused) {
			results.push({ file: name, size, result: 'not sent', captureId: null, position: '', note: 'stopped: the token or the visit was refused' });
			continue;
		}
		out.progress?.(`${tag} 0 %`);
		const sent = await uploadOne(o, file, (bytes, total) => out.progress?.(`${tag} ${Math.floor((100 * bytes) / total)} %`));
		out.progress?.('');
		if ('error' in sent) {
			const note = `could not reach ${o.base.origin}: ${(sent.error as NodeJS.ErrnoException).code ?? sent.error.message}`;
			results.push({ file: name, size, result: 'failed', captureId: null, position: '', note });
			out.log(`${tag}: failed — ${note}`);
			continue;
		}
		const a = sent.answer;
		let body: { capture?: { id: number; status: string; positionLabel: string }; duplicateOf?: number; code?: string } = {};
		try {
			body = JSON.parse(a.body);
		} catch {
			/* not JSON: reported by its text */
		}
		if (a.status === 201 && body.capture) {
			results.push({ file: name, size, result: 'uploaded', captureId: body.capture.id, position: body.capture.positionLabel, note: body.capture.status });
			out.log(`${tag}: uploaded as capture ${body.capture.id} (${body.capture.status}), position ${body.capture.positionLabel}`);
		} else if (a.status === 409 && body.code === 'duplicate') {
			const note = messageOf(a);
			results.push({ file: name, size, result: 'duplicate', captureId: body.duplicateOf ?? null, position: '', note });
			out.log(`${tag}: duplicate — ${note}`);
		} else {
			const note = `${a.status}: ${messageOf(a)}`;
			results.push({ file: name, size, result: 'failed', captureId: null, position: '', note });
			out.log(`${tag}: failed — ${note}`);
			// Every other file would meet the same refusal: a token that is not valid (401), one
			// without the scope or a role that may not upload (403), a visit out of reach (404).
			if (a.status === 401 || a.status === 403 || a.status === 404) refused = true;
		}
	}
	out.log('');
	out.log(table(results));
	const count = (r: Result['result']) => results.filter((x) => x.result === r).length;
	out.log('');
	out.log(`${n} file${n === 1 ? '' : 's'}: ${count('uploaded')} uploaded, ${count('duplicate')} already in the visit, ${count('failed')} failed${count('not sent') ? `, ${count('not sent')} not sent` : ''}`);
	if (refused) out.log('The server refused the token or the visit: check the token (its scopes, its expiry) on your account page, and the visit number.');
	return exitCodeOf(results, refused);
}

async function main(): Promise<void> {
	let options;
	try {
		options = parseOptions(process.argv.slice(2), process.env);
	} catch (e) {
		if (!(e instanceof UsageError)) throw e;
		console.error(`${e.message}\n\n${USAGE}`);
		process.exit(EXIT.usage);
	}
	if (options === 'help') {
		console.log(USAGE);
		return;
	}
	const tty = process.stderr.isTTY;
	let last = 0;
	const code = await run(options, {
		log: (s) => console.log(s),
		// On a terminal: one line per file, its share sent updated in place (a few times a second).
		progress: tty
			? (s) => {
					const now = Date.now();
					if (s !== '' && now - last < 200 && !s.endsWith(' 0 %') && !s.endsWith(' 100 %')) return;
					last = now;
					process.stderr.write(`\r\x1b[2K${s}`);
				}
			: null
	});
	process.exit(code);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await main();
