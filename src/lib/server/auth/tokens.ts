import { createHash, randomBytes } from 'node:crypto';

/** A one-time token for a link: the raw value goes in the e-mail, only its hash is stored. */
export function newToken(): { token: string; tokenHash: string } {
	const token = randomBytes(32).toString('base64url');
	return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}
