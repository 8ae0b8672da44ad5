import type { Knex } from 'knex';

// Test signals handed out to acousticians, and what the capture pipeline needs on top of the
// first cut of captures: which sweep a recording was played with, and a once-per-batch notice.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('sweep_definitions', (t) => {
		t.increments('id').primary();
		t.integer('organization_id').unsigned().notNullable().references('organizations.id').onDelete('CASCADE');
		t.string('name', 120).notNullable();
		t.double('f1_hz').notNullable();
		t.double('f2_hz').notNullable();
		t.double('duration_s').notNullable();
		t.double('fade_in_s').notNullable();
		t.double('fade_out_s').notNullable();
		t.double('silence_s').notNullable();
		t.integer('sample_rate').unsigned().notNullable();
		t.string('bit_depth', 4).notNullable();
		t.double('level_dbfs').notNullable();
		t.string('object_key', 255).notNullable().unique();
		t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.index(['organization_id']);
	});

	await knex.schema.alterTable('captures', (t) => {
		t.integer('sweep_definition_id').unsigned().nullable().references('sweep_definitions.id').onDelete('RESTRICT');
		// A recorded sweep may instead come with the played sweep uploaded next to it.
		t.string('reference_object_key', 255).nullable();
		t.double('duration_s').nullable();
		t.integer('analysis_attempts').unsigned().notNullable().defaultTo(0);
	});

	await knex.schema.alterTable('sessions', (t) => {
		// Set when the "all captures analysed" e-mail went out; cleared when captures are added.
		t.datetime('analysed_notice_at', { precision: 3 }).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('sessions', (t) => {
		t.dropColumn('analysed_notice_at');
	});
	await knex.schema.alterTable('captures', (t) => {
		t.dropForeign(['sweep_definition_id']);
		t.dropColumn('sweep_definition_id');
		t.dropColumn('reference_object_key');
		t.dropColumn('duration_s');
		t.dropColumn('analysis_attempts');
	});
	await knex.schema.dropTableIfExists('sweep_definitions');
}
