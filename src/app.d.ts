// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Membership, SessionUser } from '$lib/server/auth/access';
import type { SessionToken } from '$lib/server/auth/session-user';
import type { TokenScope } from '$lib/roles';

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
			/** The API token an /api request came with (null for a browser session): authorize() narrows the user's role to its scopes. */
			apiToken: { id: number; scopes: TokenScope[] } | null;
		}
	}
}

export {};
