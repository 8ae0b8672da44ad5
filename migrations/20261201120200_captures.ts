import type { Knex } from 'knex';

// Uploaded recordings and the engine's results for them.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('captures', (t) => {
		t.increments('id').primary();
		t.integer('session_id').unsigned().notNullable().references('sessions.id').onDelete('CASCADE');
		t.integer('position_id').unsigned().notNullable().references('positions.id').onDelete('CASCADE');
		t.enum('kind', ['impulse', 'sweep']).notNullable();
		t.string('original_filename', 255).notNullable();
		t.string('object_key', 255).notNullable().unique();
		t.specificType('sha256', 'CHAR(64)').nullable();
		t.bigInteger('size_bytes').unsigned().nullable();
		t.integer('sample_rate').unsigned().nullable();
		t.tinyint('channels').unsigned().nullable();
		t.tinyint('channel').unsigned().notNullable().defaultTo(0);
		t.enum('status', ['awaiting_upload', 'queued', 'analysing', 'analysed', 'failed'])
			.notNullable()
			.defaultTo('awaiting_upload');
		t.text('error').nullable();
		t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.index(['session_id', 'status']);
		t.index(['session_id', 'sha256']);
	});

	await knex.schema.createTable('analyses', (t) => {
		t.increments('id').primary();
		t.integer('capture_id').unsigned().notNullable().unique().references('captures.id').onDelete('CASCADE');
		t.string('engine_version', 32).notNullable();
		t.json('metrics').notNullable();
		t.json('curves').notNullable();
		t.json('warnings').notNullable();
		t.timestamps(true, true);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('analyses');
	await knex.schema.dropTableIfExists('captures');
}
