import { randomBytes } from 'node:crypto';
import { hash, verify } from '@node-rs/argon2';

// Argon2id with the library's defaults (memory 19 MiB, 2 passes: OWASP's baseline).
export async function hashPassword(plain: string): Promise<string> {
	return hash(plain);
}

let standIn: Promise<string> | undefined;

/** A hash of a secret nobody knows, made once per process with the same settings as real ones. */
function standInHash(): Promise<string> {
	standIn ??= hash(randomBytes(32).toString('base64url'));
	return standIn;
}

/**
 * Check a password against a stored hash. Without one (an unknown account, an account that has
 * not set a password) a stand-in hash is checked all the same, so the answer takes as long as
 * for a known account and its timing does not tell which addresses have accounts.
 */
export async function verifyPassword(stored: string | null | undefined, plain: string): Promise<boolean> {
	try {
		const matches = await verify(stored ?? (await standInHash()), plain);
		return matches && Boolean(stored);
	} catch {
		return false;
	}
}

/** Make the stand-in hash ahead of the first unknown account (so that one is not slower either). */
export function prepareStandInHash(): void {
	void standInHash().catch(() => undefined);
}
