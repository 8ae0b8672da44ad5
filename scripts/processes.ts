// Child processes of the start and test commands: the web server and the worker.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
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
	return startChild('web server', process.execPath, ['build/index.js'], { BODY_SIZE_LIMIT: bodySizeLimit, ...env }, quiet);
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
export function buildIfStale(force = false): void {
	const marker = join(ROOT, 'build/index.js');
	const inputs = ['src', 'static', 'package-lock.json', 'svelte.config.js', 'vite.config.ts', 'tailwind.config.ts'];
	const sourceTime = Math.max(...inputs.map((i) => (statSync(join(ROOT, i)).isDirectory() ? newestMtime(join(ROOT, i)) : statSync(join(ROOT, i)).mtimeMs)));
	if (!force && existsSync(marker) && statSync(marker).mtimeMs > sourceTime) return;
	console.log('» Building the app');
	const r = spawnSync(join(ROOT, 'node_modules/.bin/vite'), ['build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit' });
	if (r.status !== 0) throw new Error('The build failed.');
}
