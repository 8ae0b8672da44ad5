import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// The demo serves build/, the tests build-test/ (scripts/processes.ts): a test run never
		// rebuilds the files a running demo serves, nor the other way round.
		adapter: adapter({ out: process.env.RINGDOWN_BUILD_DIR || 'build' }),
		// SvelteKit's origin check stays on (the default); ORIGIN is set for `node build`. The
		// handle in hooks.server.ts extends it to every content type and to requests without Origin.
		csrf: { trustedOrigins: [] },
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
