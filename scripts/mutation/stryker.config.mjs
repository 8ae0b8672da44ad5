// StrykerJS set-up for `npm run mutation [area]` (scripts/mutation.sh). MUTATION_AREA picks the
// files to mutate and names the reports; paths are relative to the repository root.
const AREAS = {
	analysis: ['src/lib/analysis/**/*.ts'],
	treatment: ['src/lib/treatment/**/*.ts'],
	results: ['src/lib/results/**/*.ts'],
	roles: ['src/lib/roles.ts']
};
const area = process.env.MUTATION_AREA ?? 'all';
const mutate = area === 'all' ? Object.values(AREAS).flat() : AREAS[area];
if (!mutate) throw new Error(`unknown area "${area}"; one of: ${Object.keys(AREAS).join(', ')}, all`);
const reports = 'scripts/mutation/reports';

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
	mutate,
	testRunner: 'vitest',
	plugins: ['@stryker-mutator/vitest-runner'],
	vitest: { configFile: 'scripts/mutation/vitest.config.ts', related: true },
	coverageAnalysis: 'perTest',
	// The machine is shared: one test process unless asked for more (--concurrency 2).
	concurrency: 1,
	timeoutMS: 60_000,
	tempDirName: 'scripts/mutation/.stryker-tmp',
	cleanTempDir: true,
	// The sandbox gets what the unit tests need, nothing of the services or the app build.
	ignorePatterns: ['/build', '/.data', '/.test-data', '/test-results', '/static', '/migrations', '/tests/integration', '/tests/e2e'],
	reporters: ['clear-text', 'progress', 'html', 'json'],
	clearTextReporter: { allowColor: false, logTests: false, reportTests: false },
	htmlReporter: { fileName: `${reports}/${area}.html` },
	jsonReporter: { fileName: `${reports}/${area}.json` },
	incrementalFile: `${reports}/${area}-incremental.json`,
	thresholds: { high: 85, low: 70, break: null }
};
