import { error, redirect } from '@sveltejs/kit';
import { authorize, membershipsAllowing } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { parseForm, problemToFailure } from '$lib/server/forms';
import { createSweep, listSweeps } from '$lib/server/sweeps';
import { sweepDefinitionSchema } from '$lib/schemas/captures';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

function organizationOf(event: RequestEvent | Parameters<PageServerLoad>[0]): number {
	const first = membershipsAllowing(event.locals, 'capture:write')[0];
	if (!first) error(403, 'Only acousticians and admins make test signals.');
	return first.organizationId;
}

export const load = (async (event) => {
	const organizationId = organizationOf(event);
	await authorize(event.locals, 'capture:write', { organizationId });
	return { sweeps: await listSweeps(db(), organizationId) };
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const organizationId = organizationOf(event);
		const scope = await authorize(event.locals, 'capture:write', { organizationId });
		const form = await event.request.formData();
		const parsed = parseForm(sweepDefinitionSchema, form);
		if (!parsed.ok) return parsed.failure;
		try {
			await createSweep(scope, parsed.data);
		} catch (e) {
			return problemToFailure(e, form);
		}
		redirect(303, '/signal?created=1');
	}
} satisfies Actions;
