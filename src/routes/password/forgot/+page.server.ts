import { formAction } from '$lib/server/forms';
import * as people from '$lib/server/people/service';
import { forgotPasswordSchema } from '$lib/schemas/auth';
import type { Actions } from './$types';

export const actions = {
	default: async (event) =>
		formAction(event.request, forgotPasswordSchema, async (input) => {
			await people.requestPasswordReset(input.email, event.getClientAddress());
			// Same answer either way, so the form does not reveal which addresses have accounts.
			return { sent: true, email: input.email };
		})
} satisfies Actions;
