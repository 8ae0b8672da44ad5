import type { Knex } from 'knex';

// One row per creating form sent: the form's one-time key (rendered with the form), the action it
// went to, and what the action answered. A second submission with the same key — a double click,
// a browser resending — gets that same answer instead of creating the thing again.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('form_submissions', (t) => {
		t.string('form_key', 64).notNullable();
		t.string('action', 255).notNullable();
		t.json('outcome').nullable(); // null while the first submission is being handled
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		t.primary(['form_key', 'action']);
		t.index(['created_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTable('form_submissions');
}
