// The launcher (`npm start`, i.e. scripts/start.sh) stops everything it started when it is sent
// SIGTERM or SIGINT, and starts a killed worker again while the web server stays up. It runs here
// for real, as a child process, on ports and a data dir of its own (RINGDOWN_DATA_DIR and the
// port settings, see scripts/stack.ts), so neither the demo nor the test services are touched.
// "Gone" is checked twice: no process it started is left in /proc, and no port it served still
// accepts a connection — the S3 fake and the mail sink live inside the launcher, so their ports
// are the only sign of them.
import { afterEach, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { createConnection, createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const ROOT = join(import.meta.dirname, '../..');
// What the launcher's stop is allowed to take: the worker finishes the job it holds (analysis
// takes seconds), then MariaDB shuts down cleanly.
const STOP_WITHIN_MS = 45_000;
// Settings of the test run that the launcher would otherwise take over (the demo profile lets the
// environment win); removed so it derives everything from its own ports and data dir.
const INHERITED = [
	'DB_HOST', 'DB_PORT', 'DB_USER', 'DB_PASSWORD', 'DB_NAME', 'S3_ENDPOINT', 'S3_BUCKET', 'S3_ACCESS_KEY_ID',
	'S3_SECRET_ACCESS_KEY', 'SMTP_HOST', 'SMTP_PORT', 'MAIL_SINK_URL', 'PUBLIC_BASE_URL', 'ORIGIN', 'PORT', 'HOST',
	'AUTH_SECRET', 'AUTH_TRUST_HOST', 'RINGDOWN_BUILD_DIR', 'RINGDOWN_DATA_DIR', 'NODE_OPTIONS', 'RINGDOWN_TEST'
];

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function until<T>(probe: () => T | undefined | Promise<T | undefined>, what: string, timeoutMs: number): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const v = await probe();
		if (v !== undefined) return v;
		if (Date.now() > deadline) throw new Error(`Timed out (${timeoutMs} ms) waiting for ${what}`);
		await sleep(100);
	}
}

/** Ports nobody listens on now, chosen by the kernel. */
async function freePorts(n: number): Promise<number[]> {
	const servers = await Promise.all(
		Array.from({ length: n }, () => new Promise<ReturnType<typeof createServer>>((r) => {
			const s = createServer();
			s.listen(0, '127.0.0.1', () => r(s));
		}))
	);
	const found = servers.map((s) => (s.address() as { port: number }).port);
	await Promise.all(servers.map((s) => new Promise((r) => s.close(r))));
	return found;
}

function accepts(port: number): Promise<boolean> {
	return new Promise((resolve) => {
		const c = createConnection({ host: '127.0.0.1', port });
		c.setTimeout(2_000);
		c.once('connect', () => (c.destroy(), resolve(true)));
		c.once('error', () => resolve(false));
		c.once('timeout', () => (c.destroy(), resolve(false)));
	});
}

interface Proc {
	pid: number;
	ppid: number;
	state: string;
	cmdline: string;
}

function readProc(pid: number): Proc | undefined {
	try {
		const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
		// The command name in parentheses may hold spaces: the fields start after the last ')'.
		const [state, ppid] = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
		const cmdline = readFileSync(`/proc/${pid}/cmdline`, 'utf8').replace(/\0/g, ' ').trim();
		return { pid, ppid: Number(ppid), state, cmdline };
	} catch {
		return undefined; // gone
	}
}

/** Every living process below `root` (not `root` itself). */
const everyProcess = () => readdirSync('/proc').filter((d) => /^\d+$/.test(d)).map((d) => readProc(Number(d))).filter((p): p is Proc => !!p);

function below(root: number): Proc[] {
	const all = everyProcess();
	const found: Proc[] = [];
	const parents = new Set([root]);
	for (let grew = true; grew; ) {
		grew = false;
		for (const p of all) {
			if (parents.has(p.ppid) && !parents.has(p.pid)) {
				parents.add(p.pid);
				found.push(p);
				grew = true;
			}
		}
	}
	return found.filter((p) => p.state !== 'Z');
}

