// Vitest set-up for mutation runs: the unit tests only (they need no services), without the
// SvelteKit and Tailwind plugins, which no pure module under mutation uses. The sandbox Stryker
// copies holds only files git tracks, so the generated .svelte-kit/tsconfig.json that the main
// tsconfig extends is missing there: transpile with the one beside this file.
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	root: fileURLToPath(new URL('../..', import.meta.url)),
	tsconfig: fileURLToPath(new URL('./tsconfig.json', import.meta.url)),
	// Instrumented code on a loaded machine: the slower DSP tests get room before they count as failed.
	test: { include: ['tests/unit/**/*.test.ts'], environment: 'node', testTimeout: 60_000 }
});
