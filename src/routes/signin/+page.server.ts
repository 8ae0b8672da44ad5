import { redirect } from '@sveltejs/kit';
import { credentialsSignIn } from '$lib/server/auth/authjs';
import { recordSignIn, signInVerdict } from '$lib/server/auth/rate-limit';
import { db } from '$lib/server/db';
import { formFail, parseForm } from '$lib/server/forms';
import { safeRedirectPath } from '$lib/server/safe-redirect';
import { signInSchema } from '$lib/schemas/auth';
import type { Actions, PageServerLoad } from './$types';

export const load = (async ({ locals, url }) => {
	if (locals.user) redirect(303, safeRedirectPath(url.searchParams.get('redirectTo')));
	return { redirectTo: safeRedirectPath(url.searchParams.get('redirectTo')), reset: url.searchParams.has('reset') };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const form = await event.request.formData();
		const parsed = parseForm(signInSchema, form);
		if (!parsed.ok) return parsed.failure;
		const { email, password } = parsed.data;
		const ip = event.getClientAddress();
		const k = db();

		const verdict = await signInVerdict(k, email, ip);
		if (verdict.blocked) {
			return formFail(
				429,
				form,
				`Too many failed sign-ins. Try again in ${verdict.retryAfterMinutes} minute${verdict.retryAfterMinutes === 1 ? '' : 's'}, or reset your password.`
			);
		}

		const result = await credentialsSignIn(event.url.origin, email, password);
		await recordSignIn(k, email, ip, result.ok);
		if (!result.ok) return formFail(400, form, 'That e-mail and password do not match an account.');

		for (const c of result.cookies) {
			event.cookies.set(c.name, c.value, { path: '/', ...(c.options as object) });
		}
		redirect(303, safeRedirectPath(String(form.get('redirectTo') ?? '')));
	}
} satisfies Actions;
