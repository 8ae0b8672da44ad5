import type { Knex } from 'knex';

/**
 * The stored objects rows refer to, by key prefix: which column of which table holds the keys
 * made under each prefix. An object under one of these prefixes that no row names is orphaned;
 * prefixes not listed here are never swept (a new kind of object is safe until it is added).
 */
export const OBJECT_KEY_COLUMNS: Record<string, { table: string; column: string }[]> = {
	'captures/': [{ table: 'captures', column: 'object_key' }],
	'references/': [{ table: 'captures', column: 'reference_object_key' }],
	'sweeps/': [{ table: 'sweep_definitions', column: 'object_key' }],
	'calibrators/': [{ table: 'input_chains', column: 'calibrator_object_key' }],
	'photos/': [
		{ table: 'visit_photos', column: 'display_key' },
		{ table: 'visit_photos', column: 'thumb_key' }
	]
};

/** Of these keys under one prefix, the ones some row still names. */
export async function knownObjectKeys(k: Knex, prefix: string, keys: string[]): Promise<Set<string>> {
	const known = new Set<string>();
	if (keys.length === 0) return known;
	for (const { table, column } of OBJECT_KEY_COLUMNS[prefix] ?? []) {
		const rows = await k(table).whereIn(column, keys).select({ key: column });
		for (const r of rows) known.add(r.key as string);
	}
	return known;
}
