// Child processes of the start and test commands: the web server and the worker.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { loadConfig } from '../src/lib/server/config';
import { uploadBodyBytes } from '../src/lib/server/body-limit';

// The repository (as in stack.ts; not imported from there, so tests can use these without the services).
const ROOT = resolve(import.meta.dirname, '..');

export interface Child {
	name: string;
	process: ChildProcess;
	stop(signal?: NodeJS.Signals): Promise<void>;
}

export function startChild(name: string, command: string, args: string[], env: Record<string, string>, quiet = false): Child {
	const child = spawn(command, args, {
		cwd: ROOT,
		env: { ...process.env, ...env },
		stdio: quiet ? ['ignore', 'ignore', 'inherit'] : ['ignore', 'inherit', 'inherit']
	});
	let exited = child.exitCode !== null;
	const done = new Promise<void>((r) => child.once('exit', () => ((exited = true), r())));
	return {
		name,
		process: child,
		async stop(signal: NodeJS.Signals = 'SIGTERM') {
			if (exited) return;
			child.kill(signal);
			const timer = setTimeout(() => child.kill('SIGKILL'), 15_000);
			await done;
			clearTimeout(timer);
		}
	};
}

export function startWebServer(env: Record<string, string>, quiet = false): Child {
	// adapter-node's limit applies to every route, so it is set to what the one large-body route
	// (the scripted upload) needs; the app's handle holds every other route to BODY_MAX_BYTES.
	const bodySizeLimit = String(uploadBodyBytes(loadConfig({ ...process.env, ...env })));
	return startChild('web server', process.execPath, [join(buildDir(env), 'index.js')], { BODY_SIZE_LIMIT: bodySizeLimit, ...env }, quiet);
}

export function startWorker(env: Record<string, string>, quiet = false): Child {
	// Node with the tsx loader rather than the tsx wrapper, so signals reach the worker itself.
	return startChild('worker', process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], env, quiet);
}

export interface Supervised {
	name: string;
	/** Stop restarting and stop the process that runs now. */
	stop(): Promise<void>;
}

export interface Backoff {
	/** First wait before a restart, doubled after each quick exit up to `maxMs`. */
	minMs: number;
	maxMs: number;
	/** A process that ran this long counts as healthy: the next wait starts again at `minMs`. */
	healthyAfterMs: number;
}

export const RESTART_BACKOFF: Backoff = { minMs: 1_000, maxMs: 30_000, healthyAfterMs: 60_000 };

// Ctrl-C signals the whole process group: the child may exit a moment before the launcher's own
// handler runs. An exit is judged only after this, so a stop in progress is not taken for a crash.
const SETTLE_MS = 250;

/** Keep a process running: when it exits on its own, start it again after a growing wait. */
export function supervise(name: string, start: () => Child, backoff: Backoff = RESTART_BACKOFF, log = console.error): Supervised {
	let current: Child;
	let stopped = false;
	let waitMs = backoff.minMs;
	let timer: ReturnType<typeof setTimeout> | undefined;
	const launch = () => {
		const startedAt = Date.now();
		current = start();
		current.process.once('exit', (code, signal) => {
			timer = setTimeout(() => {
				if (stopped) return;
				if (Date.now() - startedAt >= backoff.healthyAfterMs) waitMs = backoff.minMs;
				log(`${name} exited (${signal ?? code}); starting it again in ${(waitMs / 1000).toFixed(1)} s`);
				timer = setTimeout(launch, waitMs);
				waitMs = Math.min(waitMs * 2, backoff.maxMs);
			}, SETTLE_MS);
		});
	};
	launch();
	return {
		name,
		async stop() {
			stopped = true;
			clearTimeout(timer);
			await current.stop();
		}
	};
}

/** Call `then` when the process exits on its own — not when a stop of everything caused it. */
export function onUnexpectedExit(child: Child, stopping: () => boolean, then: (code: number | null, signal: NodeJS.Signals | null) => void): void {
	child.process.once('exit', (code, signal) => setTimeout(() => stopping() || then(code, signal), SETTLE_MS));
}

export async function waitForHttp(url: string, timeoutMs = 60_000): Promise<void> {
	const until = Date.now() + timeoutMs;
	for (;;) {
		try {
			const r = await fetch(url);
			if (r.ok) return;
		} catch {
			// not up yet
		}
		if (Date.now() > until) throw new Error(`Timed out waiting for ${url}`);
		await new Promise((r) => setTimeout(r, 200));
	}
}

function newestMtime(dir: string): number {
	let newest = 0;
	for (const entry of readdirSync(dir, { withFileTypes: true })) {
		const p = join(dir, entry.name);
		newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : statSync(p).mtimeMs);
	}
	return newest;
}

/** Build the app unless the build is newer than every source file. */
/** Where the app is built for this environment: `build` for the demo, `build-test` for the tests. */
export function buildDir(env: Record<string, string | undefined> = process.env): string {
	return env.RINGDOWN_BUILD_DIR || 'build';
}

const BUILD_LOCK = join(ROOT, '.build.lock');

function alive(pid: number): boolean {
	try {
		process.kill(pid, 0);
		return true;
	} catch {
		return false;
	}
}

/**
 * One build at a time in this checkout: every build writes SvelteKit's intermediate files under
 * .svelte-kit, so a demo start and a test run building at once would spoil each other's. The lock
 * is a file holding the builder's pid; one left by a process that died is taken over.
 */
function withBuildLock(work: () => void): void {
	const pause = new Int32Array(new SharedArrayBuffer(4));
	for (;;) {
		try {
			writeFileSync(BUILD_LOCK, String(process.pid), { flag: 'wx' });
			break;
		} catch {
			let holder = 0;
			try {
				holder = Number(readFileSync(BUILD_LOCK, 'utf8').trim());
			} catch {
				continue; // released meanwhile
			}
			if (!Number.isInteger(holder) || holder <= 0 || !alive(holder)) rmSync(BUILD_LOCK, { force: true });
			else Atomics.wait(pause, 0, 0, 250);
		}
	}
	try {
		work();
	} finally {
		rmSync(BUILD_LOCK, { force: true });
	}
}

export function buildIfStale(force = false): void {
	const marker = join(ROOT, buildDir(), 'index.js');
	const inputs = ['src', 'static', 'package-lock.json', 'svelte.config.js', 'vite.config.ts', 'tailwind.config.ts'];
	const stale = () => {
		const sourceTime = Math.max(...inputs.map((i) => (statSync(join(ROOT, i)).isDirectory() ? newestMtime(join(ROOT, i)) : statSync(join(ROOT, i)).mtimeMs)));
		return force || !existsSync(marker) || statSync(marker).mtimeMs <= sourceTime;
	};
	if (!stale()) return;
	withBuildLock(() => {
		if (!stale()) return; // built by the holder of the lock meanwhile
		console.log('» Building the app');
		const r = spawnSync(join(ROOT, 'node_modules/.bin/vite'), ['build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit', env: { ...process.env, RINGDOWN_BUILD_DIR: buildDir() } });
		if (r.status !== 0) throw new Error('The build failed.');
	});
}
