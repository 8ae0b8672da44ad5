import type { Knex } from 'knex';

/** Who did it: a signed-in user acting in an organization (a `Scope` fits), or a user alone. */
export interface Actor {
	organizationId: number | null;
	user: { id: number } | null;
}

/**
 * Append to the audit log, inside the caller's transaction so it records what really happened:
 * `await audit(trx, scope, 'room.updated', 'room', roomId)`.
 */
export async function audit(
	k: Knex,
	actor: Actor,
	action: string,
	entityType: string,
	entityId: number | null,
	details?: Record<string, unknown>
): Promise<void> {
	await k('audit_events').insert({
		organization_id: actor.organizationId,
		user_id: actor.user?.id ?? null,
		action,
		entity_type: entityType,
		entity_id: entityId,
		details: details ? JSON.stringify(details) : null
	});
}
