import type { Knex } from 'knex';
import { loadConfig } from './src/lib/server/config';
import { knexSettings } from './src/lib/server/db';

const c = loadConfig();

const knexConfig: Knex.Config = {
	...knexSettings(c),
	migrations: { directory: './migrations', extension: 'ts', loadExtensions: ['.ts'] }
};

export default knexConfig;
