import type { Knex } from 'knex';

// One capture per recording, channel and reference in a visit, held by the database itself, so
// announcements that arrive at the same moment cannot both be accepted. The reference is the
// test signal played (by id), or "an uploaded reference file", or none (an impulse response);
// a persistent generated column spells it out because NULLs never clash in a unique key.
export async function up(knex: Knex): Promise<void> {
	await knex.raw(`
		ALTER TABLE captures ADD COLUMN reference_identity VARCHAR(24) AS (
			CASE
				WHEN sweep_definition_id IS NOT NULL THEN CONCAT('signal:', sweep_definition_id)
				WHEN reference_object_key IS NOT NULL THEN 'uploaded'
				ELSE ''
			END
		) PERSISTENT`);
	// Duplicates that slipped in before the key existed keep their analysis; the later copies
	// lose only their fingerprint (the download check is skipped for them).
	await knex.raw(`
		UPDATE captures c
		JOIN captures first
			ON first.session_id = c.session_id AND first.sha256 = c.sha256 AND first.channel = c.channel
			AND first.reference_identity = c.reference_identity AND first.id < c.id
		SET c.sha256 = NULL`);
	await knex.schema.alterTable('captures', (t) => {
		t.unique(['session_id', 'sha256', 'channel', 'reference_identity'], { indexName: 'captures_one_per_recording' });
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('captures', (t) => {
		t.dropUnique(['session_id', 'sha256', 'channel', 'reference_identity'], 'captures_one_per_recording');
	});
	await knex.schema.alterTable('captures', (t) => {
		t.dropColumn('reference_identity');
	});
}
