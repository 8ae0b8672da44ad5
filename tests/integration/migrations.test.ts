import { afterAll, describe, expect, it } from 'vitest';
import knex, { type Knex } from 'knex';
import { join } from 'node:path';
import { loadConfig } from '../../src/lib/server/config';
import { knexSettings } from '../../src/lib/server/db';

// Runs the whole migration history up, down and up again on a scratch database, so every
// `down` is proven to undo its `up` against the real MariaDB.
const c = loadConfig(process.env);
const scratch = `${c.DB_NAME}_scratch_migrations`;
const admin = knex(knexSettings(c));
let k: Knex | undefined;
const migrations = { directory: join(import.meta.dirname, '../../migrations'), loadExtensions: ['.ts'] };

const tables = async (db: Knex) =>
	(await db.raw('SHOW TABLES'))[0].map((r: Record<string, string>) => Object.values(r)[0]).filter((t: string) => !t.startsWith('knex_')).sort();

afterAll(async () => {
	await k?.destroy();
	await admin.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
	await admin.destroy();
});

describe('migrations', () => {
	it('run up, down and up again cleanly', async () => {
		await admin.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
		await admin.raw(`CREATE DATABASE \`${scratch}\``);
		k = knex(knexSettings({ ...c, DB_NAME: scratch }));

		await k.migrate.latest(migrations);
		const afterUp = await tables(k);
		for (const t of ['organizations', 'users', 'memberships', 'projects', 'project_members', 'rooms', 'sessions', 'positions', 'captures', 'analyses', 'comparisons', 'problem_bands', 'jobs', 'audit_events', 'email_outbox', 'invitations', 'password_resets'])
			expect(afterUp).toContain(t);

		await k.migrate.rollback(migrations, true);
		expect(await tables(k)).toEqual([]);

		await k.migrate.latest(migrations);
		expect(await tables(k)).toEqual(afterUp);
	});

	it('derives the room volume in the database', async () => {
		const [org] = await k!('organizations').insert({ name: 'Volume check', slug: 'volume-check' });
		const [project] = await k!('projects').insert({ organization_id: org, name: 'p', client_name: 'c' });
		const [room] = await k!('rooms').insert({ project_id: project, name: 'r', length_m: 6.2, width_m: 4.35, height_m: 2.7 });
		const row = await k!('rooms').where({ id: room }).first('volume_m3');
		expect(Number(row.volume_m3)).toBeCloseTo(72.819, 3); // 6.2 × 4.35 × 2.7, DECIMAL(14,3)
	});

	it('enforces foreign keys', async () => {
		await expect(k!('rooms').insert({ project_id: 999999, name: 'orphan', length_m: 1, width_m: 1, height_m: 1 })).rejects.toMatchObject({ code: 'ER_NO_REFERENCED_ROW_2' });
	});
});
