import { hash, verify } from '@node-rs/argon2';

// Argon2id with the library's defaults (memory 19 MiB, 2 passes: OWASP's baseline).
export async function hashPassword(plain: string): Promise<string> {
	return hash(plain);
}

export async function verifyPassword(stored: string | null, plain: string): Promise<boolean> {
	if (!stored) return false;
	try {
		return await verify(stored, plain);
	} catch {
		return false;
	}
}
