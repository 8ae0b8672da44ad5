import type { Knex } from 'knex';

// A project per client engagement; rooms with dimensions; measurement sessions and positions.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('projects', (t) => {
		t.increments('id').primary();
		t.integer('organization_id').unsigned().notNullable().references('organizations.id').onDelete('CASCADE');
		t.string('name', 200).notNullable();
		t.string('client_name', 200).notNullable();
		t.text('description').nullable();
		t.timestamps(true, true);
		t.index(['organization_id']);
	});

	await knex.schema.alterTable('invitations', (t) => {
		t.foreign('project_id').references('projects.id').onDelete('CASCADE');
	});

	await knex.schema.createTable('project_members', (t) => {
		t.increments('id').primary();
		t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
		t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
		t.timestamps(true, true);
		t.unique(['project_id', 'user_id']);
		t.index(['user_id']);
	});

	await knex.schema.createTable('rooms', (t) => {
		t.increments('id').primary();
		t.integer('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
		t.string('name', 200).notNullable();
		t.decimal('length_m', 8, 3).notNullable();
		t.decimal('width_m', 8, 3).notNullable();
		t.decimal('height_m', 8, 3).notNullable();
		t.enum('room_use', ['listening', 'control', 'home-theatre', 'rehearsal', 'speech', 'other'])
			.notNullable()
			.defaultTo('listening');
		t.text('notes').nullable();
		t.timestamps(true, true);
		t.index(['project_id']);
	});
	// Volume is derived, so the database keeps it and nobody can store a wrong one.
	await knex.raw(
		'ALTER TABLE rooms ADD COLUMN volume_m3 DECIMAL(14,3) AS (length_m * width_m * height_m) STORED AFTER height_m'
	);

	await knex.schema.createTable('sessions', (t) => {
		t.increments('id').primary();
		t.integer('room_id').unsigned().notNullable().references('rooms.id').onDelete('CASCADE');
		t.string('condition_label', 120).notNullable();
		t.date('measured_on').notNullable();
		t.text('notes').nullable();
		t.integer('acoustician_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.index(['room_id', 'measured_on']);
	});

	await knex.schema.createTable('positions', (t) => {
		t.increments('id').primary();
		t.integer('session_id').unsigned().notNullable().references('sessions.id').onDelete('CASCADE');
		t.string('label', 80).notNullable();
		t.string('source_label', 80).nullable();
		t.string('mic_label', 80).nullable();
		for (const axis of ['x', 'y', 'z']) {
			t.decimal(`source_${axis}_m`, 8, 3).nullable();
			t.decimal(`mic_${axis}_m`, 8, 3).nullable();
		}
		t.timestamps(true, true);
		t.unique(['session_id', 'label']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('positions');
	await knex.schema.dropTableIfExists('sessions');
	await knex.schema.dropTableIfExists('rooms');
	await knex.schema.dropTableIfExists('project_members');
	await knex.schema.alterTable('invitations', (t) => {
		t.dropForeign(['project_id']);
	});
	await knex.schema.dropTableIfExists('projects');
}
