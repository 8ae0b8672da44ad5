import type { Knex } from 'knex';

// Visit records: photos of the room and of each position of a visit, and a note per capture.
// A photo is stored twice in object storage (a display size and a thumbnail, both re-encoded
// without metadata); its row names both objects. A photo of a position that is removed stays
// with the visit (position_id set to null).
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('visit_photos', (t) => {
		t.increments('id').primary();
		t.integer('session_id').unsigned().notNullable().references('sessions.id').onDelete('CASCADE');
		// Null: a photo of the room or the visit as a whole.
		t.integer('position_id').unsigned().nullable().references('positions.id').onDelete('SET NULL');
		t.string('caption', 300).notNullable().defaultTo('');
		t.string('display_key', 255).notNullable().unique();
		t.string('thumb_key', 255).notNullable().unique();
		t.string('content_type', 40).notNullable();
		t.smallint('width').unsigned().notNullable();
		t.smallint('height').unsigned().notNullable();
		t.smallint('thumb_width').unsigned().notNullable();
		t.smallint('thumb_height').unsigned().notNullable();
		t.integer('display_bytes').unsigned().notNullable();
		t.integer('thumb_bytes').unsigned().notNullable();
		// What was uploaded, for the record (the original itself is not kept).
		t.string('original_filename', 255).notNullable();
		t.string('original_type', 40).notNullable();
		t.integer('original_bytes').unsigned().notNullable();
		t.integer('original_width').unsigned().notNullable();
		t.integer('original_height').unsigned().notNullable();
		t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.index(['session_id', 'position_id']);
	});

	await knex.schema.alterTable('captures', (t) => {
		// The acoustician's or consultant's remark on the conditions of the capture ("door open").
		t.string('note', 500).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('captures', (t) => {
		t.dropColumn('note');
	});
	await knex.schema.dropTableIfExists('visit_photos');
}
