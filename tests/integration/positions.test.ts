import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { randomUUID } from 'node:crypto';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, type Client } from '../helpers/http';

// A visit's positions can be renamed, moved and removed; one that holds captures is kept, and a
// position of another visit is not reached through this one.
let k: Knex;
let tree: ProjectTree;
let other: ProjectTree;
let acoustician: Client;
let client: Client;

beforeAll(async () => {
	k = testDb();
	const orgId = await makeOrganization(k);
	const clientUser = await makeUser(k, orgId, 'client', { password: TEST_PASSWORD });
	tree = await makeProjectTree(k, orgId, clientUser.id);
	other = await makeProjectTree(k, orgId);
	acoustician = await signedInClient((await makeUser(k, orgId, 'acoustician', { password: TEST_PASSWORD })).email, TEST_PASSWORD);
	client = await signedInClient(clientUser.email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

const position = (id: number) => k('positions').where({ id }).first();
const newPosition = async (sessionId: number, label: string) => (await k('positions').insert({ session_id: sessionId, label }))[0];
const change = (c: Client, sessionId: number, fields: Record<string, string>) => c.postForm(`/sessions/${sessionId}?/updatePosition`, fields);
const remove = (c: Client, sessionId: number, positionId: number) => c.postForm(`/sessions/${sessionId}?/deletePosition`, { positionId: String(positionId) });

describe('positions of a visit', () => {
	it('are renamed and moved, with the coordinates checked against the room', async () => {
		const id = await newPosition(tree.sessionId, 'P7');
		const moved = await change(acoustician, tree.sessionId, { positionId: String(id), label: 'P7 sofa', micLabel: 'sofa', micX: '3.2', micY: '2', micZ: '1.1' });
		expect(moved.status).toBe(200);
		expect(await position(id)).toMatchObject({ label: 'P7 sofa', mic_label: 'sofa', mic_x_m: 3.2, mic_y_m: 2, mic_z_m: 1.1 });
		expect(await k('audit_events').where({ entity_type: 'position', entity_id: id, action: 'position.updated' }).first('id')).toBeDefined();

		// The factory's room is 5 × 4 × 3 m: a microphone 6 m from the front wall is outside it.
		const outside = await change(acoustician, tree.sessionId, { positionId: String(id), label: 'P7 sofa', micX: '6', micY: '2', micZ: '1.1' });
		expect(outside.status).toBe(400);
		expect(await outside.text()).toContain('Must lie inside the room (0 – 5 m).');
		expect((await position(id)).mic_x_m).toBe(3.2);
	});

	it('keep their labels unique within the visit', async () => {
		const id = await newPosition(tree.sessionId, 'P8');
		const clash = await change(acoustician, tree.sessionId, { positionId: String(id), label: 'P1' });
		expect(clash.status).toBe(409);
		expect(await clash.text()).toContain('already has a position with that label');
		expect((await position(id)).label).toBe('P8');
	});

	it('are removed when empty, and kept while they hold a capture', async () => {
		const empty = await newPosition(tree.sessionId, 'P9');
		expect((await remove(acoustician, tree.sessionId, empty)).status).toBe(200);
		expect(await position(empty)).toBeUndefined();

		const held = await newPosition(tree.sessionId, 'P10');
		await k('captures').insert({ session_id: tree.sessionId, position_id: held, kind: 'impulse', original_filename: 'p10.wav', object_key: `captures/${randomUUID()}.wav`, status: 'analysed' });
		const refused = await remove(acoustician, tree.sessionId, held);
		expect(refused.status).toBe(409);
		expect(await refused.text()).toContain('still holds captures');
		expect(await position(held)).toBeDefined();
	});

	it('of another visit are not found through this one, and a client may not change them', async () => {
		const foreign = await newPosition(other.sessionId, 'X1');
		expect((await change(acoustician, tree.sessionId, { positionId: String(foreign), label: 'taken' })).status).toBe(404);
		expect((await remove(acoustician, tree.sessionId, foreign)).status).toBe(404);
		expect((await position(foreign)).label).toBe('X1');

		const own = await newPosition(tree.sessionId, 'P11');
		expect((await change(client, tree.sessionId, { positionId: String(own), label: 'client edit' })).status).toBe(403);
		expect((await remove(client, tree.sessionId, own)).status).toBe(403);
		expect((await position(own)).label).toBe('P11');
	});
});
