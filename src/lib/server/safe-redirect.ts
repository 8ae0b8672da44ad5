// Where to send someone after signing in: only a path on this site (no open redirects).
// The target is read by the URL parser — the same rules a browser applies to a Location header,
// which drop tabs and newlines, turn "\" into "/" and resolve "." segments — and kept only when
// it stays on the origin it was read against. What is returned is the parser's own serialisation,
// so it holds no character a browser could read differently or a header could not carry.

// Any host will do: nothing on it is reachable, only whether a target leaves it matters. Both
// schemes, because "http:evil.example" is a path on an http site but another host from https.
const HERE = ['http://ringdown.invalid', 'https://ringdown.invalid'];

/** The path of `target` on `origin`, or null when the target leaves it. */
function pathOn(target: string, origin: string): string | null {
	let url: URL;
	try {
		url = new URL(target, origin);
	} catch {
		return null;
	}
	if (url.origin !== origin) return null;
	const path = url.pathname + url.search + url.hash;
	// A path that begins "//" is another host to a browser ("/.//evil" normalises to "//evil").
	if (path.startsWith('//') || new URL(path, origin).origin !== origin) return null;
	return path;
}

export function safeRedirectPath(target: string | null | undefined, fallback = '/projects'): string {
	if (!target) return fallback;
	const paths = HERE.map((origin) => pathOn(target, origin));
	return paths[0] !== null && paths[0] === paths[1] ? paths[0] : fallback;
}
