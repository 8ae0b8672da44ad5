import type { Knex } from 'knex';

// Sessions that can be ended, and rate limits that hold across web servers.
// - users.session_version: every session token carries the version at its sign-in; raising it
//   (sign out everywhere, a new password, removal from an organization) ends them all at once.
// - ended_sessions: a session signed out on its own, kept until its token would have expired.
// - rate_limits: one row per counted thing (an account's sign-ins, an address's resets…), counted
//   under a row lock so concurrent requests on any server share one count.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('users', (t) => {
		t.integer('session_version').unsigned().notNullable().defaultTo(0);
	});

	await knex.schema.createTable('ended_sessions', (t) => {
		t.string('session_id', 64).primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.datetime('expires_at', { precision: 3 }).notNullable();
		t.index(['expires_at']);
	});

	await knex.schema.createTable('rate_limits', (t) => {
		t.string('bucket', 191).primary();
		t.integer('hits').unsigned().notNullable().defaultTo(0);
		t.datetime('window_ends_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
		t.integer('lockouts').unsigned().notNullable().defaultTo(0);
		t.datetime('blocked_until', { precision: 3 }).nullable();
		t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
		t.index(['updated_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('rate_limits');
	await knex.schema.dropTableIfExists('ended_sessions');
	await knex.schema.alterTable('users', (t) => {
		t.dropColumn('session_version');
	});
}
