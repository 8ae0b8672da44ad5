// Photos of a visit (of the room, or of one position), as stored by the visit's photo forms.
import { z } from 'zod';
import { photoSizeQuery } from '../../../schemas/photos';
import type { ApiOperation } from '../registry';
import { binary } from '../shapes';

export const photoOperations: ApiOperation[] = [
	{
		method: 'get',
		route: '/api/photos/[photoId=id]',
		resource: 'Visit photos',
		operationId: 'getVisitPhoto',
		summary: 'A photo of a visit, at display size or as a thumbnail',
		description:
			'The stored image (re-encoded on upload, at most 2048 px on its long edge; thumbnails 480 px), served by the app itself after the visit\'s access check, never as a link into the store. Private caching for a day with an entity tag: send it back as If-None-Match and an unchanged photo answers 304.',
		access: 'project:read',
		query: photoSizeQuery,
		headers: z.object({ 'if-none-match': z.string().optional().meta({ description: 'The ETag of the image already held.' }) }),
		responses: {
			200: {
				description: 'The image, shown inline.',
				headers: z.object({ etag: z.string().meta({ description: 'Entity tag of this size of the photo.' }) }),
				content: { 'image/jpeg': { schema: binary('JPEG image.') }, 'image/png': { schema: binary('PNG image.') }, 'image/webp': { schema: binary('WebP image.') } }
			},
			304: { description: 'Unchanged since the entity tag sent in If-None-Match.' }
		},
		errors: {
			404: 'No such photo within your reach, or it is no longer stored.',
			422: 'size is neither display nor thumb (code invalid).'
		}
	}
];
