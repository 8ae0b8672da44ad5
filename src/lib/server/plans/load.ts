// A room's plan loaded and worked through, for the plan page, the build page, the JSON route
// and the client report.
import type { Knex } from 'knex';
import { db } from '../db';
import type { Scope } from '../auth/access';
import { defaultTarget } from '../../results/comparison';
import type { SessionSummary } from '../../results/types';
import { PLANNING_BANDS_HZ } from '../../treatment/bands';
import { evaluatePlan, type PlanEvaluation } from '../../plans/evaluate';
import { measuredTimes, type MeasuredTimes } from '../../plans/measured';
import { planBuilds, planCost, planCutList, sawLimitOf, type ItemBuild, type PlanCost, type PlanCutList } from '../../plans/build';
import type { StoredPlan } from '../../plans/types';
import { getRoom, type RoomRow } from '../queries/rooms';
import { getProject } from '../queries/projects';
import { listProblemBands } from '../queries/reviews';
import { listSessions } from '../queries/sessions';
import { listCustomMaterials, loadStoredPlan, materialCatalogue, type CustomMaterialRow } from '../queries/plans';
import { loadSessionSummary } from '../results/load';

export interface MeasuredVisit {
	sessionId: number;
	conditionLabel: string;
	measuredOn: string;
	positions: number;
	times: MeasuredTimes;
}

export interface PlanView {
	room: RoomRow;
	plan: StoredPlan;
	customMaterials: CustomMaterialRow[];
	before: MeasuredVisit | null;
	after: MeasuredVisit | null;
	evaluation: PlanEvaluation;
	builds: ItemBuild[];
	buildErrors: { itemId: number; label: string; message: string }[];
	cut: PlanCutList;
	cost: PlanCost;
}

function visitOf(summary: SessionSummary): MeasuredVisit {
	return {
		sessionId: summary.sessionId,
		conditionLabel: summary.conditionLabel,
		measuredOn: summary.measuredOn,
		positions: summary.positions.length,
		times: measuredTimes(summary.average)
	};
}

/** Everything a plan is worked out from: with the same inputs, workOutPlan gives the same view. */
export interface PlanInputs {
	room: RoomRow;
	plan: StoredPlan;
	customMaterials: CustomMaterialRow[];
	before: MeasuredVisit | null;
	after: MeasuredVisit | null;
}

/**
 * What a room's plan is worked out from. `summaries` passes visits already loaded (the report has
 * both of its comparison's), so they are not read twice; so does a room row already read.
 */
export async function readPlanInputs(k: Knex, room: number | RoomRow, organizationId: number, summaries: readonly SessionSummary[] = []): Promise<PlanInputs> {
	const roomId = typeof room === 'number' ? room : room.id;
	const [roomRow, plan, customMaterials] = await Promise.all([typeof room === 'number' ? getRoom(k, roomId) : room, loadStoredPlan(k, roomId), listCustomMaterials(k, organizationId)]);
	if (!roomRow) throw new Error(`room ${roomId} does not exist`);
	const summaryOf = async (id: number | null) =>
		id === null ? null : visitOf(summaries.find((s) => s.sessionId === id) ?? (await loadSessionSummary(k, id)));
	const [before, after] = await Promise.all([summaryOf(plan.settings.baselineSessionId), summaryOf(plan.settings.afterSessionId)]);
	return { room: roomRow, plan, customMaterials, before, after };
}

/** Everything a plan page shows. */
export async function loadPlanView(k: Knex, roomId: number, organizationId: number, summaries: readonly SessionSummary[] = []): Promise<PlanView> {
	return workOutPlan(await readPlanInputs(k, roomId, organizationId, summaries));
}

/** The plan worked through: prediction, builds, cut list and cost. */
export function workOutPlan({ room, plan, customMaterials, before, after }: PlanInputs): PlanView {
	const evaluation = evaluatePlan({
		room: { lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM },
		plan,
		catalogue: materialCatalogue(customMaterials),
		measuredBeforeS: before ? before.times.valuesS : null,
		measuredAfterS: after ? after.times.valuesS : null,
		target: defaultTarget({ ...room }, PLANNING_BANDS_HZ)
	});
	const { builds, errors } = planBuilds(plan.items, { stock: plan.stock, kerfMm: plan.settings.kerfMm });
	const cut = planCutList(builds, plan.stock, plan.settings.kerfMm, sawLimitOf(plan.settings));
	return { room, plan, customMaterials, before, after, evaluation, builds, buildErrors: errors, cut, cost: planCost(plan.items, plan.stock, cut) };
}

/** The room's plan worked through, with the organization's own materials. */
export function loadRoomPlan(scope: Scope, roomId: number): Promise<PlanView> {
	return loadPlanView(db(), roomId, scope.organizationId);
}

/** The plan with the project it belongs to, for a plan page's crumbs. */
export async function loadPlanPage(scope: Scope, roomId: number): Promise<{ project: { id: number; name: string }; view: PlanView }> {
	const view = await loadRoomPlan(scope, roomId);
	const project = (await getProject(db(), view.room.projectId))!;
	return { project: { id: project.id, name: project.name }, view };
}

/** What a plan can start from: the room's visits (to calibrate and check) and its problem bands. */
export async function loadPlanningChoices(roomId: number) {
	const k = db();
	const [sessions, problemBands] = await Promise.all([listSessions(k, roomId), listProblemBands(k, roomId)]);
	return { sessions, problemBands };
}
