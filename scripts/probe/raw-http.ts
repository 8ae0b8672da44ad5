// Raw HTTP for abuse checks: bodies of a chosen size, with or without Content-Length, written in
// chunks so nothing large is held in memory here, and the answer taken as soon as it comes (a
// server may refuse before the body is sent). Also the resident memory of the server process.
import { request } from 'node:http';
import { readFileSync, readdirSync, readlinkSync } from 'node:fs';

export interface RawAnswer {
	/** HTTP status, or null when no answer came (connection reset, timeout). */
	status: number | null;
	headers: Record<string, string | string[] | undefined>;
	body: string;
	/** Milliseconds from the first byte sent to the end of the answer. */
	ms: number;
	/** Body bytes written before the answer came or the connection closed. */
	sentBytes: number;
	error?: string;
}

export interface RawRequest {
	method?: string;
	path: string;
	headers?: Record<string, string>;
	/** Body length in bytes (filled after `bodyStart`), 0 for none. */
	bodySize?: number;
	/** The first bytes of the body, e.g. `email=x%40y.z&password=`; the rest is filler. */
	bodyStart?: string;
	/** Send without Content-Length (chunked transfer encoding). */
	chunked?: boolean;
	timeoutMs?: number;
	/** Send from this local address (127.0.0.0/8 all reaches loopback): a different client each. */
	localAddress?: string;
}

const CHUNK = 64 * 1024;
const FILLER = Buffer.alloc(CHUNK, 'a');
const KEEP_BODY = 64 * 1024;

/** Only loopback targets: these checks are for one's own instance, never someone else's. */
export function assertLoopback(base: string): URL {
	const url = new URL(base);
	if (!['127.0.0.1', 'localhost', '[::1]'].includes(url.hostname)) throw new Error(`Refusing to probe ${url.origin}: loopback addresses only.`);
	return url;
}

export function rawRequest(base: string, r: RawRequest): Promise<RawAnswer> {
	const url = new URL(r.path, base);
	const size = r.bodySize ?? 0;
	const start = Buffer.from(r.bodyStart ?? '');
	// Keep-alive, as browsers send it: a server that refuses early may then read and drop the rest
	// (with "Connection: close" it closes at once, and the unread bytes reset the connection).
	const headers: Record<string, string> = { connection: 'keep-alive', ...r.headers };
	if (size > 0 && !r.chunked) headers['content-length'] = String(Math.max(size, start.length));
	const t0 = performance.now();

	return new Promise((resolve) => {
		let sentBytes = 0;
		let answered = false;
		let settled = false;
		const finish = (a: Omit<RawAnswer, 'ms' | 'sentBytes'>) => {
			if (settled) return;
			settled = true;
			clearTimeout(timer);
			resolve({ ...a, ms: performance.now() - t0, sentBytes });
			req.destroy();
		};
		const req = request(url, { method: r.method ?? 'POST', headers, agent: false, localAddress: r.localAddress }, (res) => {
			answered = true;
			let body = '';
			res.setEncoding('utf8');
			res.on('data', (s: string) => {
				if (body.length < KEEP_BODY) body += s;
			});
			const done = (error?: string) => finish({ status: res.statusCode ?? null, headers: res.headers, body, error });
			res.on('end', () => done());
			res.on('error', (e) => done(e.message));
			res.on('close', () => done());
		});
		const timer = setTimeout(() => finish({ status: null, headers: {}, body: '', error: 'timed out' }), r.timeoutMs ?? 30_000);
		req.on('error', (e) => {
			// Writing may fail after the server answered and closed; the answer already counts.
			if (!answered) finish({ status: null, headers: {}, body: '', error: e.message });
		});

		const write = async () => {
			if (size === 0) return req.end();
			let left = Math.max(size, start.length);
			const first = start.subarray(0, left);
			left -= first.length;
			if (first.length && !req.write(first)) await drained();
			sentBytes += first.length;
			while (left > 0 && !answered && !settled) {
				const piece = left >= CHUNK ? FILLER : FILLER.subarray(0, left);
				left -= piece.length;
				sentBytes += piece.length;
				if (!req.write(piece)) await drained();
			}
			if (!settled) req.end();
		};
		const drained = () => new Promise<void>((ok) => {
			const go = () => (req.off('drain', go), req.off('close', go), ok());
			req.once('drain', go);
			req.once('close', go);
		});
		void write().catch(() => {});
	});
}

/** The id of the local process listening on a TCP port, if this user may see it (Linux). */
export function listeningPid(port: number): number | null {
	const hex = port.toString(16).toUpperCase().padStart(4, '0');
	const inodes = new Set<string>();
	for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
		let text: string;
		try {
			text = readFileSync(table, 'utf8');
		} catch {
			continue;
		}
		for (const line of text.trim().split('\n').slice(1)) {
			const f = line.trim().split(/\s+/);
			// local_address is ADDR:PORT in hex; state 0A is LISTEN; field 9 is the socket inode.
			if (f[1]?.endsWith(`:${hex}`) && f[3] === '0A') inodes.add(f[9]);
		}
	}
	if (inodes.size === 0) return null;
	for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
		let fds: string[];
		try {
			fds = readdirSync(`/proc/${pid}/fd`);
		} catch {
			continue;
		}
		for (const fd of fds) {
			try {
				const m = /^socket:\[(\d+)\]$/.exec(readlinkSync(`/proc/${pid}/fd/${fd}`));
				if (m && inodes.has(m[1])) return Number(pid);
			} catch {
				// the descriptor closed meanwhile
			}
		}
	}
	return null;
}

/** Resident memory of a process in bytes (VmRSS), or null when it cannot be read. */
export function residentBytes(pid: number): number | null {
	try {
		const m = /^VmRSS:\s+(\d+)\s+kB/m.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
		return m ? Number(m[1]) * 1024 : null;
	} catch {
		return null;
	}
}

/** Samples a process's resident memory until stopped; reports the start and the peak. */
export function watchMemory(pid: number, everyMs = 20): { stop(): { startBytes: number; peakBytes: number } } {
	const startBytes = residentBytes(pid) ?? 0;
	let peakBytes = startBytes;
	const timer = setInterval(() => {
		peakBytes = Math.max(peakBytes, residentBytes(pid) ?? 0);
	}, everyMs);
	return {
		stop() {
			clearInterval(timer);
			peakBytes = Math.max(peakBytes, residentBytes(pid) ?? 0);
			return { startBytes, peakBytes };
		}
	};
}
