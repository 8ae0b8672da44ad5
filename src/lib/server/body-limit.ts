// Request bodies are capped before any route reads them. Browsers upload recordings straight to
// object storage, so pages and API routes need only small bodies; the scripted upload route is
// the one exception. A declared length over the cap is refused at once; a body without
// Content-Length (chunked) is counted as it arrives and refused when it passes the cap. The
// upload route streams its body to storage and counts each file against UPLOAD_MAX_BYTES
// itself, so the cap here only bounds the whole (two files and the fields).
import { json, type RequestEvent } from '@sveltejs/kit';
import type { AppConfig } from './config';
import { PHOTO_BODY_MAX_BYTES } from '../schemas/photos';

/** Routes that take a recording through the server (multipart: the file, a reference, fields). */
const LARGE_BODY_ROUTES = new Set(['/api/sessions/[sessionId=id]/captures/upload']);
/** Routes that take one photo through the server (multipart: the image and its caption), which re-encodes it. */
const PHOTO_ROUTES = new Set(['/sessions/[sessionId=id]/photos']);

/** What a refused body is still read (and thrown away) for, so the client sees the answer. */
const DISCARD_MAX_BYTES = 64 * 1024 * 1024;
const DISCARD_MAX_MS = 5_000;
/** Up to this cap a chunked body is read here first; above it, it is counted as it streams. */
const BUFFERED_MAX_BYTES = 8 * 1024 * 1024;

/** The largest body of the upload route: the file and its reference recording, plus the fields. */
export function uploadBodyBytes(c: Pick<AppConfig, 'UPLOAD_MAX_BYTES' | 'BODY_MAX_BYTES'>): number {
	return 2 * c.UPLOAD_MAX_BYTES + c.BODY_MAX_BYTES;
}

/** The body cap for a route (by SvelteKit route id; null when no route matched). */
export function bodyLimitFor(routeId: string | null, c: Pick<AppConfig, 'UPLOAD_MAX_BYTES' | 'BODY_MAX_BYTES'>): number {
	if (routeId !== null && LARGE_BODY_ROUTES.has(routeId)) return uploadBodyBytes(c);
	if (routeId !== null && PHOTO_ROUTES.has(routeId)) return Math.max(PHOTO_BODY_MAX_BYTES, c.BODY_MAX_BYTES);
	return c.BODY_MAX_BYTES;
}

/**
 * Enforce `limit` on the request body. Returns the 413 answer to send instead of resolving, or
 * null to go on — with `event.request` replaced when the body had to be read to be counted.
 */
export async function limitBody(event: RequestEvent, limit: number): Promise<Response | null> {
	const { request } = event;
	if (!request.body) return null;
	const declared = request.headers.get('content-length');
	if (declared !== null && /^\d+$/.test(declared.trim())) {
		// The adapter already refuses a body longer than its declared length.
		if (Number(declared) <= limit) return null;
		discard(request.body);
		return tooLarge(event, limit);
	}
	if (limit > BUFFERED_MAX_BYTES) {
		event.request = withCountedBody(request, limit);
		return null;
	}
	// Small caps: read the body here, so the route gets it whole or not at all.
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > limit) {
			discardRest(reader);
			return tooLarge(event, limit);
		}
		chunks.push(value);
	}
	const body = new Uint8Array(size);
	let at = 0;
	for (const c of chunks) body.set(c, (at += c.byteLength) - c.byteLength);
	const headers = new Headers(request.headers);
	headers.delete('transfer-encoding');
	headers.set('content-length', String(size));
	event.request = new Request(request.url, { method: request.method, headers, body, signal: request.signal });
	return null;
}

function withCountedBody(request: Request, limit: number): Request {
	let size = 0;
	const counted = request.body!.pipeThrough(
		new TransformStream<Uint8Array, Uint8Array>({
			transform(chunk, controller) {
				size += chunk.byteLength;
				if (size > limit) controller.error(new BodyTooLargeError(limit));
				else controller.enqueue(chunk);
			}
		})
	);
	return new Request(request.url, { method: request.method, headers: request.headers, body: counted, signal: request.signal, duplex: 'half' } as RequestInit);
}

export class BodyTooLargeError extends Error {
	readonly status = 413;
	constructor(readonly limit: number) {
		super(`The request body is larger than the ${describeBytes(limit)} allowed here.`);
		this.name = 'BodyTooLargeError';
	}
}

function describeBytes(n: number): string {
	const mib = n / (1024 * 1024);
	return mib >= 1 ? `${Number.isInteger(mib) ? mib : mib.toFixed(1)} MiB` : `${Math.ceil(n / 1024)} KiB`;
}

function tooLarge(event: RequestEvent, limit: number): Response {
	const message = new BodyTooLargeError(limit).message;
	const wantsJson = event.url.pathname.startsWith('/api/') || (event.request.headers.get('accept') ?? '').includes('application/json');
	return wantsJson
		? json({ message, code: 'too_large' }, { status: 413 })
		: new Response(message, { status: 413, headers: { 'content-type': 'text/plain; charset=utf-8' } });
}

/**
 * Read and drop what the client is still sending, within bounds, so its connection does not
 * reset before it reads the 413 (closing a socket with unread data makes the kernel reset it).
 * Past the bounds the connection is closed. Nothing is kept, so memory does not grow.
 */
function discard(body: ReadableStream<Uint8Array>): void {
	discardRest(body.getReader());
}

/** The same for a route that refuses before (or while) reading its body. */
export function discardRequestBody(request: Request): void {
	if (request.body && !request.bodyUsed && !request.body.locked) discard(request.body);
}

/** The same for the rest of a body a route was reading (with `reader`) when it refused. */
export function discardRest(reader: ReadableStreamDefaultReader<Uint8Array>): void {
	const timer = setTimeout(() => void reader.cancel().catch(() => {}), DISCARD_MAX_MS);
	void (async () => {
		let seen = 0;
		try {
			for (;;) {
				const { done, value } = await reader.read();
				if (done) break;
				seen += value.byteLength;
				if (seen > DISCARD_MAX_BYTES) {
					await reader.cancel();
					break;
				}
			}
		} catch {
			// the client went away, or the stream was refused by the adapter's own limit
		} finally {
			clearTimeout(timer);
		}
	})();
}