function descendants(l: Launcher): Proc[] {
	const found = below(l.child.pid!);
	for (const p of found) l.seen.set(p.pid, p);
	return found;
}

const alive = (pid: number) => {
	const p = readProc(pid);
	return !!p && p.state !== 'Z';
};

interface Launcher {
	child: ChildProcess;
	output: string[];
	exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
	ports: { app: number; db: number; s3: number; smtp: number; mailHttp: number };
	dir: string;
	base: string;
	/** Every process seen below the launcher, for the clean-up after a failed test. */
	seen: Map<number, Proc>;
}

const running: Launcher[] = [];

async function startLauncher(): Promise<Launcher> {
	const [app, db, s3, smtp, mailHttp] = await freePorts(5);
	const dir = mkdtempSync(join(tmpdir(), 'ringdown-launcher-'));
	const env: NodeJS.ProcessEnv = { ...process.env };
	for (const k of INHERITED) delete env[k];
	Object.assign(env, {
		RINGDOWN_DATA_DIR: dir,
		// The test run's build (made fresh before the tests), not the demo's, which must not be rebuilt under it.
		RINGDOWN_BUILD_DIR: 'build-test',
		DB_PORT: String(db),
		S3_ENDPOINT: `http://127.0.0.1:${s3}`,
		SMTP_PORT: String(smtp),
		MAIL_SINK_URL: `http://127.0.0.1:${mailHttp}`,
		PORT: String(app)
	});
	// Its own process group, so nothing aimed at this test run's group reaches it by accident.
	const child = spawn('bash', ['scripts/start.sh'], { cwd: ROOT, env, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
	const output: string[] = [];
	child.stdout!.on('data', (d) => output.push(String(d)));
	child.stderr!.on('data', (d) => output.push(String(d)));
	const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((r) => child.once('exit', (code, signal) => r({ code, signal })));
	const l: Launcher = { child, output, exited, ports: { app, db, s3, smtp, mailHttp }, dir, base: `http://127.0.0.1:${app}`, seen: new Map() };
	running.push(l);
	return l;
}

async function health(base: string): Promise<boolean> {
	try {
		return (await fetch(`${base}/health`, { signal: AbortSignal.timeout(5_000) })).ok;
	} catch {
		return false;
	}
}

async function waitUntilReady(l: Launcher): Promise<void> {
	await until(
		async () => {
			if (l.child.exitCode !== null) throw new Error(`The launcher exited early (${l.child.exitCode}):\n${l.output.join('')}`);
			return (await health(l.base)) ? true : undefined;
		},
		'the launcher to answer /health',
		150_000
	);
	// The ready banner comes after /health answers: by then the worker has been started too.
	await until(() => (l.output.join('').includes('Ringdown is running at') ? true : undefined), 'the ready banner', 10_000);
	// And the worker is past loading its modules (a signal before that ends it by the default action).
	await until(() => (/\[worker [^\]]+\] started/.test(l.output.join('')) ? true : undefined), 'the worker to start', 30_000);
}

const isWorker = (p: Proc) => p.cmdline.includes('scripts/worker.ts');
const isWebServer = (p: Proc) => p.cmdline.includes('build-test/index.js');
const isMariaDb = (p: Proc) => /(^|\/)mariadbd\b/.test(p.cmdline);

/**
 * Signal the launcher (or, as Ctrl-C in a terminal does, its whole process group); it must exit
 * with 0 in time, leaving no process and no open port behind.
 */
async function stopAndCheck(l: Launcher, signal: NodeJS.Signals, to: 'launcher' | 'group' = 'launcher'): Promise<void> {
	const started = descendants(l);
	// What the launcher documents starting is all there before the signal.
	expect(started.filter(isWebServer), 'one web server').toHaveLength(1);
	expect(started.filter(isWorker), 'one worker').toHaveLength(1);
	expect(started.filter(isMariaDb), 'one MariaDB').toHaveLength(1);
	const ports = Object.values(l.ports);
	for (const port of ports) expect(await accepts(port), `port ${port} in use before the stop`).toBe(true);

	const t0 = Date.now();
	process.kill(to === 'group' ? -l.child.pid! : l.child.pid!, signal);
	const result = await Promise.race([l.exited, sleep(STOP_WITHIN_MS).then(() => null)]);
	const tookMs = Date.now() - t0;
	expect(result, `the launcher exits within ${STOP_WITHIN_MS} ms of ${signal}:\n${l.output.join('')}`).not.toBeNull();
	expect(result, l.output.join('')).toEqual({ code: 0, signal: null });
	console.log(`launcher stopped on ${signal} to the ${to} in ${tookMs} ms`);

	expect(l.output.join('')).toContain('» Stopping');
	expect(alive(l.child.pid!)).toBe(false);
	const left = started.filter((p) => alive(p.pid)).map((p) => `${p.pid} ${p.cmdline}`);
	expect(left, 'processes the launcher left running').toEqual([]);
	for (const port of ports) expect(await accepts(port), `port ${port} still accepts connections`).toBe(false);
	// The worker said it stopped (it finishes its job first, then exits on its own).
	expect(l.output.join('')).toMatch(/\[worker [^\]]+\] stopped/);
}

