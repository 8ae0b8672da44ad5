// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Membership, SessionUser } from '$lib/server/auth/access';

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
		}
	}
}

export {};
