// A photo of a visit as pages show it (src/lib/server/queries/photos.ts returns it). Its bytes
// come from /api/photos/[id] (`?size=thumb` for the thumbnail), never from the store directly.
export interface PhotoView {
	id: number;
	sessionId: number;
	/** Null: a photo of the room or the visit as a whole. */
	positionId: number | null;
	caption: string;
	width: number;
	height: number;
	thumbWidth: number;
	thumbHeight: number;
	originalFilename: string;
	createdByName: string | null;
	createdAt: string;
}

/** Where the browser reads a photo (the display size, or the thumbnail). */
export function photoUrl(photo: { id: number }, size: 'display' | 'thumb' = 'display'): string {
	return size === 'thumb' ? `/api/photos/${photo.id}?size=thumb` : `/api/photos/${photo.id}`;
}
