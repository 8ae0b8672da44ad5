// Everything a comparison or report page shows, loaded once for both; the whole comparison for
// the PDF, the exports and the comparison JSON; and what those pages fetch when asked.
import { error } from '@sveltejs/kit';
import type { Knex } from 'knex';
import { db } from '../db';
import { getComparisonHeader, listProblemBands } from '../queries/reviews';
import type { RoomRow } from '../queries/rooms';
import { comparisonViewOf, loadComparisonResults } from './load';
import { Lru } from './cache';
import { pack } from '../../packed';
import type { Scope } from '../auth/access';
import type { ComparisonModel } from '../../results/types';
import { roleAllows } from '../../roles';
import { readPlanInputs, workOutPlan } from '../plans/load';
import { planReport, type PlanReport } from '../../plans/report';
import { unitOfSystem } from '../../schemas/treatment';
import { notFound } from '../problem';
import { comparisonBands, comparisonResponses, type ComparisonBands, type ComparisonResponses } from '../../results/drawn';
import type { BandKind } from '../../analysis/bands';
import type { SmoothingKey } from '../../analysis/types';

// The report's plan, kept by everything it is worked out from (rows as read, measured times, unit):
// working a plan through takes longer than reading it, and a report is read far more often than
// its plan changes.
const planReports = new Lru<PlanReport>(32);

/** The room's plan for the report, when the consultant chose to show it and it has items (`shared`, as the heading query read it). */
async function reportPlanOf(k: Knex, scope: Scope, room: RoomRow, organizationId: number, model: ComparisonModel, shared: boolean): Promise<PlanReport | null> {
	// Most rooms have no shared plan: known before working one through.
	if (!shared) return null;
	const inputs = await readPlanInputs(k, room, organizationId, [model.baseline, model.treated]);
	const unit = unitOfSystem(scope.user.unitSystem);
	const report = await planReports.through(JSON.stringify([inputs, unit]), () => {
		const view = workOutPlan(inputs);
		return planReport(view.plan.items, view.evaluation, view.cost, view.plan.settings.currency, unit);
	});
	// Frozen once kept, so serialized for the page data then too.
	return pack(report);
}

/** The comparison row, refused to a client while it is a draft (a client never learns that a draft exists). */
async function reachableComparison(k: Knex, scope: Scope, comparisonId: number) {
	const { comparison, room, project, visits, sharedPlan } = (await getComparisonHeader(k, comparisonId))!;
	const internal = roleAllows(scope.role, 'project:internal');
	if (!internal && !comparison.publishedAt) error(404, 'Not found.');
	return { comparison, room, project, visits, sharedPlan, internal };
}

/** The whole comparison with everything its pages show: for the PDF, the exports and the comparison JSON. */
export async function loadComparisonDocument(scope: Scope, comparisonId: number, options: { withPlan?: boolean } = {}) {
	const k = db();
	const { comparison, room, project, visits, sharedPlan, internal } = await reachableComparison(k, scope, comparisonId);
	const [{ model, tag, warnings }, problemBands] = await Promise.all([loadComparisonResults(k, comparison, { room, visits }), listProblemBands(k, room.id)]);
	const plan = options.withPlan ? await reportPlanOf(k, scope, room, project.organizationId, model, sharedPlan) : null;
	const showQuality = internal || comparison.shareQualityNotes;
	let qualityNotes: { positionLabel: string; condition: string; messages: string[] }[] = [];
	if (showQuality) {
		qualityNotes = [
			...model.baseline.positions.map((p) => ({ p, condition: model.baseline.conditionLabel })),
			...model.treated.positions.map((p) => ({ p, condition: model.treated.conditionLabel }))
		]
			.map(({ p, condition }) => ({
				positionLabel: p.positionLabel,
				condition,
				messages: ((warnings.get(p.captureId) ?? []) as { message: string }[]).map((w) => w.message)
			}))
			.filter((q) => q.messages.length > 0);
	}
	return {
		comparison: { ...comparison, advice: comparison.advice ?? '' },
		room: { id: room.id, name: room.name, lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM, volumeM3: room.volumeM3, roomUse: room.roomUse },
		project: { id: project.id, name: project.name, clientName: project.clientName },
		practiceName: project.organizationName,
		model,
		tag,
		problemBands,
		plan,
		qualityNotes,
		can: {
			review: roleAllows(scope.role, 'review:write'),
			publish: roleAllows(scope.role, 'report:publish'),
			internal
		}
	};
}

/**
 * The comparison and report pages' data: what they draw of the comparison (results/drawn.ts) —
 * the averaged responses at the default smoothing, the octave tables, each matched position's own
 * response — the rest fetched when asked for through comparisonResponsesOf and comparisonBandsOf.
 */
export async function loadComparisonPage(scope: Scope, comparisonId: number, options: { withPlan?: boolean } = {}) {
	const { model, tag, ...page } = await loadComparisonDocument(scope, comparisonId, options);
	return { ...page, model: comparisonViewOf(model, tag) };
}

/** The comparison's averaged responses at one smoothing, with the tag of the results they come from. */
export async function comparisonResponsesOf(scope: Scope, comparisonId: number, smoothing: SmoothingKey): Promise<{ tag: string; answer: () => ComparisonResponses }> {
	const k = db();
	const { comparison, room, visits } = await reachableComparison(k, scope, comparisonId);
	const { model, tag } = await loadComparisonResults(k, comparison, { room, visits });
	return { tag, answer: () => comparisonResponses(model, smoothing) };
}

/** The comparison's band-by-band tables of one kind, with the tag of the results they come from. */
export async function comparisonBandsOf(scope: Scope, comparisonId: number, bandKind: BandKind): Promise<{ tag: string; answer: () => ComparisonBands }> {
	const k = db();
	const { comparison, room, visits } = await reachableComparison(k, scope, comparisonId);
	const { model, tag } = await loadComparisonResults(k, comparison, { room, visits });
	const bands = comparisonBands(model, bandKind);
	if (!bands) throw notFound('This comparison has no one-third-octave bands: a visit was analysed without them.');
	return { tag, answer: () => bands };
}
