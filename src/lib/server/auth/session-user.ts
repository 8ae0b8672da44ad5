// Who a request's session belongs to, and whether that session still stands. A session token is
// good for twelve hours, but the account may end it sooner: signing out ends that one session,
// and a new password, "sign out everywhere" or removal from an organization raise the account's
// session version, which ends every session signed in before. Both are checked on every request
// in one lookup by primary key (no cache), so an ending holds at once on every web server.
// A session lasts SESSION_HOURS from its sign-in, however often it is used.
import type { Knex } from 'knex';
import type { Membership, SessionUser } from './access';
import { audit } from '../audit';
import { db } from '../db';
import { getUser, listMemberships } from '../queries/users';
import { deleteExpiredEndedSessions, endSession, findSessionAccount, raiseSessionVersion } from '../queries/auth-sessions';
import { transaction } from '../transaction';
import { SESSION_HOURS } from './authjs';

export interface SessionToken {
	userId: number;
	/** Absent in a token from before sessions could be ended: such a token is not accepted. */
	sessionId?: string;
	sessionVersion?: number;
	signedInAt?: number;
}

type Loaded = { user: SessionUser; memberships: Membership[] };

/** Load a user and their memberships by id, or null if the account no longer exists. */
export async function loadSessionUser(k: Knex, userId: number): Promise<Loaded | null> {
	const user = await getUser(k, userId);
	if (!user) return null;
	return { user, memberships: await listMemberships(k, userId) };
}

/** The user of a session that still stands, or null when it was ended (or the account is gone). */
export async function userOfSession(k: Knex, token: SessionToken, now = Date.now()): Promise<Loaded | null> {
	if (!token.sessionId || token.sessionVersion === undefined || token.signedInAt === undefined) return null;
	// Auth.js refreshes a token on use; the session still ends SESSION_HOURS after sign-in, so an
	// ended session's record (kept as long) outlives every token of it.
	if (now - token.signedInAt > SESSION_HOURS * 3600_000) return null;
	const account = await findSessionAccount(k, token.userId, token.sessionId);
	if (!account || account.ended || account.sessionVersion !== token.sessionVersion) return null;
	return { user: account.user, memberships: await listMemberships(k, token.userId) };
}

/** Sign out one session: it is refused from now on, on every server. */
export async function endOneSession(token: SessionToken, k: Knex = db()): Promise<void> {
	if (!token.sessionId) return;
	const now = new Date();
	await endSession(k, { sessionId: token.sessionId, userId: token.userId, expiresAt: new Date(now.getTime() + SESSION_HOURS * 3600_000) });
	await deleteExpiredEndedSessions(k, now);
}

/** Sign out every session of the account, this one included. */
export async function endEverySession(user: SessionUser): Promise<void> {
	await transaction(async (trx) => {
		await raiseSessionVersion(trx, user.id);
		await audit(trx, { organizationId: null, user }, 'sessions.ended_everywhere', 'user', user.id);
	});
}
