import { db } from '$lib/server/db';
import { parseForm } from '$lib/server/forms';
import { createPasswordReset } from '$lib/server/queries/members';
import { enqueueMail } from '$lib/server/mail';
import { passwordResetMail } from '$lib/server/messages';
import { config } from '$lib/server/config';
import { transaction } from '$lib/server/transaction';
import { forgotPasswordSchema } from '$lib/schemas/auth';
import type { Actions } from './$types';

export const actions = {
	default: async ({ request }) => {
		const form = await request.formData();
		const parsed = parseForm(forgotPasswordSchema, form);
		if (!parsed.ok) return parsed.failure;
		const user = await db()('users').where({ email: parsed.data.email }).first('id', 'email');
		if (user) {
			await transaction(async (trx) => {
				const token = await createPasswordReset(trx, user.id);
				const mail = passwordResetMail({ link: `${config().PUBLIC_BASE_URL}/password/reset/${token}` });
				await enqueueMail(trx, { to: user.email, kind: 'password-reset', ...mail });
			});
		}
		// Same answer either way, so the form does not reveal which addresses have accounts.
		return { sent: true, email: parsed.data.email };
	}
} satisfies Actions;
