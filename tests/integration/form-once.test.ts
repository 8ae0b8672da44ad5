import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, type Client } from '../helpers/http';
import { newFormKey } from '../../src/lib/forms';

// Creating forms carry a one-time key: the server acts on it once, so a double click or a resent
// form makes one row, and every repeat gets the first answer (the same redirect).
let k: Knex;
let tree: ProjectTree;
let consultant: Client;

beforeAll(async () => {
	k = testDb();
	const orgId = await makeOrganization(k);
	tree = await makeProjectTree(k, orgId);
	const user = await makeUser(k, orgId, 'consultant', { password: TEST_PASSWORD });
	consultant = await signedInClient(user.email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

const visits = (label: string) => k('sessions').where({ room_id: tree.roomId, condition_label: label }).count({ n: '*' }).first();
const createVisit = (fields: Record<string, string>) => consultant.postForm(`/rooms/${tree.roomId}?/createSession`, fields);

describe('a creating form sent twice', () => {
	it('makes one visit when the same form arrives twice at once, and both answers lead to it', async () => {
		const formKey = newFormKey();
		const fields = { conditionLabel: `double click ${formKey.slice(0, 6)}`, measuredOn: '2026-12-01', formKey };
		const [a, b] = await Promise.all([createVisit(fields), createVisit(fields)]);
		expect([a.status, b.status]).toEqual([303, 303]);
		expect(a.headers.get('location')).toMatch(/^\/sessions\/\d+$/);
		expect(b.headers.get('location')).toBe(a.headers.get('location'));
		expect((await visits(fields.conditionLabel))?.n).toBe(1);
		// Sent again later (a browser resending the form): still the one visit.
		const again = await createVisit(fields);
		expect(again.headers.get('location')).toBe(a.headers.get('location'));
		expect((await visits(fields.conditionLabel))?.n).toBe(1);
	});

	it('gives the key back after a refusal, so the corrected form is acted on', async () => {
		const formKey = newFormKey();
		const label = `corrected ${formKey.slice(0, 6)}`;
		const refused = await createVisit({ conditionLabel: label, measuredOn: 'not a date', formKey });
		expect(refused.status).toBe(400);
		expect((await visits(label))?.n).toBe(0);
		const created = await createVisit({ conditionLabel: label, measuredOn: '2026-12-01', formKey });
		expect(created.status).toBe(303);
		expect((await visits(label))?.n).toBe(1);
	});

	it('acts on each new key, and on a form without one', async () => {
		const label = `two visits ${Date.now()}`;
		await createVisit({ conditionLabel: label, measuredOn: '2026-12-01', formKey: newFormKey() });
		await createVisit({ conditionLabel: label, measuredOn: '2026-12-01', formKey: newFormKey() });
		await createVisit({ conditionLabel: label, measuredOn: '2026-12-01' });
		expect((await visits(label))?.n).toBe(3);
	});

	it('keeps keys per action: the same key on another form is another submission', async () => {
		const formKey = newFormKey();
		const label = `per action ${formKey.slice(0, 6)}`;
		expect((await createVisit({ conditionLabel: label, measuredOn: '2026-12-01', formKey })).status).toBe(303);
		const band = await consultant.postForm(`/rooms/${tree.roomId}?/addProblemBand`, { fLoHz: '100', fHiHz: '200', severity: 'minor', note: label, formKey });
		expect([200, 303]).toContain(band.status);
		expect(await k('problem_bands').where({ room_id: tree.roomId, note: label }).count({ n: '*' }).first()).toEqual({ n: 1 });
	});
});
