import type { Knex } from 'knex';

// The workshop side of a plan: the largest piece the saw can take (sheets bigger than that are
// broken down first), and a sheet's nominal thickness beside the measured one it is cut at.
export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('treatment_plans', (t) => {
		t.decimal('saw_max_length_mm', 9, 2).nullable();
		t.decimal('saw_max_width_mm', 9, 2).nullable();
	});
	await knex.schema.alterTable('stock_sheets', (t) => {
		// The name the sheet is sold by ("1/2 in" = 12.7 mm); thickness_mm is what the caliper reads.
		t.decimal('nominal_thickness_mm', 6, 3).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('stock_sheets', (t) => {
		t.dropColumn('nominal_thickness_mm');
	});
	await knex.schema.alterTable('treatment_plans', (t) => {
		t.dropColumn('saw_max_width_mm');
		t.dropColumn('saw_max_length_mm');
	});
}
