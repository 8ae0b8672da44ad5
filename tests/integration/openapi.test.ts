// The API description on the running app: /api/openapi.json and its page /developers/api are
// public, valid and complete; and the app's real answers keep to what the description says —
// every status an operation gives is one it lists, and its JSON has the documented shape.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { validate } from '@readme/openapi-parser';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { acousticianWithProject, Client } from '../helpers/http';
import { makeApiToken, withToken } from '../helpers/api-tokens';
import { makeUser } from '../helpers/factories';
import { ownedIds } from '../helpers/owned-ids';
import { fillRoute } from '../helpers/routes';
import { apiOperations } from '../../src/lib/server/openapi/operations';
import type { ApiOperation } from '../../src/lib/server/openapi/registry';

interface Doc {
	openapi: string;
	servers: { url: string }[];
	paths: Record<string, Record<string, { operationId: string; responses: Record<string, unknown> }>>;
}

let k: Knex;
let doc: Doc;
let acoustician: Client;
let ids: Record<string, number | string>;
let readToken: string;

beforeAll(async () => {
	k = testDb();
	const made = await acousticianWithProject(k);
	acoustician = made.acoustician;
	ids = await ownedIds(k, made.tree);
	const project = await k('projects').where({ id: made.tree.projectId }).first('organization_id');
	readToken = (await makeApiToken(k, (await makeUser(k, project.organization_id, 'acoustician')).id, ['read'])).token;
	const res = await fetch(`${BASE_URL}/api/openapi.json`);
	expect(res.status).toBe(200);
	doc = (await res.json()) as Doc;
});

afterAll(async () => k.destroy());

describe('/api/openapi.json', () => {
	it('is served signed out, as JSON, and validates as OpenAPI 3.1', async () => {
		const res = await fetch(`${BASE_URL}/api/openapi.json`);
		expect(res.headers.get('content-type')).toContain('application/json');
		expect(doc.openapi).toBe('3.1.0');
		expect(doc.servers[0].url).toBe(BASE_URL);
		const result = await validate(structuredClone(doc) as never);
		expect(result.valid, JSON.stringify('errors' in result ? result.errors : [])).toBe(true);
		expect(Object.keys(doc.paths)).toEqual(expect.arrayContaining(['/api/sessions/{sessionId}/captures', '/api/openapi.json']));
	});
});

describe('/developers/api', () => {
	it('is a page signed out, readable without scripts, under the app\'s Content-Security-Policy', async () => {
		const res = await fetch(`${BASE_URL}/developers/api`, { headers: { accept: 'text/html' }, redirect: 'manual' });
		expect(res.status).toBe(200);
		const csp = res.headers.get('content-security-policy') ?? '';
		expect(csp).toMatch(/script-src 'self' 'nonce-[^']+'/);
		expect(csp).toContain("frame-ancestors 'none'");
		const html = await res.text();
		// Server-rendered: every operation is in the HTML itself, with its method and path.
		for (const [path, item] of Object.entries(doc.paths)) {
			for (const op of Object.values(item)) {
				expect(html, op.operationId).toContain(`id="${op.operationId}"`);
				expect(html).toContain(path);
			}
		}
		expect(html).toContain('Authorization: Bearer rdt_');
		// Nothing is loaded from elsewhere: every script and stylesheet is the app's own.
		const sources = [...html.matchAll(/<(?:script|link)\b[^>]*(?:src|href)="([^"]+)"/g)].map((m) => m[1]);
		expect(sources.length).toBeGreaterThan(0);
		for (const s of sources) expect(s, s).toMatch(/^(\/|\.\.?\/)/);
	});
});

