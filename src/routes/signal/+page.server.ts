import { error, redirect } from '@sveltejs/kit';
import { authorize, membershipsAllowing } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import { createSweep, sweepsOf } from '$lib/server/sweeps/service';
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
	return { sweeps: await sweepsOf(organizationId) };
}) satisfies PageServerLoad;

export const actions = {
	create: async (event) => {
		const scope = await authorize(event.locals, 'capture:write', { organizationId: organizationOf(event) });
		return formAction(event.request, sweepDefinitionSchema, async (input) => {
			await createSweep(scope, input);
			redirect(303, '/signal?created=1');
		});
	}
} satisfies Actions;
