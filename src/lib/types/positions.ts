// A measurement position as pages show it (the query in src/lib/server/queries/positions.ts returns it).

/** A point in the room, metres: x from the front wall, y from the left wall, z from the floor. */
export interface Point {
	x: number;
	y: number;
	z: number;
}

export interface PositionRow {
	id: number;
	sessionId: number;
	label: string;
	sourceLabel: string | null;
	micLabel: string | null;
	source: Point | null;
	mic: Point | null;
}
