import type { Knex } from 'knex';
import type { ProjectRow } from '../../types/projects';
import type { Membership } from '../auth/access';
import { roleNeedsProjectMembership } from '../../roles';

export type { ProjectRow };

const projectColumns = {
	id: 'p.id',
	organizationId: 'p.organization_id',
	organizationName: 'o.name',
	name: 'p.name',
	clientName: 'p.client_name',
	description: 'p.description',
	updatedAt: 'p.updated_at'
};

/** Projects a user can see: all of their organizations' for staff, only their own for clients. */
export async function listProjects(k: Knex, userId: number, memberships: Membership[]): Promise<ProjectRow[]> {
	const staffOrgs = memberships.filter((m) => !roleNeedsProjectMembership(m.role)).map((m) => m.organizationId);
	const clientOrgs = memberships.filter((m) => roleNeedsProjectMembership(m.role)).map((m) => m.organizationId);
	if (staffOrgs.length === 0 && clientOrgs.length === 0) return [];
	const rows = await k('projects as p')
		.join('organizations as o', 'o.id', 'p.organization_id')
		.where((q) => {
			if (staffOrgs.length) q.orWhereIn('p.organization_id', staffOrgs);
			if (clientOrgs.length)
				q.orWhere((c) =>
					c
						.whereIn('p.organization_id', clientOrgs)
						.whereExists(k('project_members as pm').whereRaw('pm.project_id = p.id').where('pm.user_id', userId))
				);
		})
		.select(projectColumns)
		.select(k.raw('(SELECT COUNT(*) FROM rooms r WHERE r.project_id = p.id) AS roomCount'))
		.orderBy('p.updated_at', 'desc');
	return rows.map((r) => ({ ...r, roomCount: Number(r.roomCount) }));
}

export async function getProject(k: Knex, id: number): Promise<ProjectRow | undefined> {
	const r = await k('projects as p')
		.join('organizations as o', 'o.id', 'p.organization_id')
		.where('p.id', id)
		.first(projectColumns)
		.select(k.raw('(SELECT COUNT(*) FROM rooms r WHERE r.project_id = p.id) AS roomCount'));
	return r ? { ...r, roomCount: Number(r.roomCount) } : undefined;
}

export async function createProject(
	k: Knex,
	p: { organizationId: number; name: string; clientName: string; description: string | null }
): Promise<number> {
	const [id] = await k('projects').insert({
		organization_id: p.organizationId,
		name: p.name,
		client_name: p.clientName,
		description: p.description
	});
	return id;
}

export interface ProjectClient {
	userId: number;
	name: string;
	email: string;
}

export async function listProjectClients(k: Knex, projectId: number): Promise<ProjectClient[]> {
	return k('project_members as pm')
		.join('users as u', 'u.id', 'pm.user_id')
		.where('pm.project_id', projectId)
		.orderBy('u.name')
		.select({ userId: 'u.id', name: 'u.name', email: 'u.email' });
}

export async function addProjectClient(k: Knex, projectId: number, userId: number): Promise<void> {
	await k('project_members').insert({ project_id: projectId, user_id: userId }).onConflict(['project_id', 'user_id']).ignore();
}

export async function isProjectMember(k: Knex, projectId: number, userId: number): Promise<boolean> {
	return Boolean(await k('project_members').where({ project_id: projectId, user_id: userId }).first('id'));
}

/** The organization's projects by name, for pickers. */
export async function listProjectNames(k: Knex, organizationId: number): Promise<{ id: number; name: string }[]> {
	return k('projects').where({ organization_id: organizationId }).orderBy('name').select('id', 'name');
}

export async function isProjectOf(k: Knex, projectId: number, organizationId: number): Promise<boolean> {
	return Boolean(await k('projects').where({ id: projectId, organization_id: organizationId }).first('id'));
}
