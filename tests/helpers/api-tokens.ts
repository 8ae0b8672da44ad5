// Personal API tokens for tests: made straight in the database (as the account page's service
// makes them: only the hash stored), and requests sent with them as a script would — no cookies,
// no Origin, the token in the Authorization header.
import type { Knex } from 'knex';
import { request } from 'node:http';
import type { TokenScope } from '../../src/lib/roles';
import { newApiToken } from '../../src/lib/server/api-tokens/service';
import { BASE_URL } from './env';

export async function makeApiToken(
	k: Knex,
	userId: number,
	scopes: TokenScope[],
	opts: { name?: string; expiresAt?: Date } = {}
): Promise<{ id: number; token: string }> {
	const { token, tokenHash, hint } = newApiToken();
	const user = await k('users').where({ id: userId }).first('session_version');
	const [id] = await k('api_tokens').insert({
		user_id: userId,
		name: opts.name ?? `test token ${scopes.join('+')}`,
		token_hash: tokenHash,
		hint,
		scopes: scopes.join(','),
		session_version: user.session_version,
		expires_at: opts.expiresAt ?? new Date(Date.now() + 30 * 86_400_000)
	});
	return { id, token };
}

/** A request with a bearer token and nothing else of a browser's. */
export function withToken(token: string, method: string, path: string, init: { body?: BodyInit; headers?: Record<string, string>; base?: string } = {}): Promise<Response> {
	return fetch((init.base ?? BASE_URL) + path, {
		method,
		redirect: 'manual',
		body: init.body,
		headers: { authorization: `Bearer ${token}`, accept: 'application/json', ...init.headers }
	});
}

/** A GET with a bearer token from a chosen loopback address (127.0.0.2…), for the address a token was used from. */
export function getWithTokenFrom(localAddress: string, token: string, path: string): Promise<{ status: number; body: string }> {
	const url = new URL(path, BASE_URL);
	return new Promise((resolve, reject) => {
		const req = request(
			{ host: url.hostname, port: url.port, path: url.pathname + url.search, method: 'GET', localAddress, agent: false, headers: { authorization: `Bearer ${token}`, accept: 'application/json' } },
			(res) => {
				const chunks: Buffer[] = [];
				res.on('data', (c: Buffer) => chunks.push(c));
				res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString('utf8') }));
				res.on('error', reject);
			}
		);
		req.on('error', reject);
		req.end();
	});
}
