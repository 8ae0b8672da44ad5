import { authorize } from '$lib/server/auth/access';
import { answer, parseJson } from '$lib/server/api';
import { photoFile, photoTag } from '$lib/server/photos/service';
import { photoSizeQuery } from '$lib/schemas/photos';
import type { RequestHandler } from './$types';

// A photo's stored bytes, for whoever may read its visit. Never a link into the store: the
// answer is the app's own, so access is checked on every request.
// The bytes behind an id never change, so a browser keeps them a day (private: never a shared
// cache) and asks again with the entity tag after that.
const CACHE = 'private, max-age=86400';

export const GET: RequestHandler = async ({ locals, params, url, request }) =>
	answer(async () => {
		const photoId = Number(params.photoId);
		await authorize(locals, 'project:read', { photoId });
		const { size } = parseJson(photoSizeQuery, Object.fromEntries(url.searchParams));
		const tag = await photoTag(photoId, size);
		if (tag && request.headers.get('if-none-match') === tag) return new Response(null, { status: 304, headers: { etag: tag, 'cache-control': CACHE } });
		const file = await photoFile(photoId, size);
		return new Response(file.bytes as Uint8Array<ArrayBuffer>, {
			headers: {
				'content-type': file.contentType,
				'content-length': String(file.bytes.byteLength),
				'content-disposition': `inline; filename="${file.filename}"`,
				'cache-control': CACHE,
				etag: file.etag
			}
		});
	});
