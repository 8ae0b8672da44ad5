import type { Knex } from 'knex';

// Personal API tokens: a user's own keys for scripts, sent as `Authorization: Bearer rdt_…` to
// /api routes. Only the SHA-256 of a token is stored (`token_hash`); `hint` keeps its first
// characters so the owner can tell tokens apart. A token carries scopes (what it may do, within
// its user's role), a required expiry, and the account's session version at its creation: raising
// that version (sign out everywhere, a new password, removal from an organization) ends it.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('api_tokens', (t) => {
		t.increments('id').primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.string('name', 80).notNullable();
		t.specificType('token_hash', 'CHAR(64) CHARACTER SET ascii').notNullable().unique();
		t.string('hint', 16).notNullable();
		t.specificType('scopes', "SET('read','upload','review')").notNullable();
		t.integer('session_version').unsigned().notNullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
		t.datetime('expires_at', { precision: 3 }).notNullable();
		t.datetime('revoked_at', { precision: 3 }).nullable();
		t.datetime('last_used_at', { precision: 3 }).nullable();
		t.string('last_used_address', 45).nullable();
		t.index(['user_id', 'created_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('api_tokens');
}
