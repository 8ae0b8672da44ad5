// Driver errors mapped to domain errors in one place.
export class ConflictError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'ConflictError';
	}
}

export function isDuplicateKey(e: unknown): boolean {
	return (e as { code?: string })?.code === 'ER_DUP_ENTRY';
}

/** Re-throw a duplicate-key error as a ConflictError with a message for people. */
export async function mapDuplicate<T>(work: Promise<T>, message: string): Promise<T> {
	try {
		return await work;
	} catch (e) {
		if (isDuplicateKey(e)) throw new ConflictError(message);
		throw e;
	}
}

/** A delete refused because other rows still refer to this one (a RESTRICT foreign key). */
export function isStillReferenced(e: unknown): boolean {
	return (e as { code?: string })?.code === 'ER_ROW_IS_REFERENCED_2';
}
