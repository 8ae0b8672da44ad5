// `npm start`: the demo on http://127.0.0.1:3000 with its services, worker and demo data.
// Ctrl-C stops everything it started; running it again reuses the data.
import knex from 'knex';
import { migrate, ports, profileEnv, startServices, stopServices } from './stack';
import { buildIfStale, startChild, startWebServer, startWorker, waitForHttp, type Child } from './processes';
import { seedDemo } from './demo/seed';
import { seedDemoCaptures } from './demo/seed-captures';
import { DEMO_PASSWORD, DEMO_USERS } from './demo/scenario';
import { loadConfig } from '../src/lib/server/config';
import { knexSettings } from '../src/lib/server/db';
import { join } from 'node:path';
import { ROOT } from './stack';

const dev = process.argv.includes('--dev');
const env = profileEnv('demo');
// The seed uses the app's own modules, which read their settings from the environment.
Object.assign(process.env, env);
const p = ports('demo');
const t0 = Date.now();

console.log('» Starting MariaDB, the S3 fake and the mail sink');
const services = await startServices('demo');
const children: Child[] = [];
let stopping = false;

async function stopAll(code = 0) {
	if (stopping) return;
	stopping = true;
	console.log('\n» Stopping');
	for (const c of [...children].reverse()) await c.stop();
	await stopServices(services);
	process.exit(code);
}
process.on('SIGINT', () => void stopAll());
process.on('SIGTERM', () => void stopAll());

try {
	const applied = await migrate(env);
	console.log(`» Database migrated${applied.length ? ` (${applied.length} new)` : ''}`);
	const k = knex(knexSettings(loadConfig(env)));
	const seeded = await seedDemo(k);
	if (seeded.created) {
		const n = await seedDemoCaptures(k, seeded.organizationId);
		console.log(`» Demo data seeded; ${n} synthetic captures queued for the worker`);
	} else console.log('» Demo data already there, reused');
	await k.destroy();

	if (dev) {
		children.push(startChild('vite dev', join(ROOT, 'node_modules/.bin/vite'), ['dev', '--port', String(p.app), '--strictPort'], env));
	} else {
		buildIfStale();
		children.push(startWebServer(env));
	}
	children.push(startWorker(env));
	for (const c of children) c.process.once('exit', (code) => !stopping && (console.error(`${c.name} exited (${code})`), void stopAll(1)));
	await waitForHttp(`${env.PUBLIC_BASE_URL}/health`, 120_000);

	const width = Math.max(...DEMO_USERS.map((u) => u.email.length));
	console.log(`
Ringdown is running at ${env.PUBLIC_BASE_URL}   (ready in ${((Date.now() - t0) / 1000).toFixed(1)} s)

Demo accounts (password: ${DEMO_PASSWORD})
${DEMO_USERS.map((u) => `  ${u.email.padEnd(width)}  ${u.role}`).join('\n')}

Mail sink:   http://127.0.0.1:${p.mailHttp}
S3 fake:     http://127.0.0.1:${p.s3}  (bucket ${env.S3_BUCKET})
MariaDB:     127.0.0.1:${p.db}  (database ${env.DB_NAME})
Data:        .data/   ·   Ctrl-C stops everything.
`);
} catch (e) {
	console.error(e instanceof Error ? e.message : e);
	await stopAll(1);
}
