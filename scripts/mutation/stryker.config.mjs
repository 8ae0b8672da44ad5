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
// Runs on part of an area (--mutate …) can keep their own reports and incremental file.
const label = process.env.MUTATION_REPORT ?? area;

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
	mutate,
	testRunner: 'vitest',
	plugins: ['@stryker-mutator/vitest-runner'],
	vitest: { configFile: 'scripts/mutation/vitest.config.ts', related: true },
	coverageAnalysis: 'perTest',
	// Mutants in code that runs when a module loads (the material tables, the band lists) would each
	// need the whole unit suite: three quarters of the treatment mutants, hours per area. They are
	// left out; StrykerJS changes no number literal anyway, so the modules' numeric rules (limits,
	// margins, defaults) are held by the tests at, just below and just above each value.
	ignoreStatic: true,
	// The machine is shared: one test process unless asked for more (--concurrency 2).
	concurrency: 1,
	timeoutMS: 60_000,
	tempDirName: 'scripts/mutation/.stryker-tmp',
	cleanTempDir: true,
	// The sandbox gets what the unit tests need, nothing of the services or the app build.
	ignorePatterns: ['/build', '/.data', '/.test-data', '/test-results', '/static', '/migrations', '/tests/integration', '/tests/e2e'],
	reporters: ['clear-text', 'progress', 'html', 'json'],
	clearTextReporter: { allowColor: false, logTests: false, reportTests: false },
	htmlReporter: { fileName: `${reports}/${label}.html` },
	jsonReporter: { fileName: `${reports}/${label}.json` },
	incrementalFile: `${reports}/${label}-incremental.json`,
	thresholds: { high: 85, low: 70, break: null }
};
