// Benchmark: server time of the comparison page and its API, the client report with the plan,
// and the plan and build pages, for a room with 2 visits × 12 positions (median and 95th
// percentile over 50 requests), and how long the browser takes to
// draw the first chart of 12 overlaid responses. Runs on the throw-away test services.
// Usage: npx tsx scripts/bench-pages.ts   (builds the app first if sources changed)
import { rmSync } from 'node:fs';
import { createHash } from 'node:crypto';
import knex from 'knex';
import { chromium } from 'playwright-core';
import { dataDir, migrate, profileEnv, startServices, stopServices } from './stack';
import { buildIfStale, startWebServer, waitForHttp } from './processes';
import { seedDemo } from './demo/seed';
import { seedDemoPlan } from './demo/seed-plan';
import { synthesiseResponse, TREATED, UNTREATED } from './demo/room-response';
import { loadConfig } from '../src/lib/server/config';
import { knexSettings } from '../src/lib/server/db';
import { encodeWav } from '../src/lib/analysis';

const POSITIONS = 12;
const REQUESTS = 50;
rmSync(dataDir('test'), { recursive: true, force: true });
const env = profileEnv('test');
Object.assign(process.env, env);
const services = await startServices('test');
const { confirmUpload, createCapture } = await import('../src/lib/server/captures/service');
const { createStorage } = await import('../src/lib/server/storage');
const { runNextJob } = await import('../src/lib/server/jobs/runner');
const k = knex(knexSettings(loadConfig(env)));
let web: ReturnType<typeof startWebServer> | undefined;

const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((p / 100) * xs.length))];

try {
	await migrate(env);
	const { organizationId } = await seedDemo(k);
	const user = await k('users').where({ email: 'acoustician@fenwick-hale.test' }).first('id', 'email', 'name');
	const scope = { organizationId, projectId: null, role: 'acoustician' as const, user: { ...user, unitSystem: 'metric' as const } };
	const project = await k('projects').orderBy('id').first('id');
	const room = { lengthM: 6.2, widthM: 4.35, heightM: 2.7 };
	const [roomId] = await k('rooms').insert({ project_id: project.id, name: 'Benchmark room', length_m: room.lengthM, width_m: room.widthM, height_m: room.heightM, room_use: 'listening' });
	const sessionIds: number[] = [];
	console.log(`» Analysing 2 × ${POSITIONS} captures`);
	for (const [si, condition] of [UNTREATED, TREATED].entries()) {
		const [sessionId] = await k('sessions').insert({ room_id: roomId, condition_label: si === 0 ? 'before' : 'after', measured_on: si === 0 ? '2026-10-01' : '2026-11-01' });
		sessionIds.push(sessionId);
		for (let p = 0; p < POSITIONS; p++) {
			const mic = { x: 2.5 + 0.2 * (p % 6), y: 1.2 + 0.35 * Math.floor(p / 6) * 3, z: 1.05 };
			const wav = encodeWav(synthesiseResponse(room, { x: 0.9, y: 1.2, z: 1.1 }, mic, condition, 5000 + si * 100 + p), 48_000, 24);
			const created = await createCapture(scope, sessionId, { filename: `P${p + 1}.wav`, sizeBytes: wav.byteLength, sha256: createHash('sha256').update(wav).digest('hex'), kind: 'impulse', newPositionLabel: `P${p + 1}`, channel: 0 });
			await fetch(created.upload.url, { method: 'PUT', headers: created.upload.headers, body: wav as Uint8Array<ArrayBuffer> });
			await confirmUpload(scope, created.capture.id);
		}
	}
	const s3 = createStorage();
	while (await runNextJob(k, s3, { owner: 'bench' }));
	const [comparisonId] = await k('comparisons').insert({ room_id: roomId, baseline_session_id: sessionIds[0], treated_session_id: sessionIds[1], title: 'Benchmark', published_at: new Date() });
	// The demo's plan on this room: its prediction reads both visits of 12 positions.
	const consultant = await k('users').where({ email: 'consultant@fenwick-hale.test' }).first('id');
	await k.transaction((trx) => seedDemoPlan(trx, { roomId, consultantId: consultant.id, baselineSessionId: sessionIds[0], afterSessionId: sessionIds[1] }));

	buildIfStale();
	web = startWebServer(env, true);
	await waitForHttp(`${env.PUBLIC_BASE_URL}/health`);
	const signIn = await fetch(`${env.PUBLIC_BASE_URL}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: env.PUBLIC_BASE_URL, 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
		body: new URLSearchParams({ email: 'consultant@fenwick-hale.test', password: 'ringdown-demo', redirectTo: '/projects' })
	});
	const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

	for (const [label, path] of [
		['comparison page', `/comparisons/${comparisonId}`],
		['comparison API', `/api/comparisons/${comparisonId}`],
		['report with plan', `/reports/${comparisonId}`],
		['plan page', `/rooms/${roomId}/plan`],
		['build page', `/rooms/${roomId}/plan/build`]
	] as const) {
		const times: number[] = [];
		for (let i = 0; i < REQUESTS + 3; i++) {
			const t0 = performance.now();
			const r = await fetch(env.PUBLIC_BASE_URL + path, { headers: { cookie, accept: path.startsWith('/api') ? 'application/json' : 'text/html' } });
			await r.arrayBuffer();
			if (r.status !== 200) throw new Error(`${path}: ${r.status}`);
			if (i >= 3) times.push(performance.now() - t0); // the first requests warm the server up
		}
		console.log(`${label.padEnd(18)} median ${pct(times, 50).toFixed(1)} ms · p95 ${pct(times, 95).toFixed(1)} ms   (target p95 < 150 ms; ${REQUESTS} requests)`);
	}

	const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
	const context = await browser.newContext({ baseURL: env.PUBLIC_BASE_URL, viewport: { width: 1280, height: 900 } });
	await context.addCookies(cookie.split('; ').map((c) => ({ name: c.split('=')[0], value: c.slice(c.indexOf('=') + 1), url: env.PUBLIC_BASE_URL })));
	const page = await context.newPage();
	const draws: number[] = [];
	for (let i = 0; i < 5; i++) {
		await page.goto(`/sessions/${sessionIds[0]}`, { waitUntil: 'commit' });
		await page.waitForFunction(() => !!document.querySelector('.uplot canvas'), null, { timeout: 30_000 });
		// Data arrive with the page (server-rendered), so "after data" is after the document is parsed.
		draws.push(await page.evaluate(() => performance.now() - (performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming).domInteractive));
	}
	await browser.close();
	console.log(`first chart of ${POSITIONS} overlaid responses drawn ${pct(draws, 50).toFixed(0)} ms after the data (median of 5; target < 300 ms)`);
} finally {
	await k.destroy();
	await web?.stop();
	await stopServices(services);
}
