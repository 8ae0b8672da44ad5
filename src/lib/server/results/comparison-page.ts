// Everything a comparison or report page shows, loaded once for both.
import { error } from '@sveltejs/kit';
import type { Knex } from 'knex';
import { db } from '../db';
import { getComparison, listProblemBands } from '../queries/reviews';
import { getOrganization } from '../queries/organizations';
import { hasSharedPlan } from '../queries/plans';
import { getProject } from '../queries/projects';
import { getRoom } from '../queries/rooms';
import { analysisSummaries } from '../queries/captures';
import { loadComparisonModel, withoutRawLevels } from './load';
import type { Scope } from '../auth/access';
import type { ComparisonModel, SessionSummary } from '../../results/types';
import { roleAllows } from '../../roles';
import { loadPlanView } from '../plans/load';
import { planReport, type PlanReport } from '../../plans/report';
import { unitOfSystem } from '../../schemas/treatment';

/**
 * Pages draw the averaged responses with every smoothing, and a matched position's own response
 * only at 1/6 octave (to overlay chosen positions), so the rest of each position's curves is left
 * out of what is sent to the browser (with 2 × 12 positions they are most of the payload), and so
 * are the averages' unsmoothed levels.
 */
function withoutPositionCurves(model: ComparisonModel): ComparisonModel {
	const matched = new Set(model.matchedPositions);
	const none = { freqHz: [], db: [], smoothed: { '1': [], '3': [], '6': [], '12': [], '24': [] } };
	const slim = (whole: SessionSummary): SessionSummary => {
		const s = withoutRawLevels(whole);
		return {
			...s,
			positions: s.positions.map((p) => ({
				...p,
				response: matched.has(p.positionLabel) ? { freqHz: p.response.freqHz, db: [], smoothed: { ...none.smoothed, '6': p.response.smoothed['6'] } } : none
			}))
		};
	};
	return { ...model, baseline: slim(model.baseline), treated: slim(model.treated) };
}

/** The room's plan for the report, when the consultant chose to show it and it has items. */
async function reportPlanOf(k: Knex, scope: Scope, roomId: number, organizationId: number, model: ComparisonModel): Promise<PlanReport | null> {
	// Most rooms have no shared plan: ask before working one through.
	if (!(await hasSharedPlan(k, roomId))) return null;
	const view = await loadPlanView(k, roomId, organizationId, [model.baseline, model.treated]);
	return planReport(view.plan.items, view.evaluation, view.cost, view.plan.settings.currency, unitOfSystem(scope.user.unitSystem));
}

export async function loadComparisonPage(scope: Scope, comparisonId: number, options: { positionCurves?: boolean; withPlan?: boolean } = {}) {
	const k = db();
	const comparison = (await getComparison(k, comparisonId))!;
	const internal = roleAllows(scope.role, 'project:internal');
	// A client sees a comparison only once it is published, and never learns that a draft exists.
	if (!internal && !comparison.publishedAt) error(404, 'Not found.');
	const room = (await getRoom(k, comparison.roomId))!;
	const project = (await getProject(k, room.projectId))!;
	const organization = (await getOrganization(k, project.organizationId))!;
	const model = await loadComparisonModel(k, comparison);
	const showQuality = internal || comparison.shareQualityNotes;
	let qualityNotes: { positionLabel: string; condition: string; messages: string[] }[] = [];
	if (showQuality) {
		const ids = [...model.baseline.positions, ...model.treated.positions].map((p) => p.captureId);
		const summaries = await analysisSummaries(k, ids);
		qualityNotes = [
			...model.baseline.positions.map((p) => ({ p, condition: model.baseline.conditionLabel })),
			...model.treated.positions.map((p) => ({ p, condition: model.treated.conditionLabel }))
		]
			.map(({ p, condition }) => ({
				positionLabel: p.positionLabel,
				condition,
				messages: ((summaries.get(p.captureId)?.warnings ?? []) as { message: string }[]).map((w) => w.message)
			}))
			.filter((q) => q.messages.length > 0);
	}
	return {
		comparison: { ...comparison, advice: comparison.advice ?? '' },
		room: { id: room.id, name: room.name, lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM, volumeM3: room.volumeM3, roomUse: room.roomUse },
		project: { id: project.id, name: project.name, clientName: project.clientName },
		practiceName: organization.name,
		model: options.positionCurves ? model : withoutPositionCurves(model),
		problemBands: await listProblemBands(k, room.id),
		plan: options.withPlan ? await reportPlanOf(k, scope, room.id, project.organizationId, model) : null,
		qualityNotes,
		can: {
			review: roleAllows(scope.role, 'review:write'),
			publish: roleAllows(scope.role, 'report:publish'),
			internal
		}
	};
}
