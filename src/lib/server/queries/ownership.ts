// Which organization (and project) a row belongs to, for authorization.
import type { Knex } from 'knex';
import type { Target } from '../auth/access';

export interface Owner {
	organizationId: number;
	projectId: number | null;
}

// How each kind of row reaches its project: the tables from the row up to its room, each
// joined to the next through the foreign key named in PARENT_KEY.
const CHAINS = {
	roomId: ['rooms'],
	sessionId: ['sessions', 'rooms'],
	positionId: ['positions', 'sessions', 'rooms'],
	captureId: ['captures', 'sessions', 'rooms'],
	photoId: ['visit_photos', 'sessions', 'rooms'],
	comparisonId: ['comparisons', 'rooms'],
	problemBandId: ['problem_bands', 'rooms']
} as const;
const PARENT_KEY: Record<string, string> = {
	positions: 'session_id',
	captures: 'session_id',
	visit_photos: 'session_id',
	sessions: 'room_id',
	comparisons: 'room_id',
	problem_bands: 'room_id',
	rooms: 'project_id'
};

/** The organization (and project) that owns a target, or null if it does not exist. */
export async function findOwner(k: Knex, target: Target): Promise<Owner | null> {
	if ('organizationId' in target) {
		const org = await k('organizations').where({ id: target.organizationId }).first('id');
		return org ? { organizationId: org.id, projectId: null } : null;
	}
	if ('sweepId' in target) {
		const sweep = await k('sweep_definitions').where({ id: target.sweepId }).first('organization_id');
		return sweep ? { organizationId: sweep.organization_id, projectId: null } : null;
	}
	let q: Knex.QueryBuilder;
	if ('projectId' in target) {
		q = k('projects as p').where('p.id', target.projectId);
	} else {
		const key = Object.keys(target)[0] as keyof typeof CHAINS;
		const chain = CHAINS[key];
		q = k(`${chain[0]} as t0`).where('t0.id', (target as Record<string, number>)[key]);
		chain.slice(1).forEach((table, i) => q.join(`${table} as t${i + 1}`, `t${i + 1}.id`, `t${i}.${PARENT_KEY[chain[i]]}`));
		q.join('projects as p', 'p.id', `t${chain.length - 1}.${PARENT_KEY.rooms}`);
	}
	const row = (await q.first({ organizationId: 'p.organization_id', projectId: 'p.id' })) as Owner | undefined;
	return row ?? null;
}
