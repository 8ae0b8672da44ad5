import { describe, expect, it } from 'vitest';
import { safeRedirectPath } from '../../src/lib/server/safe-redirect';

// A browser resolves a Location header against the page it came from (WHATWG URL Standard,
// "basic URL parser"); Node's URL follows the same standard, so it stands in for the browser.
const APPS = ['https://portal.example:8443', 'http://127.0.0.1:3000'];
const leavesApp = (location: string) => APPS.some((app) => new URL(location, `${app}/signin`).origin !== app);
// eslint-disable-next-line no-control-regex
const headerUnsafe = /[\u0000-\u001f\u007f]/;

// Each of these, sent as it stands, would take a browser to another host, run script, or break
// the Location header (a newline makes Node refuse the header: a 500).
const HOSTILE_AS_SENT = [
	'//evil.example',
	'//evil.example/projects',
	'/\\evil.example',
	'\\\\evil.example',
	'/\t/evil.example',
	'/\n/evil.example',
	'/\r\n/evil.example',
	'\t//evil.example',
	' //evil.example',
	'https://evil.example/',
	'HTTPS://evil.example',
	'http:evil.example',
	'https:/evil.example',
	'javascript:alert(1)',
	'JaVaScRiPt:alert(1)',
	' javascript:alert(1)',
	'data:text/html,<script>alert(1)</script>'
];

// These stay on the site as sent, but their normalised path begins "//": another host.
const HOSTILE_ONCE_NORMALISED = [
	'/.//evil.example',
	'/a/..//evil.example',
	'/%2e//evil.example',
	'/%2E%2E//evil.example',
	'/./\\evil.example'
];

describe('safeRedirectPath refuses targets that leave the site', () => {
	for (const target of HOSTILE_AS_SENT) {
		it(`refuses ${JSON.stringify(target)}`, () => {
			// Sent unchanged, the target would indeed leave (or break) — the case is real…
			expect(leavesApp(target) || headerUnsafe.test(target) || /^\s*(javascript|data):/i.test(target)).toBe(true);
			// …and the fallback comes back instead.
			expect(safeRedirectPath(target)).toBe('/projects');
		});
	}

	for (const target of HOSTILE_ONCE_NORMALISED) {
		it(`refuses ${JSON.stringify(target)}`, () => {
			const normalised = new URL(target, 'http://127.0.0.1:3000').pathname;
			expect(leavesApp(normalised)).toBe(true);
			expect(safeRedirectPath(target)).toBe('/projects');
		});
	}

	it('uses the fallback given for a missing or empty target', () => {
		expect(safeRedirectPath(null, '/account')).toBe('/account');
		expect(safeRedirectPath(undefined, '/account')).toBe('/account');
		expect(safeRedirectPath('', '/account')).toBe('/account');
	});
});

describe('safeRedirectPath keeps paths on the site', () => {
	const KEPT: [string, string][] = [
		['/projects', '/projects'],
		['/rooms/12/plan?units=in#items', '/rooms/12/plan?units=in#items'],
		['/sessions/3?tab=results&band=125', '/sessions/3?tab=results&band=125'],
		// Encoded characters stay encoded: a browser does not decode them before resolving.
		['/%09/evil.example', '/%09/evil.example'],
		['/%2F/evil.example', '/%2F/evil.example'],
		['/%5Cevil.example', '/%5Cevil.example'],
		// The parser's own normalisation: dot segments resolved, a backslash read as "/".
		['/projects/../rooms/4', '/rooms/4'],
		['/projects\\7', '/projects/7'],
		// Characters a header cannot carry come back percent-encoded.
		['/rooms/Wohnzimmer ä', '/rooms/Wohnzimmer%20%C3%A4'],
		['/search?q=a\u0001b', '/search?q=a%01b'],
		['/rooms/\u000b/x', '/rooms/%0B/x']
	];
	for (const [target, expected] of KEPT) {
		it(`keeps ${JSON.stringify(target)} as ${expected}`, () => {
			const kept = safeRedirectPath(target);
			expect(kept).toBe(expected);
			expect(leavesApp(kept)).toBe(false);
			expect(headerUnsafe.test(kept)).toBe(false);
		});
	}
});
