import { error, redirect } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { formFail, parseForm } from '$lib/server/forms';
import { acceptInvitation, findUsableInvitation } from '$lib/server/queries/members';
import { recordAudit } from '$lib/server/audit';
import { transaction } from '$lib/server/transaction';
import { setPasswordSchema } from '$lib/schemas/auth';
import { ROLE_LABELS } from '$lib/roles';
import type { Actions, PageServerLoad } from './$types';

const GONE = 'This invitation link has been used or has expired. Ask for a new one.';

export const load = (async ({ params }) => {
	const inv = await findUsableInvitation(db(), params.token);
	if (!inv) error(410, GONE);
	return {
		email: inv.email,
		organizationName: inv.organizationName,
		roleLabel: ROLE_LABELS[inv.role],
		existingUser: inv.existingUser
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, params }) => {
		const form = await request.formData();
		form.set('token', params.token);
		const parsed = parseForm(setPasswordSchema, form);
		if (!parsed.ok) return parsed.failure;
		const inv = await findUsableInvitation(db(), params.token);
		if (!inv) error(410, GONE);
		if (!inv.existingUser && !parsed.data.name) {
			return formFail(400, form, 'Enter your name.', { name: 'Enter your name.' });
		}
		const accepted = await transaction(async (trx) => {
			const r = await acceptInvitation(trx, params.token, { name: parsed.data.name ?? '', password: parsed.data.password });
			if (r) await recordAudit(trx, { organizationId: null, userId: r.userId, action: 'invitation.accepted', entityType: 'user', entityId: r.userId });
			return r;
		});
		if (!accepted) error(410, GONE);
		redirect(303, '/signin?reset=1');
	}
} satisfies Actions;
