import type { Knex } from 'knex';

// Background work, the audit trail and outgoing mail.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('jobs', (t) => {
		t.bigIncrements('id').primary();
		t.string('type', 64).notNullable();
		t.json('payload').notNullable();
		t.enum('status', ['queued', 'running', 'done', 'dead']).notNullable().defaultTo('queued');
		t.integer('attempts').unsigned().notNullable().defaultTo(0);
		t.integer('max_attempts').unsigned().notNullable().defaultTo(5);
		t.datetime('run_after', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
		t.string('lease_owner', 128).nullable();
		t.datetime('lease_expires_at', { precision: 3 }).nullable();
		t.text('last_error').nullable();
		t.datetime('finished_at', { precision: 3 }).nullable();
		t.timestamps(true, true);
		t.index(['status', 'run_after']);
		t.index(['status', 'lease_expires_at']);
	});

	await knex.schema.createTable('audit_events', (t) => {
		t.bigIncrements('id').primary();
		t.integer('organization_id').unsigned().nullable().references('organizations.id').onDelete('CASCADE');
		t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.string('action', 64).notNullable();
		t.string('entity_type', 64).notNullable();
		t.integer('entity_id').unsigned().nullable();
		t.json('details').nullable();
		t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
		t.index(['organization_id', 'created_at']);
		t.index(['entity_type', 'entity_id']);
	});

	await knex.schema.createTable('email_outbox', (t) => {
		t.bigIncrements('id').primary();
		t.string('to_address', 254).notNullable();
		t.string('subject', 250).notNullable();
		t.text('text_body').notNullable();
		t.text('html_body').nullable();
		t.string('kind', 64).notNullable();
		t.enum('status', ['pending', 'sent', 'failed']).notNullable().defaultTo('pending');
		t.integer('attempts').unsigned().notNullable().defaultTo(0);
		t.datetime('next_attempt_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
		t.text('last_error').nullable();
		t.datetime('sent_at', { precision: 3 }).nullable();
		t.timestamps(true, true);
		t.index(['status', 'next_attempt_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('email_outbox');
	await knex.schema.dropTableIfExists('audit_events');
	await knex.schema.dropTableIfExists('jobs');
}
