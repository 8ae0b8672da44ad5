// Requests from a chosen loopback address (127.0.0.2, 127.0.0.3…): Linux answers the whole of
// 127.0.0.0/8 on the loopback interface, so a test can be several clients without trusting a
// forwarded-for header. Forms only, redirects not followed, as a browser without JavaScript posts.
import { request } from 'node:http';
import { BASE_URL } from './env';

export interface FormAnswer {
	status: number;
	location: string | null;
	setCookies: string[];
	body: string;
	ms: number;
}

export function postFormFrom(localAddress: string, path: string, fields: Record<string, string>, opts: { base?: string; origin?: string; cookie?: string } = {}): Promise<FormAnswer> {
	const base = opts.base ?? BASE_URL;
	const url = new URL(path, base);
	const body = new URLSearchParams(fields).toString();
	const t0 = performance.now();
	return new Promise((resolve, reject) => {
		const req = request(
			{
				host: url.hostname,
				port: url.port,
				path: url.pathname + url.search,
				method: 'POST',
				localAddress,
				agent: false,
				headers: {
					origin: opts.origin ?? new URL(base).origin,
					accept: 'text/html',
					'content-type': 'application/x-www-form-urlencoded',
					'content-length': Buffer.byteLength(body),
					...(opts.cookie ? { cookie: opts.cookie } : {})
				}
			},
			(res) => {
				const chunks: Buffer[] = [];
				res.on('data', (c: Buffer) => chunks.push(c));
				res.on('end', () => {
					const setCookie = res.headers['set-cookie'] ?? [];
					resolve({
						status: res.statusCode ?? 0,
						location: (res.headers.location as string | undefined) ?? null,
						setCookies: setCookie,
						body: Buffer.concat(chunks).toString('utf8'),
						ms: performance.now() - t0
					});
				});
				res.on('error', reject);
			}
		);
		req.on('error', reject);
		req.end(body);
	});
}

/** The cookie header a browser would send after these Set-Cookie lines (emptied ones left out). */
export function cookieHeaderOf(setCookies: string[]): string {
	return setCookies
		.map((c) => c.split(';')[0])
		.filter((c) => !c.endsWith('='))
		.join('; ');
}

/** A distinct loopback address per test file and index, e.g. `loopback(40, 3)` → 127.0.40.3. */
export function loopback(block: number, index: number): string {
	return `127.0.${block}.${index}`;
}