afterEach(async () => {
	// A failed test must not leave a launcher behind: stop the group it leads, then anything still below it.
	for (const l of running.splice(0)) {
		const pid = l.child.pid!;
		descendants(l);
		if (l.child.exitCode === null && l.child.signalCode === null) {
			try {
				process.kill(-pid, 'SIGTERM');
			} catch {
				// already gone
			}
			await Promise.race([l.exited, sleep(STOP_WITHIN_MS)]);
		}
		// Orphans are no longer below the launcher: go by the pids seen, and by the data dir for MariaDB.
		const stray = [...l.seen.values(), ...everyProcess().filter((p) => p.cmdline.includes(l.dir))];
		for (const p of stray) {
			if (alive(p.pid) && readProc(p.pid)?.cmdline === p.cmdline) {
				try {
					process.kill(p.pid, 'SIGKILL');
				} catch {
					// gone meanwhile
				}
			}
		}
		rmSync(l.dir, { recursive: true, force: true });
	}
});

describe('the launcher (npm start)', () => {
	it('starts a killed worker again with the web server up, and stops everything on SIGTERM', async () => {
		const l = await startLauncher();
		await waitUntilReady(l);

		const [worker] = descendants(l).filter(isWorker);
		const [web] = descendants(l).filter(isWebServer);
		process.kill(worker.pid, 'SIGKILL');
		const next = await until(
			() => descendants(l).find((p) => isWorker(p) && p.pid !== worker.pid),
			'a new worker',
			20_000
		);
		expect(next.pid).not.toBe(worker.pid);
		expect(alive(worker.pid)).toBe(false);
		expect(l.output.join('')).toMatch(/worker exited \(SIGKILL\); starting it again in 1\.0 s/);
		// The web server is the same process and still answers.
		expect(alive(web.pid)).toBe(true);
		expect(await health(l.base)).toBe(true);
		// The new worker is a working one: it gets as far as its start-up line.
		await until(() => (l.output.join('').includes(`:${next.pid}] started`) ? true : undefined), 'the new worker to start', 30_000);

		await stopAndCheck(l, 'SIGTERM');
	}, 240_000);

	it('stops everything on SIGINT', async () => {
		const l = await startLauncher();
		await waitUntilReady(l);
		await stopAndCheck(l, 'SIGINT');
	}, 240_000);

	it('stops everything on Ctrl-C, which sends SIGINT to every process of the group at once', async () => {
		const l = await startLauncher();
		await waitUntilReady(l);
		await stopAndCheck(l, 'SIGINT', 'group');
		// The web server got the signal itself and exited first: that is not taken for a crash.
		expect(l.output.join('')).not.toMatch(/web server exited/);
		expect(l.output.join('')).not.toMatch(/worker exited/);
	}, 240_000);
});
