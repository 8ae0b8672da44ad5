// A small HTTP client for the running test server: keeps cookies, sends the Origin header
// SvelteKit's CSRF check expects, never follows redirects (tests assert them).
import type { Knex } from 'knex';
import { BASE_URL } from './env';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from './factories';

export class Client {
	private cookies = new Map<string, string>();

	private cookieHeader(): string {
		return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	}

	private keep(res: Response): void {
		for (const c of res.headers.getSetCookie()) {
			const [pair] = c.split(';');
			const i = pair.indexOf('=');
			const name = pair.slice(0, i), value = pair.slice(i + 1);
			if (value === '' || /max-age=0|expires=thu, 01 jan 1970/i.test(c)) this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}

	async request(method: string, path: string, init: { body?: BodyInit; headers?: Record<string, string> } = {}): Promise<Response> {
		const res = await fetch(BASE_URL + path, {
			method,
			redirect: 'manual',
			body: init.body,
			headers: { origin: BASE_URL, cookie: this.cookieHeader(), ...init.headers }
		});
		this.keep(res);
		return res;
	}

	get(path: string, headers: Record<string, string> = {}) {
		return this.request('GET', path, { headers });
	}

	/** Submit a form as a browser without JavaScript would (urlencoded, expects HTML). */
	postForm(path: string, fields: Record<string, string>) {
		return this.request('POST', path, {
			body: new URLSearchParams(fields),
			headers: { 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' }
		});
	}

	postJson(path: string, body: unknown) {
		return this.request('POST', path, { body: JSON.stringify(body), headers: { 'content-type': 'application/json', accept: 'application/json' } });
	}

	async signIn(email: string, password: string): Promise<Response> {
		return this.postForm('/signin', { email, password, redirectTo: '/projects' });
	}

	get signedIn(): boolean {
		return [...this.cookies.keys()].some((k) => k.includes('session-token'));
	}
}

export async function signedInClient(email: string, password: string): Promise<Client> {
	const c = new Client();
	const res = await c.signIn(email, password);
	if (res.status !== 303 || !c.signedIn) throw new Error(`Sign-in of ${email} failed with ${res.status}`);
	return c;
}

/** A fresh organization's project tree and a signed-in acoustician of it: the upload tests' start. */
export async function acousticianWithProject(k: Knex): Promise<{ tree: ProjectTree; acoustician: Client }> {
	const org = await makeOrganization(k);
	const user = await makeUser(k, org, 'acoustician');
	const tree = await makeProjectTree(k, org);
	return { tree, acoustician: await signedInClient(user.email, TEST_PASSWORD) };
}
