// Signed-in sessions: the account's session version (raised to end every session at once) and
// sessions ended one by one (kept until their token would have expired anyway).
import type { Knex } from 'knex';
import type { SessionUser } from '../auth/access';

export interface SessionAccount {
	user: SessionUser;
	sessionVersion: number;
	/** This session was signed out. */
	ended: boolean;
}

/** The account behind a session and whether the session still stands: one lookup by primary keys. */
export async function findSessionAccount(k: Knex, userId: number, sessionId: string): Promise<SessionAccount | undefined> {
	const r = await k('users as u')
		.leftJoin('ended_sessions as e', (j) => j.on('e.session_id', '=', k.raw('?', [sessionId])).andOn('e.user_id', '=', 'u.id'))
		.where('u.id', userId)
		.first({ id: 'u.id', email: 'u.email', name: 'u.name', unitSystem: 'u.unit_system', sessionVersion: 'u.session_version', endedId: 'e.session_id' });
	if (!r) return undefined;
	const { sessionVersion, endedId, ...user } = r;
	return { user, sessionVersion: Number(sessionVersion), ended: endedId !== null && endedId !== undefined };
}

/** End every session of the account: tokens carrying an older version are refused from now on. */
export async function raiseSessionVersion(k: Knex, userId: number): Promise<void> {
	await k('users').where({ id: userId }).update({ session_version: k.raw('session_version + 1') });
}

/** End one session (sign-out), until `expiresAt`, after which its token is worthless anyway. */
export async function endSession(k: Knex, s: { sessionId: string; userId: number; expiresAt: Date }): Promise<void> {
	await k('ended_sessions').insert({ session_id: s.sessionId, user_id: s.userId, expires_at: s.expiresAt }).onConflict('session_id').ignore();
}

export async function deleteExpiredEndedSessions(k: Knex, now: Date, max = 500): Promise<void> {
	await k.raw('DELETE FROM ended_sessions WHERE expires_at < ? ORDER BY expires_at LIMIT ?', [now, max]);
}
