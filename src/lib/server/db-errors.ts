// Driver errors mapped to domain problems in one place.
import { Problem, conflict, unavailable } from './problem';

type DriverError = { code?: string };
const codeOf = (e: unknown) => (e as DriverError | null)?.code;

export function isDuplicateKey(e: unknown): boolean {
	return codeOf(e) === 'ER_DUP_ENTRY';
}

/** A delete refused because other rows still refer to this one (a RESTRICT foreign key). */
export function isStillReferenced(e: unknown): boolean {
	return codeOf(e) === 'ER_ROW_IS_REFERENCED_2';
}

const CONNECTION_LOST = new Set(['ECONNREFUSED', 'ECONNRESET', 'PROTOCOL_CONNECTION_LOST', 'ETIMEDOUT', 'ER_CON_COUNT_ERROR']);

/** The database could not be reached (as opposed to refusing a statement). */
export function isDatabaseUnreachable(e: unknown): boolean {
	const code = codeOf(e);
	return (code !== undefined && CONNECTION_LOST.has(code)) || (e instanceof Error && /Knex: Timeout acquiring a connection/.test(e.message));
}

export interface DbErrorMessages {
	/** Said when a unique key refuses the row. */
	duplicate?: string;
	/** Said when a foreign key keeps the row because others still use it. */
	referenced?: string;
	/** The field the duplicate is about. */
	field?: string;
}

/** The problem a driver error stands for, or null when it is not one people can act on. */
export function problemFromDbError(e: unknown, messages: DbErrorMessages = {}): Problem | null {
	if (isDuplicateKey(e)) return conflict(messages.duplicate ?? 'That already exists.', { field: messages.field, code: 'duplicate' });
	if (isStillReferenced(e)) return conflict(messages.referenced ?? 'Other records still use this one.', { code: 'in_use' });
	if (isDatabaseUnreachable(e)) return unavailable('The database is briefly unavailable. Try again in a moment.', e);
	return null;
}

/** Run a statement, turning duplicate keys and refused deletes into problems with these messages. */
export async function mapDbErrors<T>(work: Promise<T>, messages: DbErrorMessages): Promise<T> {
	try {
		return await work;
	} catch (e) {
		throw problemFromDbError(e, messages) ?? e;
	}
}
