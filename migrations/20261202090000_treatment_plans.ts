import type { Knex } from 'knex';

const SURFACES = ['floor', 'ceiling', 'front', 'back', 'left', 'right'];

// Treatment planning: the room's finishes and openings, the organization's own materials, and
// per room one plan of treatment items with the sheet stock they are cut from.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('custom_materials', (t) => {
		t.increments('id').primary();
		t.integer('organization_id').unsigned().notNullable().references('organizations.id').onDelete('CASCADE');
		t.string('name', 120).notNullable();
		// Random-incidence coefficients at 125, 250, 500, 1000, 2000, 4000 Hz.
		for (const f of [125, 250, 500, 1000, 2000, 4000]) t.decimal(`a${f}`, 4, 3).notNullable();
		t.string('source', 500).notNullable();
		t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
		t.unique(['organization_id', 'name']);
	});

	// A finish is either a built-in material (by id) or one of the organization's own; a used
	// custom material cannot be deleted from under a room (RESTRICT).
	const finish = (t: Knex.CreateTableBuilder) => {
		t.string('material_id', 64).nullable();
		t.integer('custom_material_id').unsigned().nullable().references('custom_materials.id').onDelete('RESTRICT');
	};

	await knex.schema.createTable('room_surfaces', (t) => {
		t.increments('id').primary();
		t.integer('room_id').unsigned().notNullable().references('rooms.id').onDelete('CASCADE');
		t.enum('surface', SURFACES).notNullable();
		finish(t);
		t.timestamps(true, true);
		t.unique(['room_id', 'surface']);
	});
	await knex.raw('ALTER TABLE room_surfaces ADD CONSTRAINT room_surfaces_one_finish CHECK ((material_id IS NULL) <> (custom_material_id IS NULL))');

	await knex.schema.createTable('room_openings', (t) => {
		t.increments('id').primary();
		t.integer('room_id').unsigned().notNullable().references('rooms.id').onDelete('CASCADE');
		t.string('label', 80).notNullable();
		t.enum('surface', SURFACES).notNullable();
		t.decimal('width_m', 8, 3).notNullable();
		t.decimal('height_m', 8, 3).notNullable();
		finish(t);
		t.timestamps(true, true);
		t.index(['room_id']);
	});
	await knex.raw('ALTER TABLE room_openings ADD CONSTRAINT room_openings_one_finish CHECK ((material_id IS NULL) <> (custom_material_id IS NULL))');

	await knex.schema.createTable('treatment_plans', (t) => {
		t.increments('id').primary();
		t.integer('room_id').unsigned().notNullable().unique().references('rooms.id').onDelete('CASCADE');
		t.integer('baseline_session_id').unsigned().nullable().references('sessions.id').onDelete('SET NULL');
		t.integer('after_session_id').unsigned().nullable().references('sessions.id').onDelete('SET NULL');
		t.decimal('temperature_c', 4, 1).notNullable().defaultTo(20);
		t.decimal('humidity_pct', 4, 1).notNullable().defaultTo(50);
		t.decimal('kerf_mm', 4, 2).notNullable().defaultTo(3);
		t.specificType('currency', 'CHAR(3)').notNullable().defaultTo('EUR');
		t.text('notes').nullable();
		t.boolean('include_in_report').notNullable().defaultTo(true);
		t.integer('updated_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
		t.timestamps(true, true);
	});

	await knex.schema.createTable('treatment_items', (t) => {
		t.increments('id').primary();
		t.integer('plan_id').unsigned().notNullable().references('treatment_plans.id').onDelete('CASCADE');
		t.enum('kind', ['porous', 'membrane', 'diffuser']).notNullable();
		t.string('label', 120).notNullable();
		t.enum('surface', SURFACES).nullable();
		t.integer('quantity').unsigned().notNullable();
		// Two decimals keep inch sizes (1/16″ = 1.5875 mm) to within 0.005 mm.
		t.decimal('width_mm', 9, 2).notNullable();
		t.decimal('height_mm', 9, 2).notNullable();
		// Kind-specific design parameters, validated by the application's schema on write and read.
		t.json('params').notNullable();
		t.decimal('unit_price', 12, 2).nullable();
		t.integer('problem_band_id').unsigned().nullable().references('problem_bands.id').onDelete('SET NULL');
		t.text('why').nullable();
		t.timestamps(true, true);
		t.index(['plan_id']);
	});

	await knex.schema.createTable('stock_sheets', (t) => {
		t.increments('id').primary();
		t.integer('plan_id').unsigned().notNullable().references('treatment_plans.id').onDelete('CASCADE');
		t.string('label', 60).notNullable();
		t.decimal('length_mm', 9, 2).notNullable();
		t.decimal('width_mm', 9, 2).notNullable();
		t.decimal('thickness_mm', 6, 3).notNullable();
		t.tinyint('finished_faces').unsigned().notNullable();
		t.enum('grain', ['along-length', 'none']).notNullable();
		t.decimal('price', 12, 2).nullable();
		t.timestamps(true, true);
		t.unique(['plan_id', 'label']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('stock_sheets');
	await knex.schema.dropTableIfExists('treatment_items');
	await knex.schema.dropTableIfExists('treatment_plans');
	await knex.schema.dropTableIfExists('room_openings');
	await knex.schema.dropTableIfExists('room_surfaces');
	await knex.schema.dropTableIfExists('custom_materials');
}
