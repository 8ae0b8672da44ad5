// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Membership, SessionUser } from '$lib/server/auth/access';
import type { SessionToken } from '$lib/server/auth/session-user';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
			/** `unavailable` when a dependency is down (the page says so, not "something went wrong"). */
			code?: 'unavailable';
		}
		interface Locals {
			user: SessionUser | null;
			memberships: Membership[];
			/** The session of the signed-in user (null when signed out), to end it. */
			session: SessionToken | null;
		}
	}
}

export {};