// Before the calls below: they end by deleting the capture.
describe('requests with an API token', () => {
	const ops = apiOperations({ uploadMaxBytes: 1, bodyMaxBytes: 1, tokenRequestsPerMinute: 1, uploadBodyDescription: '' }).filter((op) => op.access !== 'public');

	// Every operation a read-only token may not call: those whose scope is another.
	const beyondRead = ops.filter((op) => !['project:read', 'project:internal'].includes(op.access));

	it('has operations beyond a read token to try', () => expect(beyondRead.length).toBeGreaterThan(5));

	it.each(beyondRead.map((op) => [op.method.toUpperCase(), op.route, op] as const))('%s %s refuses a read-only token with the 403 it lists', async (method, route, op) => {
		const res = await withToken(readToken, method, fillRoute(route, ids)!, { body: '{}', headers: { 'content-type': 'application/json' } });
		expect(res.status, await res.text()).toBe(403);
		const entry = doc.paths[route.replace(/\[(\w+)(?:=\w+)?\]/g, '{$1}')][op.method] as unknown as { responses: Record<string, { description: string }>; 'x-token-scope': string };
		expect(entry['x-token-scope']).not.toBe('read');
		expect(entry.responses['403'].description).toContain(`"${entry['x-token-scope']}" scope`);
	});

	it('answers a token that is not one 401 with invalid_token, as the description says', async () => {
		const res = await withToken('rdt_' + 'x'.repeat(43), 'GET', fillRoute('/api/sessions/[sessionId=id]/captures', ids)!);
		expect(res.status).toBe(401);
		expect(res.headers.get('www-authenticate')).toContain('invalid_token');
		expect(((await res.json()) as { code: string }).code).toBe('invalid_token');
		const listed = doc.paths['/api/sessions/{sessionId}/captures'].get.responses['401'] as { description: string };
		expect(listed.description).toContain('invalid_token');
	});

	it('reads with a read token, in the described shape', async () => {
		const op = ops.find((o) => o.operationId === 'listVisitCaptures')!;
		const res = await withToken(readToken, 'GET', fillRoute(op.route, ids)!);
		expect(res.status).toBe(200);
		const schema = op.responses[200].content!['application/json']!.schema;
		expect(isZod(schema) && schema.safeParse(await res.json()).success).toBe(true);
	});
});

/** A harmless call of an operation: GETs plain; changes with an empty JSON object. */
async function call(op: ApiOperation): Promise<Response> {
	const url = fillRoute(op.route, ids)!;
	if (op.method === 'get') return acoustician.get(url, { accept: 'application/json' });
	return acoustician.request(op.method.toUpperCase(), url, { body: '{}', headers: { 'content-type': 'application/json', accept: 'application/json' } });
}

const isZod = (s: unknown): s is { safeParse(v: unknown): { success: boolean; error?: unknown } } => typeof (s as { safeParse?: unknown })?.safeParse === 'function';

describe('the answers of the running app', () => {
	// Changes after reads, and the one deletion last, so each call meets the rows as made.
	const order = (op: ApiOperation) => (op.method === 'get' ? 0 : op.method === 'delete' ? 2 : 1);
	const ops = apiOperations({ uploadMaxBytes: 1, bodyMaxBytes: 1, tokenRequestsPerMinute: 1, uploadBodyDescription: '' }).sort((a, b) => order(a) - order(b));

	it('has a test id for every operation\'s parameters', () => {
		for (const op of ops) expect(fillRoute(op.route, ids), op.route).not.toBeNull();
	});

	it.each(ops.map((op) => [op.method.toUpperCase(), op.route, op] as const))('%s %s answers a status it lists, in the shape it describes', async (method, route, op) => {
		const res = await call(op);
		const path = route.replace(/\[(\w+)(?:=\w+)?\]/g, '{$1}');
		const listed = Object.keys(doc.paths[path][op.method].responses);
		const body = await res.text();
		expect(listed, `${method} ${route} answered ${res.status}: ${body.slice(0, 300)}`).toContain(String(res.status));
		const type = (res.headers.get('content-type') ?? '').split(';')[0];
		if (res.status >= 400) {
			expect(type).toBe('application/json');
			expect(typeof JSON.parse(body).message).toBe('string');
			return;
		}
		const schema = op.responses[res.status]?.content?.[type]?.schema;
		if (type === 'application/json' && isZod(schema)) {
			const parsed = schema.safeParse(JSON.parse(body));
			expect(parsed.success, `${method} ${route}: ${JSON.stringify(parsed.error)}`).toBe(true);
		}
	});
});
