import type { Knex } from 'knex';

// What a consultant decides about a comparison before it reaches the client.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('comparisons', (t) => {
		// Raw quality flags stay internal unless the consultant chooses to show them.
		t.boolean('share_quality_notes').notNullable().defaultTo(false);
		t.integer('published_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('comparisons', (t) => {
		t.dropForeign(['published_by']);
		t.dropColumn('published_by');
		t.dropColumn('share_quality_notes');
	});
}
