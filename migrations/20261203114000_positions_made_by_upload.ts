import type { Knex } from 'knex';

// A position that an upload named into being ("new position P4") is marked until it is kept:
// until a capture of it arrives in storage or someone edits it. If the upload is refused,
// withdrawn or abandoned before that, the position goes with it — an empty position nobody made
// on purpose is not left behind.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('positions', (t) => {
		t.boolean('made_by_upload').notNullable().defaultTo(false);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('positions', (t) => {
		t.dropColumn('made_by_upload');
	});
}
