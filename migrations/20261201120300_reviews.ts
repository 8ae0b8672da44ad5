import type { Knex } from 'knex';

// A consultant's view of a room: comparisons of two sessions, and problem bands.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('comparisons', (t) => {
		t.increments('id').primary();
		t.integer('room_id').unsigned().notNullable().references('rooms.id').onDelete('CASCADE');
		t.integer('baseline_session_id').unsigned().notNullable().references('sessions.id').onDelete('CASCADE');
		t.integer('treated_session_id').unsigned().notNullable().references('sessions.id').onDelete('CASCADE');
		t.string('title', 200).notNullable();
		t.text('advice').nullable();
		t.datetime('published_at', { precision: 3 }).nullable();
		t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.index(['room_id']);
	});

	await knex.schema.createTable('problem_bands', (t) => {
		t.increments('id').primary();
		t.integer('room_id').unsigned().notNullable().references('rooms.id').onDelete('CASCADE');
		t.integer('comparison_id').unsigned().nullable().references('comparisons.id').onDelete('SET NULL');
		t.integer('capture_id').unsigned().nullable().references('captures.id').onDelete('SET NULL');
		t.double('f_lo_hz').notNullable();
		t.double('f_hi_hz').notNullable();
		t.double('t_lo_ms').nullable();
		t.double('t_hi_ms').nullable();
		t.enum('severity', ['minor', 'moderate', 'severe']).notNullable();
		t.text('note').notNullable();
		t.enum('status', ['open', 'addressed']).notNullable().defaultTo('open');
		t.integer('author_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.index(['room_id', 'status']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('problem_bands');
	await knex.schema.dropTableIfExists('comparisons');
}
