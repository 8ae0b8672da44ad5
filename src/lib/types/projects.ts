// A project as lists and pages show it (the query in src/lib/server/queries/projects.ts returns it).

export interface ProjectRow {
	id: number;
	organizationId: number;
	organizationName: string;
	name: string;
	clientName: string;
	description: string | null;
	roomCount: number;
	updatedAt: Date;
}
