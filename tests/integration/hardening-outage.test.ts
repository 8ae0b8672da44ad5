// When the database goes away the app says so — 503 pages, 503 JSON, /health naming what is
// down — and recovers by itself when it is back. The shared test database stays up: a private
// web server reaches it through a TCP relay this test can cut.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer, connect, type Server, type Socket } from 'node:net';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { startPrivateServer, type PrivateServer } from '../helpers/private-server';

const RELAY_PORT = 3327;
const APP_PORT = 3197;

/** A TCP relay to the test database that can be cut (connections dropped, port closed) and restored. */
class DatabaseRelay {
	private server: Server | null = null;
	private sockets = new Set<Socket>();
	constructor(private target: { host: string; port: number }) {}

	open(): Promise<void> {
		this.server = createServer((client) => {
			const upstream = connect(this.target);
			for (const s of [client, upstream]) {
				this.sockets.add(s);
				s.on('close', () => this.sockets.delete(s));
				s.on('error', () => s.destroy());
			}
			client.pipe(upstream).pipe(client);
		});
		return new Promise((ok) => this.server!.listen(RELAY_PORT, '127.0.0.1', ok));
	}

	cut(): Promise<void> {
		for (const s of this.sockets) s.destroy();
		return new Promise((ok) => (this.server ? this.server.close(() => ok()) : ok()));
	}
}

let k: Knex;
let tree: ProjectTree;
let relay: DatabaseRelay;
let app: PrivateServer;
let session: string;

const get = (path: string, accept = 'text/html', cookie = session) => fetch(app.url + path, { headers: { accept, cookie }, redirect: 'manual' });

beforeAll(async () => {
	k = testDb();
	const orgId = await makeOrganization(k);
	tree = await makeProjectTree(k, orgId);
	const u = await makeUser(k, orgId, 'acoustician');
	relay = new DatabaseRelay({ host: process.env.DB_HOST ?? '127.0.0.1', port: Number(process.env.DB_PORT) });
	await relay.open();
	app = await startPrivateServer(APP_PORT, { DB_PORT: String(RELAY_PORT) });
	const signIn = await fetch(`${app.url}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: app.url, 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
		body: new URLSearchParams({ email: u.email, password: TEST_PASSWORD, redirectTo: '/projects' })
	});
	expect(signIn.status).toBe(303);
	session = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
});

afterAll(async () => {
	await app?.stop();
	await relay?.cut();
	await k.destroy();
});

describe('a database outage', () => {
	it('before: /health says everything is up', async () => {
		const res = await get('/health', 'application/json');
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ ok: true, database: 'up', storage: 'up' });
		expect((await get(`/sessions/${tree.sessionId}`)).status).toBe(200);
	});

	it('during: 503 with a page that says the service is briefly unavailable, JSON for API and /health', async () => {
		await relay.cut();

		const t = performance.now();
		const health = await get('/health', 'application/json');
		expect(performance.now() - t).toBeLessThan(3_000);
		expect(health.status).toBe(503);
		expect(health.headers.get('content-type')).toMatch(/application\/json/);
		expect(await health.json()).toEqual({ ok: false, database: 'down', storage: 'up' });

		// A signed-in person: the user is looked up on every request.
		const page = await get(`/sessions/${tree.sessionId}`);
		expect(page.status).toBe(503);
		expect(await page.text()).toContain('briefly unavailable');

		const api = await get(`/api/sessions/${tree.sessionId}/captures`, 'application/json');
		expect(api.status).toBe(503);
		expect(((await api.json()) as { message: string }).message).toMatch(/briefly unavailable/);

		// Someone signed out, on a page whose load reads the database.
		const invitation = await get('/invitation/0123456789abcdef0123456789abcdef', 'text/html', '');
		expect(invitation.status).toBe(503);
		expect(invitation.headers.get('retry-after')).toMatch(/^\d+$/);
		const html = await invitation.text();
		expect(html).toContain('Ringdown is briefly unavailable');
		expect(html).not.toContain('Something went wrong');
	});

	it('after: answers normally again without a restart', async () => {
		await relay.open();
		const until = Date.now() + 10_000;
		let res = await get('/health', 'application/json');
		while (res.status !== 200 && Date.now() < until) {
			await new Promise((r) => setTimeout(r, 200));
			res = await get('/health', 'application/json');
		}
		expect(await res.json()).toEqual({ ok: true, database: 'up', storage: 'up' });
		expect((await get(`/sessions/${tree.sessionId}`)).status).toBe(200);
	});
});
