// `npm start`: the demo on http://127.0.0.1:3000 with its services, worker and demo data.
// Ctrl-C (or SIGTERM) stops everything it started; a worker that dies is started again;
// running it again reuses the data.
import knex from 'knex';
import { dataDir, migrate, ports, profileEnv, startServices, stopServices } from './stack';
import type { RunningService } from './services/mariadb';
import { buildIfStale, onUnexpectedExit, startChild, startWebServer, startWorker, supervise, waitForHttp } from './processes';
import { seedDemo } from './demo/seed';
import { seedDemoCaptures } from './demo/seed-captures';
import { DEMO_PASSWORD, DEMO_USERS } from './demo/scenario';
import { loadConfig } from '../src/lib/server/config';
import { knexSettings } from '../src/lib/server/db';
import { join, relative } from 'node:path';
import { ROOT } from './stack';

const dev = process.argv.includes('--dev');
const env = profileEnv('demo');
// The seed uses the app's own modules, which read their settings from the environment.
Object.assign(process.env, env);
const p = ports('demo');
const t0 = Date.now();

// Handlers first, so a signal during start-up also stops what was started so far.
let stopping = false;
const stoppables: { stop(): Promise<void> }[] = [];
let services: Promise<RunningService[]> = Promise.resolve([]);

async function stopAll(code = 0) {
	if (stopping) return;
	stopping = true;
	console.log('\n» Stopping');
	// The worker first (it finishes its job), then the web server, then what they depend on.
	for (const c of [...stoppables].reverse()) await c.stop();
	await stopServices(await services.catch(() => []));
	process.exit(code);
}
process.on('SIGINT', () => void stopAll());
process.on('SIGTERM', () => void stopAll());
process.on('SIGHUP', () => void stopAll());

async function run(): Promise<void> {
	console.log('» Starting MariaDB, the S3 fake and the mail sink');
	services = startServices('demo');
	await services;
	if (stopping) return;
	const applied = await migrate(env);
	console.log(`» Database migrated${applied.length ? ` (${applied.length} new)` : ''}`);
	const k = knex(knexSettings(loadConfig(env)));
	const seeded = await seedDemo(k);
	if (seeded.created) {
		const n = await seedDemoCaptures(k, seeded.organizationId);
		console.log(`» Demo data seeded; ${n} synthetic captures queued for the worker`);
	} else console.log('» Demo data already there, reused');
	await k.destroy();

	if (!dev) buildIfStale();
	if (stopping) return;
	const web = dev
		? startChild('vite dev', join(ROOT, 'node_modules/.bin/vite'), ['dev', '--port', String(p.app), '--strictPort'], env)
		: startWebServer(env);
	stoppables.push(web);
	// Without the web server there is nothing to use: stop everything and say why.
	onUnexpectedExit(web, () => stopping, (code, signal) => {
		console.error(`${web.name} exited (${signal ?? code})`);
		void stopAll(1);
	});
	// A worker that dies is started again, with a growing wait between attempts.
	stoppables.push(supervise('worker', () => startWorker(env)));
	await waitForHttp(`${env.PUBLIC_BASE_URL}/health`, 120_000);

	const width = Math.max(...DEMO_USERS.map((u) => u.email.length));
	console.log(`
Ringdown is running at ${env.PUBLIC_BASE_URL}   (ready in ${((Date.now() - t0) / 1000).toFixed(1)} s)

Demo accounts (password: ${DEMO_PASSWORD})
${DEMO_USERS.map((u) => `  ${u.email.padEnd(width)}  ${u.role}`).join('\n')}

Mail sink:   http://127.0.0.1:${p.mailHttp}
S3 fake:     http://127.0.0.1:${p.s3}  (bucket ${env.S3_BUCKET})
MariaDB:     127.0.0.1:${p.db}  (database ${env.DB_NAME})
Data:        ${relative(ROOT, dataDir('demo')) || '.'}/   ·   Ctrl-C stops everything.
`);
}

await run().catch(async (e) => {
	console.error(e instanceof Error ? e.message : e);
	await stopAll(1);
});
