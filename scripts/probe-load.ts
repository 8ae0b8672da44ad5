// `npx tsx scripts/probe-load.ts [base URL] [--connections N] [--duration S] [--email E --password P]
//   [--pid PID] [--session ID --comparison ID --capture ID] [--only projects,visit,...]`
// Load on a running instance on loopback (default the demo, http://127.0.0.1:3000): signs in
// (the demo consultant), finds a visit, a comparison and an analysed capture by following the
// pages' own links, then drives each route (and the analysis JSON the capture page draws from)
// with N connections for S seconds (autocannon) and
// prints one row per route — requests per second, p50 and p99 answer times, non-2xx answers and
// socket errors — and the server's resident memory before, at the peak, after the run and after
// a 10 s pause. Exit status 1 when any answer was an error. Bounded: at most 500 connections and
// 600 s per route.
import autocannon from 'autocannon';
import { parseArgs } from 'node:util';
import { assertLoopback, listeningPid, residentBytes, watchMemory } from './probe/raw-http';
import { fetchPage, linksOf, signIn as signInAs } from './probe/signed-in';

const { values, positionals } = parseArgs({
	allowPositionals: true,
	options: {
		connections: { type: 'string', default: '100' },
		duration: { type: 'string', default: '60' },
		email: { type: 'string', default: 'consultant@fenwick-hale.test' },
		password: { type: 'string', default: 'ringdown-demo' },
		pid: { type: 'string' },
		session: { type: 'string' },
		comparison: { type: 'string' },
		capture: { type: 'string' },
		only: { type: 'string' },
		settle: { type: 'string', default: '10' }
	}
});

const base = assertLoopback(positionals[0] ?? 'http://127.0.0.1:3000');
const connections = Math.min(500, Math.max(1, Number(values.connections)));
const duration = Math.min(600, Math.max(1, Number(values.duration)));
const settleS = Math.min(120, Math.max(0, Number(values.settle)));
const serverPid = values.pid ? Number(values.pid) : listeningPid(Number(base.port || 80));
const MiB = 1024 * 1024;
const mib = (b: number | null | undefined) => (b == null ? '—' : `${(b / MiB).toFixed(0)} MiB`);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const signIn = () => signInAs(base, values.email!, values.password!);
const page = (cookie: string, path: string) => fetchPage(base, cookie, path);

/** A visit, a comparison and a capture the user can open, found through the pages' links. */
async function findTargets(cookie: string): Promise<{ session?: string; comparison?: string; capture?: string }> {
	const found: { session?: string; comparison?: string; capture?: string } = {
		session: values.session && `/sessions/${Number(values.session)}`,
		comparison: values.comparison && `/comparisons/${Number(values.comparison)}`,
		capture: values.capture && `/captures/${Number(values.capture)}`
	};
	if (found.session && found.comparison && found.capture) return found;
	for (const project of linksOf(await page(cookie, '/projects'), '/projects')) {
		for (const room of linksOf(await page(cookie, project), '/rooms')) {
			const roomHtml = await page(cookie, room);
			found.comparison ??= linksOf(roomHtml, '/comparisons')[0];
			for (const session of linksOf(roomHtml, '/sessions')) {
				const captures = linksOf(await page(cookie, session), '/captures');
				if (captures.length > 0) {
					found.session ??= session;
					found.capture ??= captures[0];
				}
				if (found.session && found.capture && found.comparison) return found;
			}
		}
	}
	return found;
}

interface Row {
	route: string;
	path: string;
	requests: number;
	rps: number;
	p50: number;
	p99: number;
	non2xx: number;
	errors: number;
	timeouts: number;
	rssBefore: number | null;
	rssPeak: number | null;
	rssAfter: number | null;
}

async function drive(route: string, path: string, cookie: string): Promise<Row> {
	const before = serverPid ? residentBytes(serverPid) : null;
	const watch = serverPid ? watchMemory(serverPid, 250) : null;
	const result = await autocannon({
		url: new URL(path, base).toString(),
		connections,
		duration,
		timeout: 30,
		headers: { cookie, accept: path.startsWith('/api/') ? 'application/json' : 'text/html' }
	});
	const mem = watch?.stop();
	return {
		route,
		path,
		requests: result.requests.total,
		rps: result.requests.average,
		p50: result.latency.p50,
		p99: result.latency.p99,
		non2xx: result.non2xx,
		errors: result.errors,
		timeouts: result.timeouts,
		rssBefore: before,
		rssPeak: mem ? mem.peakBytes : null,
		rssAfter: serverPid ? residentBytes(serverPid) : null
	};
}

const cookie = await signIn();
const targets = await findTargets(cookie);
const routes: [string, string | undefined][] = [
	['projects', '/projects'],
	['visit', targets.session],
	['comparison', targets.comparison],
	['analysis', targets.capture],
	// The analysis page draws its charts from this JSON.
	['analysis-api', targets.capture && `/api${targets.capture}/analysis`]
];
const only = values.only?.split(',').map((s) => s.trim());
console.log(`Load on ${base.origin} as ${values.email}: ${connections} connections, ${duration} s per route; server pid ${serverPid ?? 'not visible'}`);
const startRss = serverPid ? residentBytes(serverPid) : null;
const rows: Row[] = [];
for (const [route, path] of routes) {
	if (only && !only.includes(route)) continue;
	if (!path) {
		console.log(`${route}: no ${route} page found for this user — skipped (pass it with --${route === 'visit' ? 'session' : route.startsWith('analysis') ? 'capture' : route})`);
		continue;
	}
	// The session may have been ended by something else meanwhile: check it still opens.
	if (!path.startsWith('/api/')) await page(cookie, path);
	const row = await drive(route, path, cookie);
	rows.push(row);
	console.log(
		`${route.padEnd(12)} ${path.padEnd(26)} ${String(row.requests).padStart(7)} req  ${row.rps.toFixed(0).padStart(5)} req/s  p50 ${String(row.p50).padStart(5)} ms  p99 ${String(row.p99).padStart(5)} ms  non-2xx ${row.non2xx}  errors ${row.errors} (timeouts ${row.timeouts})  RSS ${mib(row.rssBefore)} → peak ${mib(row.rssPeak)} → ${mib(row.rssAfter)}`
	);
}
await sleep(settleS * 1000);
const settledRss = serverPid ? residentBytes(serverPid) : null;
console.log(`\nServer RSS: ${mib(startRss)} at the start, ${mib(Math.max(...rows.map((r) => r.rssPeak ?? 0)) || null)} at the peak, ${mib(settledRss)} ${settleS} s after the last run`);
const failed = rows.reduce((n, r) => n + r.non2xx + r.errors, 0);
console.log(`${rows.reduce((n, r) => n + r.requests, 0)} requests, ${failed} errors (non-2xx or socket)`);
process.exit(failed > 0 ? 1 : 0);
