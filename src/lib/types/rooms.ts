// A room as lists and pages show it (the query in src/lib/server/queries/rooms.ts returns it).

export interface RoomRow {
	id: number;
	projectId: number;
	name: string;
	lengthM: number;
	widthM: number;
	heightM: number;
	volumeM3: number;
	roomUse: string;
	notes: string | null;
	sessionCount: number;
	updatedAt: Date;
}
