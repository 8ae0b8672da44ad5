import knex, { type Knex } from 'knex';
import { loadConfig } from '../../src/lib/server/config';
import { knexSettings } from '../../src/lib/server/db';

/** A Knex connection to the test database for one test file; destroy it in afterAll. */
export function testDb(): Knex {
	return knex(knexSettings(loadConfig(process.env)));
}
