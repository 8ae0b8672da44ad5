import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { signedInClient, type Client } from '../helpers/http';
import { MATERIALS } from '../../src/lib/treatment/materials';

// The plan page names the source of each surface's finish, groups the library by how far its
// numbers can be trusted, and points to a product's tested values for a design that depends on them.
let k: Knex;
let tree: ProjectTree;
let consultant: Client;

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	tree = await makeProjectTree(k, org);
	consultant = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

const decode = (html: string) => html.replace(/&amp;/g, '&').replace(/&#39;|&apos;/g, "'");

describe('material sources on the plan page', () => {
	it('shows each finish with its source, and groups the library as published or typical', async () => {
		const res = await consultant.get(`/rooms/${tree.roomId}/plan`, { accept: 'text/html' });
		expect(res.status).toBe(200);
		const html = decode(await res.text());
		const sources = [...html.matchAll(/data-testid="finish-source"[^>]*>([^<]+)</g)].map((m) => m[1].trim());
		// Six surfaces, each with the citation of the material it is finished with.
		expect(sources).toHaveLength(6);
		const known = new Set(MATERIALS.map((m) => m.source));
		for (const s of sources) expect(known.has(s), s).toBe(true);
		expect(html).toContain('label="Published tables"');
		expect(html).toContain('label="Typical handbook values (verify)"');
		expect(html).toContain('tested to ISO 354');
		expect(html).not.toMatch(/recalled/i);
	});
});
