import type { Knex } from 'knex';

// Who can sign in, to which organization, in which role; one-time tokens; sign-in attempts.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('organizations', (t) => {
		t.increments('id').primary();
		t.string('name', 200).notNullable();
		t.string('slug', 80).notNullable().unique();
		t.timestamps(true, true);
	});

	await knex.schema.createTable('users', (t) => {
		t.increments('id').primary();
		t.string('email', 254).notNullable().unique();
		t.string('name', 200).notNullable();
		t.string('password_hash', 255).nullable();
		t.enum('unit_system', ['metric', 'imperial']).notNullable().defaultTo('metric');
		t.timestamps(true, true);
	});

	await knex.schema.createTable('memberships', (t) => {
		t.increments('id').primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.integer('organization_id').unsigned().notNullable().references('organizations.id').onDelete('CASCADE');
		t.enum('role', ['admin', 'acoustician', 'consultant', 'client']).notNullable();
		t.timestamps(true, true);
		t.unique(['user_id', 'organization_id']);
		t.index(['organization_id', 'role']);
	});

	await knex.schema.createTable('invitations', (t) => {
		t.increments('id').primary();
		t.integer('organization_id').unsigned().notNullable().references('organizations.id').onDelete('CASCADE');
		t.string('email', 254).notNullable();
		t.enum('role', ['admin', 'acoustician', 'consultant', 'client']).notNullable();
		// For a client: the project the invitation grants. The FK is added with the projects table.
		t.integer('project_id').unsigned().nullable();
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
		t.datetime('expires_at', { precision: 3 }).notNullable();
		t.datetime('accepted_at', { precision: 3 }).nullable();
		t.integer('invited_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.index(['organization_id', 'email']);
	});

	await knex.schema.createTable('password_resets', (t) => {
		t.increments('id').primary();
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
		t.datetime('expires_at', { precision: 3 }).notNullable();
		t.datetime('used_at', { precision: 3 }).nullable();
		t.timestamps(true, true);
	});

	await knex.schema.createTable('login_attempts', (t) => {
		t.bigIncrements('id').primary();
		t.string('email', 254).notNullable();
		t.string('ip', 64).notNullable();
		t.boolean('succeeded').notNullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
		t.index(['email', 'created_at']);
		t.index(['ip', 'created_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('login_attempts');
	await knex.schema.dropTableIfExists('password_resets');
	await knex.schema.dropTableIfExists('invitations');
	await knex.schema.dropTableIfExists('memberships');
	await knex.schema.dropTableIfExists('users');
	await knex.schema.dropTableIfExists('organizations');
}
