// `npm test`: throw-away services on their own ports and data dir, every test layer, then one
// closing line "N passed, M failed" counted over all layers. Stops what it started, even on failure.
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import knex from 'knex';
import { dataDir, migrate, profileEnv, ROOT, startServices, stopServices } from './stack';
import { buildIfStale, startWebServer, startWorker, waitForHttp, type Child } from './processes';
import { seedDemo } from './demo/seed';
import { seedDemoCaptures } from './demo/seed-captures';
import { loadConfig } from '../src/lib/server/config';
import { knexSettings } from '../src/lib/server/db';

interface VitestJson {
	numPassedTests: number;
	numFailedTests: number;
	numPendingTests: number;
	testResults: { name: string; status: string; message?: string; assertionResults: { status: string }[] }[];
}

const args = process.argv.slice(2);
const only = args.filter((a) => !a.startsWith('-')); // optional file filters passed to vitest
const t0 = Date.now();
const dir = dataDir('test');
rmSync(dir, { recursive: true, force: true });

const env = profileEnv('test');
Object.assign(process.env, env);
const testEnv = { ...env, NODE_OPTIONS: '--import tsx', RINGDOWN_TEST: '1' };
let services: Awaited<ReturnType<typeof startServices>> = [];
const children: Child[] = [];
const totals = { passed: 0, failed: 0, skipped: 0 };

// Asynchronous on purpose: the S3 fake and the mail sink live in this process and must keep
// answering while the tests run.
async function runLayer(label: string, projects: string[]): Promise<void> {
	const out = join(dir, `results-${label}.json`);
	console.log(`\n» ${label} tests`);
	const child = spawn(
		join(ROOT, 'node_modules/.bin/vitest'),
		['run', ...projects.flatMap((p) => ['--project', p]), '--passWithNoTests', '--reporter=default', '--reporter=json', `--outputFile=${out}`, ...only],
		{ cwd: ROOT, env: { ...process.env, ...testEnv }, stdio: 'inherit' }
	);
	await new Promise((r) => child.once('exit', r));
	if (!existsSync(out)) {
		console.error(`${label}: the runner produced no results`);
		totals.failed += 1;
		return;
	}
	const r = JSON.parse(readFileSync(out, 'utf8')) as VitestJson;
	totals.passed += r.numPassedTests;
	totals.failed += r.numFailedTests;
	totals.skipped += r.numPendingTests;
	// A file that failed to load has no failed assertions of its own: count it as one failure.
	for (const f of r.testResults) {
		if (f.status === 'failed' && !f.assertionResults.some((a) => a.status === 'failed')) {
			console.error(`${label}: ${f.name} failed to run: ${f.message ?? ''}`);
			totals.failed += 1;
		}
	}
}

let exitCode = 1;
try {
	console.log('» Starting throw-away MariaDB, S3 fake and mail sink');
	services = await startServices('test');
	await migrate(env);
	const k = knex(knexSettings(loadConfig(env)));
	const seeded = await seedDemo(k);
	await seedDemoCaptures(k, seeded.organizationId);
	await k.destroy();
	buildIfStale();
	const web = startWebServer(env, true);
	children.push(web);
	await waitForHttp(`${env.PUBLIC_BASE_URL}/health`);

	// One layer at a time: the DSP unit tests would otherwise compete for the two cores with the
	// worker processes the integration tests time.
	await runLayer('unit', ['unit']);
	await runLayer('integration', ['integration']);
	// Browser tests need mail delivered and captures analysed: a worker runs for them.
	children.push(startWorker(env, true));
	await runLayer('e2e', ['e2e']);
	exitCode = totals.failed === 0 && totals.passed > 0 ? 0 : 1;
} catch (e) {
	console.error(e instanceof Error ? e.stack : e);
	totals.failed += 1;
} finally {
	for (const c of [...children].reverse()) await c.stop();
	await stopServices(services);
}

console.log(`\nTest run took ${((Date.now() - t0) / 1000).toFixed(0)} s`);
console.log(`${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ''}`);
process.exit(exitCode);
