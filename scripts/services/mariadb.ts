// A private MariaDB instance from Debian's mariadb-server: own data dir, socket and port on
// 127.0.0.1. Initialised on first start, reused after.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

export interface MariaDbOptions {
	dir: string; // git-ignored folder holding data/, socket, pid and log
	port: number;
	database: string;
	user: string;
	password: string;
}

export interface RunningService {
	name: string;
	stop(): Promise<void>;
}

const NO_DEFAULTS = '--no-defaults'; // must come first: ignore /etc/mysql/*.cnf

function admin(socket: string, ...args: string[]) {
	return spawnSync('mariadb-admin', [NO_DEFAULTS, `--socket=${socket}`, '-uroot', ...args], {
		encoding: 'utf8'
	});
}

function client(socket: string, sql: string) {
	const r = spawnSync('mariadb', [NO_DEFAULTS, `--socket=${socket}`, '-uroot', '-e', sql], { encoding: 'utf8' });
	if (r.status !== 0) throw new Error(`mariadb: ${r.stderr.trim()}`);
}

function pidAlive(pid: number): boolean {
	try {
		process.kill(pid, 0);
		return true;
	} catch {
		return false;
	}
}

async function waitFor(check: () => boolean, what: string, timeoutMs = 30_000): Promise<void> {
	const until = Date.now() + timeoutMs;
	while (!check()) {
		if (Date.now() > until) throw new Error(`Timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 100));
	}
}

export async function startMariaDb(o: MariaDbOptions): Promise<RunningService> {
	const dataDir = join(o.dir, 'data');
	const socket = join(o.dir, 'mysqld.sock');
	const pidFile = join(o.dir, 'mysqld.pid');
	const logFile = join(o.dir, 'error.log');
	mkdirSync(o.dir, { recursive: true });

	// A second server on the same data dir hangs, so reuse a live one instead.
	if (existsSync(pidFile)) {
		const pid = Number(readFileSync(pidFile, 'utf8').trim());
		if (pid && pidAlive(pid) && admin(socket, 'ping').status === 0) {
			ensureDatabase(socket, o);
			return { name: 'mariadb (already running)', stop: async () => {} };
		}
	}

	if (!existsSync(join(dataDir, 'mysql'))) {
		const init = spawnSync(
			'mariadb-install-db',
			[
				NO_DEFAULTS,
				'--user=root',
				'--basedir=/usr',
				`--datadir=${dataDir}`,
				'--auth-root-authentication-method=normal',
				'--skip-test-db',
				'--skip-name-resolve'
			],
			{ encoding: 'utf8' }
		);
		if (init.status !== 0) throw new Error(`mariadb-install-db failed: ${init.stderr || init.stdout}`);
	}

	const child: ChildProcess = spawn(
		'mariadbd',
		[
			NO_DEFAULTS,
			'--user=root',
			'--basedir=/usr',
			`--datadir=${dataDir}`,
			'--bind-address=127.0.0.1',
			`--port=${o.port}`,
			`--socket=${socket}`,
			`--pid-file=${pidFile}`,
			`--log-error=${logFile}`,
			'--skip-name-resolve',
			'--innodb-buffer-pool-size=128M',
			'--max-connections=200',
			'--character-set-server=utf8mb4',
			'--collation-server=utf8mb4_unicode_ci'
		],
		{ stdio: 'ignore' }
	);
	let exited = false;
	child.on('exit', () => (exited = true));

	await waitFor(() => {
		if (exited) throw new Error(`mariadbd exited at start; see ${logFile}`);
		return admin(socket, 'ping').status === 0;
	}, 'MariaDB to answer');
	ensureDatabase(socket, o);

	return {
		name: 'mariadb',
		async stop() {
			if (exited) return;
			admin(socket, 'shutdown');
			await waitFor(() => exited, 'MariaDB to stop', 30_000).catch(() => child.kill('SIGKILL'));
		}
	};
}

function ensureDatabase(socket: string, o: MariaDbOptions) {
	const q = (s: string) => s.replace(/'/g, "''");
	client(
		socket,
		[
			`CREATE DATABASE IF NOT EXISTS \`${o.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
			`CREATE USER IF NOT EXISTS '${q(o.user)}'@'127.0.0.1' IDENTIFIED BY '${q(o.password)}'`,
			`GRANT ALL PRIVILEGES ON \`${o.database}\`.* TO '${q(o.user)}'@'127.0.0.1'`,
			// Tests create and drop scratch databases for migration checks.
			`GRANT ALL PRIVILEGES ON \`${o.database}_scratch%\`.* TO '${q(o.user)}'@'127.0.0.1'`,
			'FLUSH PRIVILEGES'
		].join('; ')
	);
}
