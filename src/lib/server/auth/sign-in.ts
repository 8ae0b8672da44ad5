// Signing in through our own form: refused while too many attempts have failed, then checked
// by Auth.js; every attempt is recorded for the limit.
import { db } from '../db';
import { Problem } from '../problem';
import { insertSignIn } from '../queries/sign-ins';
import { credentialsSignIn, type CookieToSet } from './authjs';
import { signInVerdict } from './rate-limit';

/** The session cookies of a good sign-in; a refusal (429 while blocked, 400 otherwise) as a problem. */
export async function signIn(origin: string, ip: string, input: { email: string; password: string }): Promise<CookieToSet[]> {
	const k = db();
	const verdict = await signInVerdict(k, input.email, ip);
	if (verdict.blocked) {
		const minutes = verdict.retryAfterMinutes;
		throw new Problem(429, `Too many failed sign-ins. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or reset your password.`, { code: 'rate_limited' });
	}
	const result = await credentialsSignIn(origin, input.email, input.password);
	await insertSignIn(k, input.email, ip, result.ok);
	if (!result.ok) throw new Problem(400, 'That e-mail and password do not match an account.', { code: 'wrong_credentials' });
	return result.cookies;
}
