import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// The demo serves build/, the tests build-test/ (scripts/processes.ts): a test run never
		// rebuilds the files a running demo serves, nor the other way round.
		adapter: adapter({ out: process.env.RINGDOWN_BUILD_DIR || 'build' }),
		// SvelteKit's own origin check is off ('*' is its documented switch): it covers form content
		// types only, and it refuses a script's multipart upload that has no Origin even when the
		// script sends an API token and no cookie. `refuseCrossSiteChanges` in hooks.server.ts
		// replaces it for every content type — another site's Origin is refused, and so is a request
		// with cookies and no Origin (tests/integration/hardening-origin.test.ts).
		csrf: { trustedOrigins: ['*'] },
		// Scripts only from the app itself (SvelteKit adds each page's nonce). Inline styles are
		// allowed: Svelte's `style:` directives render style attributes. The object store the
		// browser uploads to is a runtime setting: hooks.server.ts adds it to connect-src. Vite
		// inlines the small font subsets as data: URLs.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
