// A signed-in user's view of a running instance, for the load scripts: sign in through the form,
// fetch a page with the session cookie, and follow a page's links of one kind.

/** Sign in as a person would and return the session cookie header. */
export async function signIn(base: URL, email: string, password: string): Promise<string> {
	const answer = await fetch(new URL('/signin', base), {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: base.origin, 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
		body: new URLSearchParams({ email, password, redirectTo: '/projects' })
	});
	const cookie = answer.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.filter((c) => !c.endsWith('='))
		.join('; ');
	if (answer.status !== 303 || !cookie.includes('session-token')) throw new Error(`sign-in as ${email} answered ${answer.status}`);
	return cookie;
}

/** A page's HTML; anything but 200 is an error. */
export async function fetchPage(base: URL, cookie: string, path: string): Promise<string> {
	const answer = await fetch(new URL(path, base), { headers: { cookie, accept: 'text/html' }, redirect: 'manual' });
	if (answer.status !== 200) throw new Error(`GET ${path} answered ${answer.status}`);
	return answer.text();
}

/** The distinct links of a page to `prefix/<id>`, e.g. every "/rooms/12". */
export const linksOf = (html: string, prefix: string) => [...new Set([...html.matchAll(new RegExp(`href="(${prefix}/\\d+)"`, 'g'))].map((m) => m[1]))];
