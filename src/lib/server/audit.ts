import type { Knex } from 'knex';

export interface AuditEvent {
	organizationId: number | null;
	userId: number | null;
	action: string;
	entityType: string;
	entityId: number | null;
	details?: Record<string, unknown>;
}

/** Append to the audit log, inside the caller's transaction so it records what really happened. */
export async function recordAudit(k: Knex, e: AuditEvent): Promise<void> {
	await k('audit_events').insert({
		organization_id: e.organizationId,
		user_id: e.userId,
		action: e.action,
		entity_type: e.entityType,
		entity_id: e.entityId,
		details: e.details ? JSON.stringify(e.details) : null
	});
}
