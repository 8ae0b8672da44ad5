// `npx tsx scripts/bench-load.ts [base URL] [--connections N] [--duration S] [--email E --password P]
//   [--session ID --comparison ID] [--only visit,comparison,report]`
// The pages users wait for, against the same server's /health: signs in (the demo consultant),
// finds a visit with analysed captures and a comparison through the pages' own links, then drives
// /health and the visit, comparison and report pages in turn with N connections (10) for S seconds
// (15) each (autocannon), all with the same session cookie, and prints per page its requests per
// second as a share of /health's, p50 and p99 and p99/p50, and the errors. The goal (issue 13):
// each page at ≥ 25 % of /health, p99 ≤ 4 × p50, no error. Loopback only; at most 100 connections
// and 120 s per route. Exit status 1 when any answer was an error.
import autocannon from 'autocannon';
import { parseArgs } from 'node:util';
import { assertLoopback } from './probe/raw-http';
import { fetchPage, linksOf, signIn as signInAs } from './probe/signed-in';

const { values, positionals } = parseArgs({
	allowPositionals: true,
	options: {
		connections: { type: 'string', default: '10' },
		duration: { type: 'string', default: '15' },
		email: { type: 'string', default: 'consultant@fenwick-hale.test' },
		password: { type: 'string', default: 'ringdown-demo' },
		session: { type: 'string' },
		comparison: { type: 'string' },
		only: { type: 'string' }
	}
});

const base = assertLoopback(positionals[0] ?? 'http://127.0.0.1:3000');
const connections = Math.min(100, Math.max(1, Number(values.connections) || 10));
const duration = Math.min(120, Math.max(1, Number(values.duration) || 15));

const signIn = () => signInAs(base, values.email!, values.password!);
const page = (cookie: string, path: string) => fetchPage(base, cookie, path);

/** A visit with analysed captures and a comparison the user can open, found through the pages' links. */
async function findTargets(cookie: string): Promise<{ session?: string; comparison?: string }> {
	const found: { session?: string; comparison?: string } = {
		session: values.session && `/sessions/${Number(values.session)}`,
		comparison: values.comparison && `/comparisons/${Number(values.comparison)}`
	};
	if (found.session && found.comparison) return found;
	for (const project of linksOf(await page(cookie, '/projects'), '/projects')) {
		for (const room of linksOf(await page(cookie, project), '/rooms')) {
			const roomHtml = await page(cookie, room);
			found.comparison ??= linksOf(roomHtml, '/comparisons')[0];
			for (const session of linksOf(roomHtml, '/sessions')) {
				if (!found.session && linksOf(await page(cookie, session), '/captures').length > 0) found.session = session;
				if (found.session && found.comparison) return found;
			}
		}
	}
	return found;
}

interface Row {
	route: string;
	path: string;
	rps: number;
	p50: number;
	p99: number;
	errors: number;
}

async function drive(route: string, path: string, cookie: string): Promise<Row> {
	const result = await autocannon({
		url: new URL(path, base).toString(),
		connections,
		duration,
		timeout: 30,
		headers: { cookie, accept: path === '/health' ? 'application/json' : 'text/html' }
	});
	return { route, path, rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, errors: result.non2xx + result.errors + result.timeouts };
}

const cookie = await signIn();
const targets = await findTargets(cookie);
const reportPath = targets.comparison?.replace('/comparisons/', '/reports/');
const pages: [string, string | undefined][] = [
	['visit', targets.session],
	['comparison', targets.comparison],
	['report', reportPath]
];
const only = values.only?.split(',').map((s) => s.trim());
console.log(`Pages against /health on ${base.origin} as ${values.email}: ${connections} connections, ${duration} s per route`);
for (const [route, path] of pages) if (!path) console.log(`${route}: none found for this user — skipped (pass --${route === 'visit' ? 'session' : 'comparison'})`);
const rows: Row[] = [];
const health = await drive('health', '/health', cookie);
rows.push(health);
for (const [route, path] of pages) {
	if (!path || (only && !only.includes(route))) continue;
	await page(cookie, path); // still signed in, and the page opens
	rows.push(await drive(route, path, cookie));
}
console.log('route        path                       req/s   share of /health   p50 ms   p99 ms   p99/p50   errors');
for (const r of rows) {
	const share = r === health ? '' : `${((100 * r.rps) / health.rps).toFixed(1)} %`;
	const spread = r.p50 > 0 ? (r.p99 / r.p50).toFixed(1) : '—';
	console.log(
		`${r.route.padEnd(12)} ${r.path.padEnd(24)} ${r.rps.toFixed(0).padStart(7)}   ${share.padStart(16)}   ${String(r.p50).padStart(6)}   ${String(r.p99).padStart(6)}   ${spread.padStart(7)}   ${r.errors}`
	);
}
const failed = rows.reduce((n, r) => n + r.errors, 0);
process.exit(failed > 0 ? 1 : 0);
