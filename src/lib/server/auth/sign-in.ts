// Signing in through our own form. Each attempt is taken from two limits — the account's, from
// any address, and the address's, whatever the account — before the password is checked (so
// concurrent tries cannot all slip under the limit); a right password gives its attempt back,
// and the account's failures so far are forgotten.
// Every attempt is recorded.
import { db } from '../db';
import { formatWait } from '../../format';
import { Problem } from '../problem';
import { insertSignIn } from '../queries/sign-ins';
import { credentialsSignIn, type CookieToSet } from './authjs';
import { giveBackAttempts, takeAttempts, type Take } from './rate-limit';

/** The session cookies of a good sign-in; a refusal (429 while locked out, 400 otherwise) as a problem. */
export async function signIn(origin: string, ip: string, input: { email: string; password: string }): Promise<CookieToSet[]> {
	const k = db();
	const account: Take = { name: 'signInAccount', who: input.email };
	const address: Take = { name: 'signInAddress', who: ip };
	const verdict = await takeAttempts(k, [account, address]);
	if (!verdict.allowed) {
		throw new Problem(429, `Too many failed sign-ins. Try again in ${formatWait(verdict.retryAfterMs)}, or reset your password.`, { code: 'rate_limited' });
	}
	const result = await credentialsSignIn(origin, input.email, input.password);
	await insertSignIn(k, input.email, ip, result.ok);
	if (!result.ok) throw new Problem(400, 'That e-mail and password do not match an account.', { code: 'wrong_credentials' });
	await giveBackAttempts(k, [
		// The owner is in: the account's failures so far are forgotten.
		{ ...account, forget: true },
		{ ...address, forget: false }
	]);
	return result.cookies;
}
