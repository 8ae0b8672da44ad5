import type { Knex } from 'knex';

export interface OrganizationRow {
	id: number;
	name: string;
}

export async function getOrganization(k: Knex, id: number): Promise<OrganizationRow | undefined> {
	return k('organizations').where({ id }).first('id', 'name');
}
