import { error, redirect } from '@sveltejs/kit';
import { BodyTooLargeError } from '$lib/server/body-limit';
import { authorize } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import { addPhoto, photosPage, removePhoto, setPhotoCaption } from '$lib/server/photos/service';
import { addPhotoSchema, photoCaptionSchema, removePhotoSchema } from '$lib/schemas/photos';
import type { Actions, PageServerLoad } from './$types';

// A visit's photos: every one at its display size, with its caption. The forms here are also
// the ones the visit page's photo panel sends; without JavaScript each answer leads back to the
// page the form was on (`back`).
export const load = (async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	const scope = await authorize(locals, 'project:read', { sessionId });
	return photosPage(scope, sessionId);
}) satisfies PageServerLoad;

const backTo = (sessionId: number, back: 'visit' | 'photos', photoId?: number) =>
	back === 'visit' ? `/sessions/${sessionId}#photos` : `/sessions/${sessionId}/photos${photoId ? `#photo-${photoId}` : ''}`;

export const actions = {
	add: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		try {
			return await formAction(request, addPhotoSchema, async (input, formData) => {
				const id = await addPhoto(scope, sessionId, input, formData.get('photo'));
				redirect(303, backTo(sessionId, input.back, id));
			});
		} catch (e) {
			// A body sent without its length is counted as it arrives (body-limit.ts) and cut off here.
			const tooLarge = [e, (e as { cause?: unknown })?.cause].find((x) => x instanceof BodyTooLargeError);
			if (tooLarge) error(413, (tooLarge as BodyTooLargeError).message);
			throw e;
		}
	},

	caption: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, photoCaptionSchema, async ({ photoId, caption, back }) => {
			await setPhotoCaption(scope, sessionId, photoId, caption);
			redirect(303, backTo(sessionId, back, photoId));
		});
	},

	remove: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, removePhotoSchema, async ({ photoId, back }) => {
			await removePhoto(scope, sessionId, photoId);
			redirect(303, backTo(sessionId, back));
		});
	}
} satisfies Actions;
