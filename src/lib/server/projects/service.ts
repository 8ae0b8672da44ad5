// Projects, their rooms and the visits of a room: lists and pages, and the changes to them.
// Each change runs in one transaction with its audit record.
import type { z } from 'zod';
import { audit } from '../audit';
import { db } from '../db';
import { invalid } from '../problem';
import { transaction } from '../transaction';
import type { Membership, Scope, SessionUser } from '../auth/access';
import { findMemberByEmail } from '../queries/members';
import * as projectRows from '../queries/projects';
import { listComparisons, listProblemBands, listReportsForClient } from '../queries/reviews';
import * as roomRows from '../queries/rooms';
import * as sessionRows from '../queries/sessions';
import { roleAllows, roleNeedsProjectMembership } from '../../roles';
import type { projectSchema, sessionSchema } from '../../schemas/projects';

type ProjectInput = z.output<typeof projectSchema>;
type SessionInput = z.output<typeof sessionSchema>;

/** The projects a user sees and, for a client, the reports published to them. */
export async function projectList(user: SessionUser, memberships: Membership[]) {
	const k = db();
	const isClient = memberships.some((m) => roleNeedsProjectMembership(m.role));
	const [projects, reports] = await Promise.all([projectRows.listProjects(k, user.id, memberships), isClient ? listReportsForClient(k, user.id) : []]);
	return { projects, reports };
}

export async function createProject(scope: Scope, input: ProjectInput): Promise<number> {
	return transaction(async (trx) => {
		const id = await projectRows.createProject(trx, input);
		await audit(trx, scope, 'project.created', 'project', id);
		return id;
	});
}

/** A project with its rooms, and for staff the clients who can see it. */
export async function projectOverview(scope: Scope, projectId: number) {
	const k = db();
	const staff = roleAllows(scope.role, 'project:internal');
	const [project, rooms, clients] = await Promise.all([
		projectRows.getProject(k, projectId),
		roomRows.listRooms(k, projectId),
		staff ? projectRows.listProjectClients(k, projectId) : []
	]);
	return { project: project!, rooms, clients };
}

/** Give a client of the organization access to the project. */
export async function addClient(scope: Scope, projectId: number, email: string): Promise<void> {
	await transaction(async (trx) => {
		const member = await findMemberByEmail(trx, scope.organizationId, email);
		if (member?.role !== 'client') throw invalid('No client of this organization has that address. Invite them from People first.', 'email');
		await projectRows.addProjectClient(trx, projectId, member.userId);
		await audit(trx, scope, 'project.client_added', 'project', projectId, { userId: member.userId });
	});
}

export async function createRoom(scope: Scope, projectId: number, input: roomRows.RoomInput): Promise<number> {
	return transaction(async (trx) => {
		const id = await roomRows.createRoom(trx, projectId, input);
		await audit(trx, scope, 'room.created', 'room', id);
		return id;
	});
}

/** A room with its project, visits, comparisons (published ones only for clients) and problem bands
 * (not for clients: a consultant's marks reach them only inside a published report). */
export async function roomOverview(scope: Scope, roomId: number) {
	const k = db();
	const room = (await roomRows.getRoom(k, roomId))!;
	const internal = roleAllows(scope.role, 'project:internal');
	const [project, sessions, comparisons, problemBands] = await Promise.all([
		projectRows.getProject(k, room.projectId),
		sessionRows.listSessions(k, roomId),
		listComparisons(k, roomId, !internal),
		internal ? listProblemBands(k, roomId) : []
	]);
	return { room, project: { id: project!.id, name: project!.name }, sessions, comparisons, problemBands };
}

export async function updateRoom(scope: Scope, roomId: number, input: roomRows.RoomInput): Promise<void> {
	await transaction(async (trx) => {
		await roomRows.updateRoom(trx, roomId, input);
		await audit(trx, scope, 'room.updated', 'room', roomId);
	});
}

/** A measurement visit of the room; an acoustician who plans it is the one measuring. */
export async function createSession(scope: Scope, roomId: number, input: SessionInput): Promise<number> {
	return transaction(async (trx) => {
		const id = await sessionRows.createSession(trx, roomId, { ...input, acousticianId: scope.role === 'acoustician' ? scope.user.id : null });
		await audit(trx, scope, 'session.created', 'session', id);
		return id;
	});
}
