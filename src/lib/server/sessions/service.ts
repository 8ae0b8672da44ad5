// A measurement visit: its page (positions, captures, results) and its positions.
import { audit } from '../audit';
import { db } from '../db';
import { mapDbErrors } from '../db-errors';
import { conflict, notFound, Problem } from '../problem';
import { transaction } from '../transaction';
import type { Scope } from '../auth/access';
import { checkPositionInRoom, createPosition, deleteEmptyPosition, isPositionOfSession, listPositions, updatePosition, type PositionInput } from '../queries/positions';
import { listProblemBands } from '../queries/reviews';
import { getRoom } from '../queries/rooms';
import { getSession, getVisitHeader } from '../queries/sessions';
import { listSweeps } from '../queries/sweeps';
import { analysedRowsOf, loadSessionResults, loadSessionSummary, loadVisitResultsView } from '../results/load';
import { listCapturesWithSummaries } from '../queries/captures';
import { visitBands, visitResponses, type VisitBands, type VisitResponses } from '../../results/drawn';
import type { BandKind } from '../../analysis/bands';
import type { SmoothingKey } from '../../analysis/types';
import { toView } from '../captures/views';
import { roleAllows } from '../../roles';

/** The visit page: captures, results and test signals only for the roles that may see or use them. */
export async function visitPage(scope: Scope, sessionId: number) {
	const k = db();
	const { session, room, project } = (await getVisitHeader(k, sessionId))!;
	const internal = roleAllows(scope.role, 'project:internal');
	const upload = roleAllows(scope.role, 'capture:write');
	// One listing of the captures for their list and for the results.
	const results = async () => {
		const listing = await listCapturesWithSummaries(k, sessionId);
		const meta = { sessionId, conditionLabel: session.conditionLabel, measuredOn: session.measuredOn };
		return { captures: listing.map((r) => toView(r.capture, r.summary)), summary: await loadVisitResultsView(k, sessionId, { meta, rows: analysedRowsOf(listing) }) };
	};
	const [{ captures, summary }, problemBands, sweeps, positions] = await Promise.all([
		internal ? results() : { captures: [], summary: null },
		internal ? listProblemBands(k, room.id) : [],
		upload ? listSweeps(k, scope.organizationId) : [],
		listPositions(k, sessionId)
	]);
	return {
		captures,
		// What the results draw; other smoothings and the one-third-octave tables are fetched on demand.
		summary,
		problemBands,
		sweeps: sweeps.map((s) => ({ id: s.id, name: s.name, durationS: s.durationS })),
		session,
		room: { id: room.id, name: room.name, lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM },
		project,
		positions,
		can: { edit: roleAllows(scope.role, 'project:edit'), upload, internal }
	};
}

/** A visit's spatial average per band (for the export). */
export function visitAverage(sessionId: number) {
	return loadSessionSummary(db(), sessionId);
}

/** A visit's responses at one smoothing, with the tag of the results they come from. */
export async function visitResponsesAt(sessionId: number, smoothing: SmoothingKey): Promise<{ tag: string; answer: () => VisitResponses }> {
	const { summary, tag } = await loadSessionResults(db(), sessionId);
	return { tag, answer: () => visitResponses(summary, smoothing) };
}

/** A visit's band tables of one kind, with the tag of the results they come from. */
export async function visitBandsOf(sessionId: number, bandKind: BandKind): Promise<{ tag: string; answer: () => VisitBands }> {
	const { summary, tag } = await loadSessionResults(db(), sessionId);
	const bands = visitBands(summary, bandKind);
	if (!bands) throw notFound('This visit has no one-third-octave bands: its captures were analysed without them.');
	return { tag, answer: () => bands };
}

const DUPLICATE_LABEL = { duplicate: 'This visit already has a position with that label.', field: 'label' };

async function checkPlace(scope: Scope, sessionId: number, input: PositionInput): Promise<void> {
	const k = db();
	const session = (await getSession(k, sessionId))!;
	const placeErrors = checkPositionInRoom(input, (await getRoom(k, session.roomId))!, scope.user.unitSystem);
	if (Object.keys(placeErrors).length) throw new Problem(400, 'Check the coordinates.', { details: { errors: placeErrors } });
}

/** A new measurement position of the visit; given coordinates must lie inside the room. */
export async function addPosition(scope: Scope, sessionId: number, input: PositionInput): Promise<number> {
	await checkPlace(scope, sessionId, input);
	return transaction(async (trx) => {
		const id = await mapDbErrors(createPosition(trx, sessionId, input), DUPLICATE_LABEL);
		await audit(trx, scope, 'position.created', 'position', id);
		return id;
	});
}

const NO_SUCH_POSITION = 'This visit has no such position.';

/** Rename or move one of the visit's positions (its captures stay with it); the same rules as a new one. */
export async function editPosition(scope: Scope, sessionId: number, positionId: number, input: PositionInput): Promise<void> {
	const before = (await listPositions(db(), sessionId)).find((p) => p.id === positionId);
	if (!before) throw notFound(NO_SUCH_POSITION);
	await checkPlace(scope, sessionId, input);
	await transaction(async (trx) => {
		await mapDbErrors(updatePosition(trx, positionId, input), DUPLICATE_LABEL);
		await audit(trx, scope, 'position.updated', 'position', positionId, before.label === input.label ? undefined : { from: before.label, to: input.label });
	});
}

/** Remove a position that holds no capture (captures are removed one by one, with their files). */
export async function removePosition(scope: Scope, sessionId: number, positionId: number): Promise<void> {
	if (!(await isPositionOfSession(db(), sessionId, positionId))) throw notFound(NO_SUCH_POSITION);
	await transaction(async (trx) => {
		if ((await deleteEmptyPosition(trx, positionId)) === 'has-captures')
			throw conflict('This position still holds captures: remove them first, or move the position instead.', { code: 'position_in_use' });
		await audit(trx, scope, 'position.deleted', 'position', positionId);
	});
}
