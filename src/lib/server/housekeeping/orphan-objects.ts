// Objects that no row knows: a presigned upload reused after its capture was refused or deleted,
// or a write whose row was never committed. They are removed once they are older than a day, so
// an upload still on its way — whose row names its key from the moment it is announced — and
// any object whose row is just being written are never touched.
import type { Knex } from 'knex';
import type { Storage } from '../storage';
import { knownObjectKeys, OBJECT_KEY_COLUMNS } from '../queries/objects';

export const ORPHAN_MIN_AGE_MS = 24 * 3600_000;

/** Remove orphaned objects last modified before `olderThan`; how many were removed. */
export async function removeOrphanObjects(k: Knex, s: Storage, olderThan = new Date(Date.now() - ORPHAN_MIN_AGE_MS)): Promise<number> {
	let removed = 0;
	for (const prefix of Object.keys(OBJECT_KEY_COLUMNS)) {
		let after: string | undefined;
		do {
			const page = await s.list(prefix, after);
			after = page.next;
			// The object's age first, the rows after: a key made after the listing cannot be old.
			const old = page.objects.filter((o) => o.lastModified < olderThan).map((o) => o.key);
			const known = await knownObjectKeys(k, prefix, old);
			for (const key of old) {
				if (known.has(key)) continue;
				await s.remove(key);
				removed++;
			}
		} while (after);
	}
	return removed;
}
