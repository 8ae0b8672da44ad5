import type { Knex } from 'knex';
import type { ProjectTree } from './factories';

/**
 * Ids of everything a project tree owns, keyed by the route parameter names that take them.
 * Rows that later features add (captures, comparisons…) are created here when their tables
 * exist, so access tests reach those routes too.
 */
export async function ownedIds(k: Knex, t: ProjectTree): Promise<Record<string, number | string>> {
	return { projectId: t.projectId, roomId: t.roomId, sessionId: t.sessionId, positionId: t.positionId };
}
