import knex, { type Knex } from 'knex';
import { config, type AppConfig } from './config';

/** Knex settings for a configuration; shared by the app, the worker, scripts and tests. */
export function knexSettings(c: AppConfig): Knex.Config {
	return {
		client: 'mysql2',
		connection: {
			host: c.DB_HOST,
			port: c.DB_PORT,
			user: c.DB_USER,
			password: c.DB_PASSWORD,
			database: c.DB_NAME,
			charset: 'utf8mb4',
			timezone: 'Z',
			// DECIMAL columns come back as numbers, not strings.
			decimalNumbers: true,
			supportBigNumbers: true
		},
		pool: { min: 0, max: c.DB_POOL_MAX }
	};
}

let instance: Knex | undefined;

/** The one Knex instance of this process. */
export function db(): Knex {
	instance ??= knex(knexSettings(config()));
	return instance;
}

/** Close the pool (on shutdown, so the process can exit promptly). */
export async function closeDb(): Promise<void> {
	if (instance) {
		const k = instance;
		instance = undefined;
		await k.destroy();
	}
}
