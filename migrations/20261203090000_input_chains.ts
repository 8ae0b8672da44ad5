import type { Knex } from 'knex';

// Input chains of a visit (microphone, preamplifier, converter at one gain): the SPL calibration
// from a calibrator recording and an optional microphone correction. A chain applies to the
// visit's captures recorded on one channel of their files, or to every channel when it names
// none; a channel-specific chain wins over the visit-wide one. Analyses record the levels they
// were given and whether those are calibrated.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('input_chains', (t) => {
		t.increments('id').primary();
		t.integer('session_id').unsigned().notNullable().references('sessions.id').onDelete('CASCADE');
		// 0-based channel of the capture files this chain is for; null: every channel.
		t.tinyint('channel').unsigned().nullable();
		// One chain per visit and channel (255 stands for "every channel" in the unique key).
		t.specificType('channel_key', 'SMALLINT AS (COALESCE(`channel`, 255)) PERSISTENT');
		t.string('label', 120).nullable();

		// Calibration: the calibrator recording and what was read from it.
		t.string('calibrator_object_key', 255).nullable().unique();
		t.string('calibrator_filename', 255).nullable();
		t.specificType('calibrator_sha256', 'CHAR(64)').nullable();
		t.integer('calibrator_size_bytes').unsigned().nullable();
		t.tinyint('calibrator_channel').unsigned().nullable();
		t.double('stated_level_db_spl').nullable();
		t.double('tone_dbfs').nullable();
		// dB SPL = dBFS + offset_db.
		t.double('offset_db').nullable();
		t.json('calibration').nullable();
		t.integer('calibrated_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.datetime('calibrated_at', { precision: 3 }).nullable();

		// Microphone correction: the parsed points of the file, and how to read them.
		t.string('correction_filename', 255).nullable();
		t.json('correction_points').nullable();
		t.json('correction_comments').nullable();
		t.enum('correction_sense', ['deviation', 'correction']).nullable();
		t.integer('corrected_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.datetime('corrected_at', { precision: 3 }).nullable();

		t.timestamps(true, true);
		t.unique(['session_id', 'channel_key']);
	});
	await knex.raw(
		'ALTER TABLE input_chains ADD CONSTRAINT input_chains_calibration_whole CHECK ((calibrator_object_key IS NULL) = (offset_db IS NULL) AND (offset_db IS NULL) = (stated_level_db_spl IS NULL))'
	);
	await knex.raw('ALTER TABLE input_chains ADD CONSTRAINT input_chains_correction_whole CHECK ((correction_points IS NULL) = (correction_sense IS NULL))');

	await knex.schema.alterTable('analyses', (t) => {
		// Band levels and the response shift the analysis was given (JSON), and whether they are dB SPL.
		t.json('levels').nullable();
		t.boolean('levels_calibrated').notNullable().defaultTo(false);
		t.integer('input_chain_id').unsigned().nullable().references('input_chains.id').onDelete('SET NULL');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('analyses', (t) => {
		t.dropForeign(['input_chain_id']);
		t.dropColumn('input_chain_id');
		t.dropColumn('levels_calibrated');
		t.dropColumn('levels');
	});
	await knex.schema.dropTableIfExists('input_chains');
}
