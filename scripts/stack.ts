// The local stack for one profile: MariaDB, the S3 fake and the mail sink on loopback, each
// on its own ports and data dir so the demo and the tests never share anything.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { join, resolve } from 'node:path';
import knex from 'knex';
import { startMariaDb, type RunningService } from './services/mariadb';
import { startObjectStore } from './services/object-store';
import { startMailSink } from './services/mail-sink';
import { loadConfig } from '../src/lib/server/config';
import { knexSettings } from '../src/lib/server/db';

export type Profile = 'demo' | 'test';

interface Ports {
	db: number;
	s3: number;
	smtp: number;
	mailHttp: number;
	app: number;
}

const PORTS: Record<Profile, Ports> = {
	demo: { db: 3307, s3: 4569, smtp: 2525, mailHttp: 8025, app: 3000 },
	test: { db: 3317, s3: 4579, smtp: 2535, mailHttp: 8035, app: 3100 }
};

export const ROOT = resolve(import.meta.dirname, '..');

// The demo's data dir and ports can be moved by the environment (RINGDOWN_DATA_DIR, and the
// ports in DB_PORT, S3_ENDPOINT, SMTP_PORT, MAIL_SINK_URL and PORT), so a second launcher can run
// beside it; unset, they are the defaults above. The test profile ignores the environment.
export function dataDir(profile: Profile): string {
	if (profile === 'demo' && process.env.RINGDOWN_DATA_DIR) return resolve(process.env.RINGDOWN_DATA_DIR);
	return join(ROOT, profile === 'demo' ? '.data' : '.test-data');
}

function portFrom(value: string | undefined, fallback: number, url = false): number {
	const text = url && value ? new URL(value).port : value;
	if (!text) return fallback; // unset, or a URL on its scheme's default port
	const n = Number(text);
	if (!Number.isInteger(n) || n <= 0 || n > 65535) throw new Error(`Not a port: ${value}`);
	return n;
}

export function ports(profile: Profile): Ports {
	const p = PORTS[profile];
	if (profile !== 'demo') return p;
	const e = process.env;
	return {
		db: portFrom(e.DB_PORT, p.db),
		s3: portFrom(e.S3_ENDPOINT, p.s3, true),
		smtp: portFrom(e.SMTP_PORT, p.smtp),
		mailHttp: portFrom(e.MAIL_SINK_URL, p.mailHttp, true),
		app: portFrom(e.PORT, p.app)
	};
}

function authSecret(dir: string): string {
	const file = join(dir, 'auth-secret');
	if (!existsSync(file)) {
		mkdirSync(dir, { recursive: true });
		writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
	}
	return readFileSync(file, 'utf8').trim();
}

/** Environment for the app, the worker and scripts of a profile; explicit settings win. */
export function profileEnv(profile: Profile): Record<string, string> {
	const p = ports(profile);
	const base = `http://127.0.0.1:${p.app}`;
	const defaults: Record<string, string> = {
		DB_HOST: '127.0.0.1',
		DB_PORT: String(p.db),
		DB_USER: 'ringdown',
		DB_PASSWORD: 'ringdown',
		DB_NAME: profile === 'demo' ? 'ringdown' : 'ringdown_test',
		S3_ENDPOINT: `http://127.0.0.1:${p.s3}`,
		S3_BUCKET: profile === 'demo' ? 'ringdown-demo' : 'ringdown-test',
		S3_ACCESS_KEY_ID: 'S3RVER',
		S3_SECRET_ACCESS_KEY: 'S3RVER',
		SMTP_HOST: '127.0.0.1',
		SMTP_PORT: String(p.smtp),
		MAIL_SINK_URL: `http://127.0.0.1:${p.mailHttp}`,
		PUBLIC_BASE_URL: base,
		ORIGIN: base,
		PORT: String(p.app),
		HOST: '127.0.0.1',
		AUTH_SECRET: authSecret(dataDir(profile)),
		AUTH_TRUST_HOST: 'true',
		RINGDOWN_BUILD_DIR: profile === 'demo' ? 'build' : 'build-test'
	};
	// For the demo, a value already in the environment (e.g. from a shell) takes precedence;
	// the test profile is fully isolated and ignores it.
	if (profile === 'demo') {
		for (const k of Object.keys(defaults)) {
			const v = process.env[k];
			if (v) defaults[k] = v;
		}
	}
	return defaults;
}

export async function startServices(profile: Profile): Promise<RunningService[]> {
	const dir = dataDir(profile);
	const p = ports(profile);
	const env = profileEnv(profile);
	const started: RunningService[] = [];
	try {
		started.push(
			await startMariaDb({
				dir: join(dir, 'mariadb'),
				port: p.db,
				database: env.DB_NAME,
				user: env.DB_USER,
				password: env.DB_PASSWORD
			})
		);
		started.push(await startObjectStore({ dir: join(dir, 's3'), port: p.s3, bucket: env.S3_BUCKET }));
		started.push(await startMailSink({ dir: join(dir, 'mail'), smtpPort: p.smtp, httpPort: p.mailHttp }));
		return started;
	} catch (e) {
		await stopServices(started);
		throw e;
	}
}

export async function stopServices(services: RunningService[]): Promise<void> {
	for (const s of [...services].reverse()) {
		try {
			await s.stop();
		} catch (e) {
			console.error(`Could not stop ${s.name}:`, e);
		}
	}
}

/** Bring the schema to the latest migration. */
export async function migrate(env: Record<string, string>): Promise<string[]> {
	const k = knex(knexSettings(loadConfig(env)));
	try {
		const [, applied] = (await k.migrate.latest({
			directory: join(ROOT, 'migrations'),
			loadExtensions: ['.ts']
		})) as [number, string[]];
		return applied;
	} finally {
		await k.destroy();
	}
}
