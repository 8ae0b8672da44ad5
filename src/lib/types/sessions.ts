// A measurement visit as lists and pages show it (the query in src/lib/server/queries/sessions.ts returns it).

export interface SessionRow {
	id: number;
	roomId: number;
	conditionLabel: string;
	measuredOn: string;
	notes: string | null;
	acousticianId: number | null;
	acousticianName: string | null;
	positionCount: number;
	captureCount: number;
}
